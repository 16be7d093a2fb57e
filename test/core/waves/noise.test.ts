import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { noiseWave } from "../../../packages/core/src/waves/noise.js";

describe("band-limited noise wave", () => {
  test("after quietAfter the level stays 0, and quietAfter lies within three sample intervals of the stop", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1000 }), fc.double({ min: 1e-4, max: 1e-1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), (seed, stop, u) => {
        const wave = noiseWave({ rms: 1e-9, seed, corner: 4000, stop });
        const quiet = wave.quietAfter!;
        expect(quiet).toBeGreaterThan(stop);
        expect(quiet - stop).toBeLessThanOrEqual(3 / (2 * 4000)); // within three sample intervals
        for (const t of [quiet + 1e-12, quiet + u * 1e-3, quiet + 1]) expect(wave.value(t, false)).toBe(0);
      }),
      { numRuns: 200 },
    );
  });

  test("without a stop the noise never goes quiet", () => {
    expect(noiseWave({ rms: 1, seed: 1, corner: 100, stop: Infinity }).quietAfter).toBeUndefined();
  });
});

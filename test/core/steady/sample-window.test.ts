// The approach's window of probe samples: it keeps only what lies after the time it is told, and
// the swing it measures from coarse, uneven steps is the waveform's own to O(h³).
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { SampleWindow } from "@onset/core/engine";

describe("SampleWindow", () => {
  test("a sine sampled at uneven steps of at most a 25th of its period swings 2·A within 1e-3 (mathematics: the parabola through the samples nearest an extreme is off by O(h³); the samples alone by up to 1 − cos(π/25) ≈ 8e-3)", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0.2, max: 1, noNaN: true }), { minLength: 200, maxLength: 200 }), fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }), (steps, phase) => {
        const w = new SampleWindow();
        let t = 0;
        w.push(t, Math.sin(phase));
        for (const s of steps) {
          t += s / 25;
          w.push(t, Math.sin(2 * Math.PI * t + phase));
        }
        // The last full period, from a time before it.
        expect(Math.abs(w.swingSince(t - 1) / 2 - 1)).toBeLessThan(1e-3);
      }),
    );
  });

  test("dropping the samples before a time keeps the later ones in order, and no more", () => {
    const w = new SampleWindow();
    for (let k = 0; k < 5000; k++) w.push(k, k * k);
    w.dropBefore(4990);
    expect(w.length).toBe(10);
    expect(Array.from(w.times())).toEqual([4990, 4991, 4992, 4993, 4994, 4995, 4996, 4997, 4998, 4999]);
    expect(w.values()[0]).toBe(4990 * 4990);
  });

  test("a swing whose arithmetic overflows is Infinity, never 0 (which would read as died out); an empty window swings 0", () => {
    const empty = new SampleWindow();
    expect(empty.swingSince(0)).toBe(0);
    // A sine of 1e160 at 25 points a period: the parabola's b² overflows double precision (max ≈ 1.8e308).
    const huge = new SampleWindow();
    for (let k = 0; k <= 50; k++) huge.push(k / 25, 1e160 * Math.sin((2 * Math.PI * k) / 25 + 0.3));
    expect(huge.swingSince(1)).toBe(Infinity);
    // Samples that overflowed themselves (a state at Infinity): Infinity − Infinity is NaN, which read as a swing of 0 before.
    const overflowed = new SampleWindow();
    for (let k = 0; k <= 50; k++) overflowed.push(k / 25, Infinity);
    expect(overflowed.swingSince(1)).toBe(Infinity);
  });
});

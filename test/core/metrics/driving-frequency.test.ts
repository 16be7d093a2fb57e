import { describe, expect, test } from "vitest";
import { drivingFrequency, steadyKind } from "../../../packages/core/src/metrics/oscillation-kind.js";

const sine = { slopeCrest: Math.PI / 2, dutyCycle: 0.5 };

describe("drivingFrequency", () => {
  test("a source's own frequency", () => {
    expect(drivingFrequency(600.0001, [600, 900], 1e-3)).toBe(600);
  });
  test("600 Hz and 900 Hz repeat together at 300 Hz, their harmonics 2 and 3 (mathematics)", () => {
    expect(drivingFrequency(300.0001, [600, 900], 1e-3)).toBeCloseTo(300, 9);
    expect(drivingFrequency(150, [600, 900], 1e-3)).toBeUndefined();
  });
  test("one source: only its own frequency", () => {
    expect(drivingFrequency(500, [1000], 1e-3)).toBeUndefined();
  });
});

describe("steadyKind of a waveform at the sources' common period", () => {
  test("is driven (settled), not parasitic, though the bias point predicts no ringing", () => {
    const kind = steadyKind(sine, 300, { frequency: null, starts: false, realGrowth: false }, [600, 900]);
    expect(kind).toEqual({ kind: "settled", driven: 300, common: true });
  });
});

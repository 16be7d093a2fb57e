import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { steadyKind, type LinearPrediction } from "../../../packages/core/src/metrics/oscillation-kind.js";

/** A sine's shape: slope crest π/2, half the time above its mean. */
const sine = { slopeCrest: Math.PI / 2, dutyCycle: 0.5 };

/**
 * The equal-RC Wien bridge around a gain A (closed form): s² + (3 − A)·ω₀·s + ω₀² = 0, so the
 * pair is ω₀·((A − 3)/2 ± j·√(1 − ((A − 3)/2)²)) for 1 < A < 5, on the circle |s| = ω₀.
 */
function wienPrediction(gain: number, f0: number): LinearPrediction {
  const re = (gain - 3) / 2;
  const im = Math.sqrt(1 - re * re);
  return { frequency: f0 * im, naturalFrequency: f0 * Math.hypot(re, im), starts: gain > 3, realGrowth: false };
}

describe("steadyKind(shape, frequency, prediction)", () => {
  test("an amplitude-controlled Wien bridge settled at f₀ is the predicted sine for any start-up gain 3 < A < 5 (closed form: its pair lies on |s| = ω₀)", () => {
    fc.assert(
      fc.property(fc.double({ min: 3.001, max: 4.999, noNaN: true }), fc.double({ min: 1, max: 1e6, noNaN: true }), (gain, f0) => {
        expect(steadyKind(sine, f0, wienPrediction(gain, f0)).kind).toBe("settled");
      }),
    );
  });

  test("A = 4.95 puts the pair's imaginary part at 0.22·f₀, beyond the factor of 2: only its modulus says settled", () => {
    const p = wienPrediction(4.95, 1000);
    expect(p.frequency!).toBeLessThan(500);
    expect(steadyKind(sine, 1000, { ...p, naturalFrequency: null }).kind).toBe("parasitic");
    expect(steadyKind(sine, 1000, p).kind).toBe("settled");
  });

  test("an oscillation far from both the pair's imaginary part and its modulus is still parasitic", () => {
    expect(steadyKind(sine, 1000, wienPrediction(3.2, 16000))).toEqual({ kind: "parasitic", predicted: 16000 * Math.sqrt(1 - 0.01) });
  });
});

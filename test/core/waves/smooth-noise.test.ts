import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { streamKey } from "../../../packages/core/src/random/counter-normal.js";
import { densityOfSigma, INTERPOLATED_VARIANCE, sigmaForDensity, SmoothNoise } from "../../../packages/core/src/waves/smooth-noise.js";

describe("smooth band-limited noise streams", () => {
  test("the level at any time does not depend on which times were asked before (no hidden state)", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 0.05, noNaN: true }), { minLength: 2, maxLength: 40 }), (times) => {
        const make = () => new SmoothNoise([streamKey(3, "R1"), streamKey(3, "R2")], [1, 2], 10e3);
        const forward = make();
        const out = new Float64Array(2);
        const first = times.map((t) => (forward.evaluate(t, out), [out[0]!, out[1]!]));
        const fresh = times.map((t) => {
          const n = make();
          n.evaluate(t, out);
          return [out[0]!, out[1]!];
        });
        expect(first).toEqual(fresh);
      }),
    );
  });

  test("every stream is 0 at t ≤ 0 and rises continuously from there", () => {
    const n = new SmoothNoise([streamKey(1, "a")], [1], 1e3);
    const out = new Float64Array(1);
    n.evaluate(0, out);
    expect(out[0]).toBe(0);
    n.evaluate(1e-12, out);
    expect(Math.abs(out[0]!)).toBeLessThan(1e-6);
  });

  test("one-sided low-frequency density σ²/corner: Var ∫₀ᵀ x dt = S₂(0)·T for T ≫ Δ (mathematics), within 6 %", () => {
    // Two-sided S₂(0) = density/2. Blocks of 64 sample intervals, integrated by the midpoint rule
    // at 16 points per interval (the spline is a cubic: the rule's error is far below the spread).
    const corner = 1e3;
    const density = 4e-18;
    const sigma = sigmaForDensity(density, corner);
    expect(densityOfSigma(sigma, corner)).toBeCloseTo(density, 30);
    const noise = new SmoothNoise([streamKey(11, "R1")], [sigma], corner);
    const delta = 1 / (2 * corner);
    const perBlock = 64;
    const blocks = 8000;
    const sub = 16;
    const dt = delta / sub;
    const out = new Float64Array(1);
    const integrals = new Float64Array(blocks);
    for (let b = 0; b < blocks; b++) {
      let sum = 0;
      for (let i = 0; i < perBlock * sub; i++) {
        noise.evaluate((b * perBlock * sub + i + 0.5) * dt, out);
        sum += out[0]! * dt;
      }
      integrals[b] = sum;
    }
    let mean = 0;
    for (const v of integrals) mean += v / blocks;
    let variance = 0;
    for (const v of integrals) variance += (v - mean) ** 2 / (blocks - 1);
    const T = perBlock * delta;
    // standard error of a variance from 8000 blocks: √(2/8000) = 1.6 %
    expect(Math.abs(variance / ((density / 2) * T) - 1)).toBeLessThan(0.06);
  });

  test("the r.m.s. of the interpolated level is σ·√(∫Σw²) (the normalisation the noise wave uses), within 2 %", () => {
    const noise = new SmoothNoise([streamKey(5, "x")], [1], 1e3);
    const out = new Float64Array(1);
    let sum = 0;
    const count = 400_000;
    for (let i = 0; i < count; i++) {
      noise.evaluate((i + 0.5) * 1.3e-5, out);
      sum += out[0]! ** 2;
    }
    expect(Math.abs(Math.sqrt(sum / count) / Math.sqrt(INTERPOLATED_VARIANCE) - 1)).toBeLessThan(0.02);
  });
});

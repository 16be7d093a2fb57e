// The shooting's trust-region step (Powell's dogleg in scaled unknowns; Dennis & Schnabel 1983,
// §6.4.2; Nocedal & Wright 2006, §4.1): its defining laws on random linear models, and the
// shooting it steers converging from a start far from a limit cycle.
import fc from "fast-check";
import { Matrix, solve } from "ml-matrix";
import { describe, expect, test } from "vitest";
import { nextRadius, refineOrbit, trustStep } from "@onset/core/engine";
import { clippedWien, settledPeriod } from "./support.js";

/** A random model: J = D + small off-diagonal terms (well conditioned), r, per-unknown scales over six decades, a radius. */
const model = fc
  .integer({ min: 1, max: 6 })
  .chain((m) =>
    fc.record({
      m: fc.constant(m),
      diagonal: fc.array(fc.double({ min: 0.05, max: 20, noNaN: true }), { minLength: m, maxLength: m }),
      signs: fc.array(fc.boolean(), { minLength: m, maxLength: m }),
      off: fc.array(fc.double({ min: -0.02, max: 0.02, noNaN: true }), { minLength: m * m, maxLength: m * m }),
      residual: fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: m, maxLength: m }),
      exponents: fc.array(fc.double({ min: -6, max: 0, noNaN: true }), { minLength: m, maxLength: m }),
      radius: fc.double({ min: 1e-3, max: 1e4, noNaN: true }),
    }),
  );

function setUp(c: { m: number; diagonal: number[]; signs: boolean[]; off: number[]; residual: number[]; exponents: number[] }) {
  const { m } = c;
  const scale = Float64Array.from(c.exponents, (e) => 10 ** e);
  // J in unscaled unknowns: S·(diagonal + off)·S⁻¹, so the scaled model is well conditioned whatever the scales.
  const matrix = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    for (let k = 0; k < m; k++) {
      const scaled = (i === k ? (c.signs[i] ? 1 : -1) * c.diagonal[i]! : 0) + c.off[i * m + k]! * Math.min(...c.diagonal);
      matrix[i * m + k] = (scaled * scale[i]!) / scale[k]!;
    }
  }
  const residual = Float64Array.from(c.residual, (r, i) => r * scale[i]!);
  const rows = Array.from({ length: m }, (_, i) => Array.from(matrix.subarray(i * m, (i + 1) * m)));
  const x = solve(new Matrix(rows), Matrix.columnVector(Array.from(residual, (r) => -r)));
  const newton = Float64Array.from({ length: m }, (_, i) => x.get(i, 0));
  return { m, scale, matrix, residual, newton };
}

const scaledNorm = (v: Float64Array, s: Float64Array) => Math.sqrt(v.reduce((sum, x, i) => sum + (x / s[i]!) ** 2, 0));
const modelSquare = (matrix: Float64Array, r: Float64Array, s: Float64Array, p: Float64Array) => {
  const m = s.length;
  let sum = 0;
  for (let i = 0; i < m; i++) {
    let v = r[i]!;
    for (let k = 0; k < m; k++) v += matrix[i * m + k]! * p[k]!;
    sum += (v / s[i]!) ** 2;
  }
  return sum;
};

describe("trustStep(matrix, residual, scale, newton, radius, out)", () => {
  test("never leaves the trust radius (scaled 2-norm), and its reported length is the step's", () => {
    fc.assert(
      fc.property(model, (c) => {
        const { m, scale, matrix, residual, newton } = setUp(c);
        const out = new Float64Array(m);
        const { length } = trustStep(matrix, residual, scale, newton, c.radius, out);
        const actual = scaledNorm(out, scale);
        expect(actual).toBeLessThanOrEqual(c.radius * (1 + 1e-9));
        expect(Math.abs(length - actual)).toBeLessThanOrEqual(1e-9 * Math.max(actual, c.radius));
      }),
    );
  });

  test("takes the Newton step when it lies within the radius; otherwise reaches the radius", () => {
    fc.assert(
      fc.property(model, (c) => {
        const { m, scale, matrix, residual, newton } = setUp(c);
        const out = new Float64Array(m);
        trustStep(matrix, residual, scale, newton, c.radius, out);
        if (scaledNorm(newton, scale) <= c.radius) {
          expect(Array.from(out)).toEqual(Array.from(newton));
        } else {
          expect(Math.abs(scaledNorm(out, scale) / c.radius - 1)).toBeLessThan(1e-9);
        }
      }),
    );
  });

  test("the model ‖S⁻¹(r + J·p)‖² it reports is the model's at its step, and never above its value at p = 0 (a descent step)", () => {
    fc.assert(
      fc.property(model, (c) => {
        const { m, scale, matrix, residual, newton } = setUp(c);
        const out = new Float64Array(m);
        const { predicted } = trustStep(matrix, residual, scale, newton, c.radius, out);
        const at = modelSquare(matrix, residual, scale, out);
        const start = modelSquare(matrix, residual, scale, new Float64Array(m));
        expect(Math.abs(predicted - at)).toBeLessThanOrEqual(1e-9 * start + 1e-300);
        expect(predicted).toBeLessThanOrEqual(start * (1 + 1e-12));
      }),
    );
  });
});

describe("nextRadius(radius, length, ratio)", () => {
  test("a poor prediction (ratio below ¼, or not a number) cuts the radius to a quarter of the step; a good one reaching the radius doubles it; else it stays (Nocedal & Wright 2006, Algorithm 4.1)", () => {
    expect(nextRadius(8, 8, 0.1)).toBe(2);
    expect(nextRadius(8, 4, -3)).toBe(1);
    expect(nextRadius(8, 8, Number.NaN)).toBe(2);
    expect(nextRadius(8, 8, 0.9)).toBe(16);
    expect(nextRadius(8, 4, 0.9)).toBe(8);
    expect(nextRadius(8, 8, 0.5)).toBe(8);
  });
});

describe("shootOrbit with the trust region, from far off the clipped Wien bridge's orbit", () => {
  // References: docs/references.md §2.4 (ideal clip(A·v₊, ±10 V), DOP853/Radau at rtol 1e-10): A = 3.1, f = 1580.7013 Hz, fundamental 10.73461 V.
  test.each([
    ["every state at 160 % of the orbit's and the period 20 % short", 1.6, 0.8],
    ["every state at 200 % of the orbit's and the period 20 % long", 2, 1.2],
  ])("%s: the two grids' orbit matches f within 0.005 % and the fundamental within 0.01 % (the independent integrator's values)", (_, factor, stretch) => {
    const { system, guess, fractions, trajectory, read } = settledPeriod(clippedWien(3.1), "p", 1 / 1580.7, 0.04);
    const scaled = (x: Float64Array) => Float64Array.from(x, (v) => factor * v);
    const far = { t0: guess.t0, x: scaled(guess.x), period: stretch * guess.period };
    const refined = refineOrbit(system, far, fractions, trajectory.map(scaled), read, 100);
    expect(Math.abs(refined.frequency / 1580.7013 - 1)).toBeLessThan(5e-5);
    expect(Math.abs(refined.harmonics[0]!.amplitude / 10.73461 - 1)).toBeLessThan(1e-4);
  });
});

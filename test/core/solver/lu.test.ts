import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { LuSolver } from "@onset/core/engine";
import { DenseLu } from "../../../packages/core/src/solver/dense-lu.js";
import { residual, sparseCase } from "./sparse-matrices.js";

/** Random n×n matrices made well conditioned by a dominant diagonal of random sign. */
const wellConditioned = fc.integer({ min: 1, max: 12 }).chain((n) =>
  fc
    .tuple(
      fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: n * n, maxLength: n * n }),
      fc.array(fc.boolean(), { minLength: n, maxLength: n }),
      fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: n, maxLength: n }),
    )
    .map(([entries, signs, b]) => {
      const a = Float64Array.from(entries);
      for (let i = 0; i < n; i++) a[i * n + i] = (signs[i] ? 1 : -1) * (n + 1 + Math.abs(a[i * n + i]!));
      // Shuffle the rows so partial pivoting has to work.
      const rows = Array.from({ length: n }, (_, i) => i).reverse();
      const shuffled = new Float64Array(n * n);
      rows.forEach((src, dst) => shuffled.set(a.subarray(src * n, src * n + n), dst * n));
      return { n, a: shuffled, b: Float64Array.from(b) };
    }),
);

/** (L·U)ᵢⱼ equals entry (perm[i], j) of A within `relative`·n·max|A|. */
function expectFactorsReproduce(lu: DenseLu, a: Float64Array, relative: number): void {
  const n = lu.n;
  let scale = 0;
  for (const v of a) scale = Math.max(scale, Math.abs(v));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let k = 0; k <= Math.min(i, j); k++) {
        const l = k === i ? 1 : lu.lu[i * n + k]!;
        s += l * lu.lu[k * n + j]!;
      }
      expect(Math.abs(s - a[lu.perm[i]! * n + j]!)).toBeLessThanOrEqual(relative * n * scale);
    }
  }
}

describe("LuSolver (Golub & Van Loan, Algorithm 3.4.1)", () => {
  test("P·A = L·U entry by entry on random well-conditioned matrices (mathematics: the defining identity)", () => {
    fc.assert(
      fc.property(wellConditioned, ({ n, a }) => {
        const lu = new DenseLu(n);
        expect(lu.factor(a)).toBe(true);
        expectFactorsReproduce(lu, a, 1e-13);
      }),
      { numRuns: 300 },
    );
  });

  test("the residual ‖A·x − b‖∞ is small relative to ‖A‖·‖x‖ + ‖b‖", () => {
    fc.assert(
      fc.property(wellConditioned, ({ n, a, b }) => {
        const lu = new LuSolver(n);
        lu.factor(a);
        const x = new Float64Array(n);
        lu.solve(b, x);
        let worst = 0;
        let norm = 0;
        for (let i = 0; i < n; i++) {
          let s = -b[i]!;
          for (let j = 0; j < n; j++) {
            s += a[i * n + j]! * x[j]!;
            norm = Math.max(norm, Math.abs(a[i * n + j]! * x[j]!));
          }
          worst = Math.max(worst, Math.abs(s));
        }
        expect(worst).toBeLessThanOrEqual(1e-13 * n * (norm + 10));
      }),
      { numRuns: 300 },
    );
  });

  test("a singular matrix is reported with the column of the zero pivot", () => {
    const lu = new LuSolver(3);
    // third column = first + second
    const a = Float64Array.from([1, 2, 3, 4, 5, 9, 7, 8, 15]);
    expect(lu.factor(a)).toBe(false);
    expect(lu.singularColumn).toBe(2);
  });
});

describe("LuSolver on a declared pattern (the sparse factorisation, sparse-lu.ts)", () => {
  test("a refactorisation with moved values reuses the order and solves as a fresh dense factorisation does", () => {
    fc.assert(
      fc.property(sparseCase, fc.double({ min: -0.01, max: 0.01, noNaN: true }), ({ n, a, pattern, b }, wobble) => {
        const lu = new LuSolver(n);
        lu.setPattern(pattern);
        lu.factor(a);
        const moved = a.map((v, k) => v * (1 + wobble * Math.sin(k + 1)));
        expect(lu.factor(moved)).toBe(true);
        expect(lu.pivotings).toBe(1);
        const x = new Float64Array(n);
        lu.solve(b, x);
        const dense = new LuSolver(n);
        dense.factor(moved);
        const y = new Float64Array(n);
        dense.solve(b, y);
        for (let i = 0; i < n; i++) expect(Math.abs(x[i]! - y[i]!)).toBeLessThanOrEqual(1e-12 * (1 + Math.abs(y[i]!)));
        const { worst, scale } = residual(n, moved, x, b);
        expect(worst).toBeLessThanOrEqual(1e-13 * n * scale + 1e-300);
      }),
      { numRuns: 200 },
    );
  });

  test("a singular matrix is still reported with the column of the zero pivot", () => {
    const lu = new LuSolver(3);
    lu.setPattern(new Uint8Array(9).fill(1));
    expect(lu.factor(Float64Array.from([1, 2, 3, 4, 5, 9, 7, 8, 15]))).toBe(false);
    expect(lu.singularColumn).toBe(2);
  });

  test("solveNegated gives −A⁻¹·b on both paths", () => {
    const a = Float64Array.from([2, 1, 1, 3]);
    for (const pattern of [undefined, new Uint8Array(4).fill(1)]) {
      const lu = new LuSolver(2);
      if (pattern) lu.setPattern(pattern);
      lu.factor(a);
      const x = new Float64Array(2);
      lu.solveNegated(Float64Array.from([3, 5]), x);
      // [2 1; 1 3]·[0.8, 1.4] = [3, 5]
      expect(x[0]).toBeCloseTo(-0.8, 14);
      expect(x[1]).toBeCloseTo(-1.4, 14);
    }
  });
});

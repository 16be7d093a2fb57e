import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { LuSolver } from "@onset/core";

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

describe("LuSolver (Golub & Van Loan, Algorithm 3.4.1)", () => {
  test("P·A = L·U entry by entry on random well-conditioned matrices (mathematics: the defining identity)", () => {
    fc.assert(
      fc.property(wellConditioned, ({ n, a }) => {
        const lu = new LuSolver(n);
        expect(lu.factor(a)).toBe(true);
        let scale = 0;
        for (const v of a) scale = Math.max(scale, Math.abs(v));
        for (let i = 0; i < n; i++) {
          for (let j = 0; j < n; j++) {
            let s = 0;
            for (let k = 0; k <= Math.min(i, j); k++) {
              const l = k === i ? 1 : lu.lu[i * n + k]!;
              s += l * lu.lu[k * n + j]!;
            }
            expect(Math.abs(s - a[lu.perm[i]! * n + j]!)).toBeLessThanOrEqual(1e-13 * n * scale);
          }
        }
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

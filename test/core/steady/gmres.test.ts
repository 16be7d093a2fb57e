import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { DenseLu } from "../../../packages/core/src/solver/dense-lu.js";
import { gmres } from "../../../packages/core/src/steady/gmres.js";

/** A random matrix made well conditioned: the identity times its size plus entries in [−1, 1]. */
const system = fc.integer({ min: 1, max: 24 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    entries: fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: n * n, maxLength: n * n }),
    b: fc.array(fc.tuple(fc.boolean(), fc.double({ min: 0.1, max: 10, noNaN: true })).map(([negative, v]) => (negative ? -v : v)), { minLength: n, maxLength: n }),
    restart: fc.integer({ min: 3, max: 30 }),
  }),
);

describe("gmres(A, b) on random well-conditioned systems (mathematics: the exact solution, by LU)", () => {
  test("converges to the direct solve within its residual tolerance, restarted or not", () => {
    fc.assert(
      fc.property(system, ({ n, entries, b: values, restart }) => {
        const a = Float64Array.from(entries, (v, k) => v + (Math.floor(k / n) === k % n ? 2 * n : 0));
        const b = Float64Array.from(values);
        const apply = (x: Float64Array, y: Float64Array) => {
          for (let i = 0; i < n; i++) {
            let sum = 0;
            for (let j = 0; j < n; j++) sum += a[i * n + j]! * x[j]!;
            y[i] = sum;
          }
        };
        const lu = new DenseLu(n);
        expect(lu.factor(Float64Array.from(a))).toBe(true);
        const exact = new Float64Array(n);
        lu.solve(b, exact);
        const norm = Math.hypot(...b);
        const result = gmres(apply, b, { tolerance: 1e-10 * norm, restart, maxProducts: 10 * n + 10 });
        expect(result.converged).toBe(true);
        // The tracked residual is the true one…
        const r = new Float64Array(n);
        apply(result.x, r);
        const trueResidual = Math.hypot(...r.map((v, i) => b[i]! - v));
        expect(trueResidual).toBeLessThanOrEqual(1e-9 * norm);
        // …and the error is within it over the smallest singular value (≥ n for this diagonal dominance).
        for (let i = 0; i < n; i++) expect(Math.abs(result.x[i]! - exact[i]!)).toBeLessThanOrEqual(1e-9 * norm + 1e-12 * Math.abs(exact[i]!));
      }),
      { numRuns: 200 },
    );
  });

  test("without restarts, it is exact within n products (the Krylov space fills the whole space)", () => {
    const n = 12;
    const a = Float64Array.from({ length: n * n }, (_, k) => Math.cos(k * 1.7) + (Math.floor(k / n) === k % n ? 0.5 : 0));
    const b = Float64Array.from({ length: n }, (_, i) => i - 5);
    let products = 0;
    const apply = (x: Float64Array, y: Float64Array) => {
      products++;
      for (let i = 0; i < n; i++) {
        let sum = 0;
        for (let j = 0; j < n; j++) sum += a[i * n + j]! * x[j]!;
        y[i] = sum;
      }
    };
    const result = gmres(apply, b, { tolerance: 1e-9, restart: n, maxProducts: 100 });
    expect(result.converged).toBe(true);
    expect(products).toBeLessThanOrEqual(n);
  });

  test("stops at its product bound, with the residual it reached (never above ‖b‖)", () => {
    const n = 30;
    const apply = (x: Float64Array, y: Float64Array) => {
      for (let i = 0; i < n; i++) y[i] = (i + 1) * x[i]!;
    };
    const b = new Float64Array(n).fill(1);
    const result = gmres(apply, b, { tolerance: 1e-14, restart: 5, maxProducts: 7 });
    expect(result.products).toBeLessThanOrEqual(7);
    expect(result.converged).toBe(false);
    expect(result.residual).toBeLessThan(Math.sqrt(n));
  });
});

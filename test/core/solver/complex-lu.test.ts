// ComplexLu solves A·x = b for complex A (held as real and imaginary parts): checked by the
// residual A·x − b of random diagonally dominant systems (mathematics: such a matrix is
// nonsingular, and partial pivoting solves it backward-stably; Golub & Van Loan §3.4.6), and
// against the 2n×2n real form [[Re A, −Im A], [Im A, Re A]] solved by the dense real LU.
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { ComplexLu, LuSolver } from "@onset/core/engine";

const system = (n: number) =>
  fc.record({
    re: fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: n * n, maxLength: n * n }),
    im: fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: n * n, maxLength: n * n }),
    bRe: fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: n, maxLength: n }),
    bIm: fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: n, maxLength: n }),
  });

describe("ComplexLu", () => {
  test.each([1, 3, 8])("n = %d: the residual of a diagonally dominant system is at rounding level, and the real form agrees", (n) => {
    fc.assert(
      fc.property(system(n), fc.integer({ min: 0, max: n - 1 }), ({ re, im, bRe, bIm }, swap) => {
        // Dominant in a permuted position, so that pivoting has rows to exchange.
        for (let i = 0; i < n; i++) re[i * n + ((i + swap) % n)] += 2 * n;
        const lu = new ComplexLu(n);
        lu.re.set(re);
        lu.im.set(im);
        expect(lu.factor()).toBe(true);
        const xRe = new Float64Array(n);
        const xIm = new Float64Array(n);
        lu.solve(Float64Array.from(bRe), Float64Array.from(bIm), xRe, xIm);
        for (let i = 0; i < n; i++) {
          let rRe = -bRe[i]!;
          let rIm = -bIm[i]!;
          for (let j = 0; j < n; j++) {
            rRe += re[i * n + j]! * xRe[j]! - im[i * n + j]! * xIm[j]!;
            rIm += re[i * n + j]! * xIm[j]! + im[i * n + j]! * xRe[j]!;
          }
          expect(Math.hypot(rRe, rIm)).toBeLessThan(1e-12 * (1 + Math.hypot(bRe[i]!, bIm[i]!)));
        }
        const n2 = 2 * n;
        const real = new Float64Array(n2 * n2);
        for (let i = 0; i < n; i++) {
          for (let j = 0; j < n; j++) {
            real[i * n2 + j] = re[i * n + j]!;
            real[i * n2 + n + j] = -im[i * n + j]!;
            real[(n + i) * n2 + j] = im[i * n + j]!;
            real[(n + i) * n2 + n + j] = re[i * n + j]!;
          }
        }
        const dense = new LuSolver(n2);
        expect(dense.factor(real)).toBe(true);
        const y = new Float64Array(n2);
        dense.solve(Float64Array.from([...bRe, ...bIm]), y);
        for (let i = 0; i < n; i++) {
          expect(Math.abs(y[i]! - xRe[i]!)).toBeLessThan(1e-12 * (1 + Math.abs(y[i]!)));
          expect(Math.abs(y[n + i]! - xIm[i]!)).toBeLessThan(1e-12 * (1 + Math.abs(y[n + i]!)));
        }
      }),
    );
  });

  test("a matrix with a zero column is singular", () => {
    const lu = new ComplexLu(3);
    lu.re.set([1, 0, 2, 3, 0, 1, 0, 0, 5]);
    lu.im.set([0, 0, 1, 1, 0, 0, 2, 0, 0]);
    expect(lu.factor()).toBe(false);
  });

  test("j·I: the solution is −j·b", () => {
    const lu = new ComplexLu(2);
    lu.im.set([1, 0, 0, 1]);
    expect(lu.factor()).toBe(true);
    const xRe = new Float64Array(2);
    const xIm = new Float64Array(2);
    lu.solve(Float64Array.from([1, 2]), Float64Array.from([0, 0]), xRe, xIm);
    expect(Array.from(xRe)).toEqual([0, 0]);
    expect(Array.from(xIm)).toEqual([-1, -2]);
  });
});

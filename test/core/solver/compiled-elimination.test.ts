import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { LuSolver } from "@onset/core/engine";
import { sparseCase } from "./sparse-matrices.js";

describe("compiled elimination", () => {
  test("factors and solutions are bit-identical to the loops (same operations in the same order)", () => {
    fc.assert(
      fc.property(sparseCase, fc.double({ min: -0.01, max: 0.01, noNaN: true }), ({ n, a, pattern, b }, wobble) => {
        const compiled = new LuSolver(n);
        const loops = new LuSolver(n, { compile: false });
        const moved = a.map((v, k) => v * (1 + wobble * Math.cos(k)));
        for (const m of [a, moved]) {
          for (const lu of [compiled, loops]) {
            lu.setPattern(pattern);
            expect(lu.factor(m)).toBe(true);
          }
          // setPattern starts over, so refactor the moved values once more on the kept order
          for (const lu of [compiled, loops]) expect(lu.factor(m)).toBe(true);
          const x = new Float64Array(n);
          const y = new Float64Array(n);
          compiled.solveNegated(b, x);
          loops.solveNegated(b, y);
          for (let i = 0; i < n; i++) expect(Object.is(x[i], y[i])).toBe(true);
          for (let k = 0; k < n * n; k++) expect(Object.is(compiled.lu[k], loops.lu[k])).toBe(true);
        }
      }),
      { numRuns: 200 },
    );
  });
});

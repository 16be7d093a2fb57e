import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { compileResidual } from "../../../packages/core/src/solver/compiled-residual.js";
import { entriesOf, sparseCase } from "./sparse-matrices.js";

describe("compiled residual product", () => {
  test("r = M·x − history − u over the pattern equals the same sums written as loops, bit for bit", () => {
    fc.assert(
      fc.property(sparseCase, ({ n, a, pattern, b }) => {
        const { rows, cols, values } = entriesOf(n, a, pattern);
        const rowStart = new Int32Array(n + 1);
        for (const row of rows) rowStart[row + 1]++;
        for (let i = 0; i < n; i++) rowStart[i + 1] += rowStart[i]!;
        const product = compileResidual(n, rowStart, cols)!;
        const history = b.map((v) => 0.5 * v);
        const u = b.map((v, i) => v * i);
        const r = new Float64Array(n);
        product(values, b, history, u, r);
        for (let i = 0; i < n; i++) {
          let sum = -history[i]! - u[i]!;
          for (let j = 0; j < n; j++) if (pattern[i * n + j]) sum += a[i * n + j]! * b[j]!;
          expect(Object.is(r[i], sum)).toBe(true);
        }
      }),
      { numRuns: 200 },
    );
  });
});

import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { markowitzOrder } from "../../../packages/core/src/solver/markowitz.js";
import { EliminationSchedule } from "../../../packages/core/src/solver/elimination-schedule.js";
import { sparseCase } from "./sparse-matrices.js";

/** Arrowhead: a dense first row and column plus the diagonal. */
function arrowhead(n: number): { a: Float64Array; pattern: Uint8Array } {
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    a[i * n + i] = 4;
    if (i > 0) {
      a[i] = 1;
      a[i * n] = 1;
    }
  }
  a[0] = n + 4;
  return { a, pattern: Uint8Array.from(a, (v) => (v !== 0 ? 1 : 0)) };
}

describe("Markowitz ordering with threshold pivoting", () => {
  test("an arrowhead matrix is eliminated without fill, where the natural order fills it completely (Duff, Erisman & Reid, §7.2)", () => {
    const n = 8;
    const { a, pattern } = arrowhead(n);
    const rows = new Int32Array(n);
    const cols = new Int32Array(n);
    expect(markowitzOrder(a, n, pattern, 0.1, 1e-13, rows, cols)).toBe(true);
    expect(new EliminationSchedule(n, pattern, rows, cols).fillAt.length).toBe(0);
    expect([...rows].indexOf(0)).toBeGreaterThanOrEqual(n - 2); // the dense row waits until a 2×2 is left
    const natural = Int32Array.from({ length: n }, (_, i) => i);
    // Eliminating the dense row first fills every other entry: (n − 1)² − (n − 1).
    expect(new EliminationSchedule(n, pattern, natural, natural).fillAt.length).toBe((n - 1) * (n - 2));
  });

  test("the orders are permutations and every pivot is at least the threshold of its column", () => {
    fc.assert(
      fc.property(sparseCase, ({ n, a, pattern }) => {
        const rows = new Int32Array(n);
        const cols = new Int32Array(n);
        expect(markowitzOrder(a, n, pattern, 0.1, 1e-13, rows, cols)).toBe(true);
        expect([...rows].sort((x, y) => x - y)).toEqual([...Array(n).keys()]);
        expect([...cols].sort((x, y) => x - y)).toEqual([...Array(n).keys()]);
        // Replay the elimination in that order: each pivot against the rest of its column.
        const w = Float64Array.from(a);
        for (let k = 0; k < n; k++) {
          const [pr, pc] = [rows[k]!, cols[k]!];
          let max = 0;
          for (let e = k; e < n; e++) max = Math.max(max, Math.abs(w[rows[e]! * n + pc]!));
          expect(Math.abs(w[pr * n + pc]!)).toBeGreaterThanOrEqual(0.1 * max * (1 - 1e-12));
          for (let e = k + 1; e < n; e++) {
            const m = w[rows[e]! * n + pc]! / w[pr * n + pc]!;
            for (let f = k + 1; f < n; f++) w[rows[e]! * n + cols[f]!] -= m * w[pr * n + cols[f]!]!;
          }
        }
      }),
      { numRuns: 300 },
    );
  });

  test("a matrix with a zero column has no usable pivot", () => {
    const a = Float64Array.from([1, 0, 2, 0]);
    expect(markowitzOrder(a, 2, Uint8Array.from([1, 1, 1, 1]), 0.1, 1e-13, new Int32Array(2), new Int32Array(2))).toBe(false);
  });
});

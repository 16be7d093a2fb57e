import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { markowitzOrder } from "../../../packages/core/src/solver/markowitz.js";
import { EliminationSchedule } from "../../../packages/core/src/solver/elimination-schedule.js";
import { entriesOf, sparseCase } from "./sparse-matrices.js";

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
    const e = entriesOf(n, a, pattern);
    const rows = new Int32Array(n);
    const cols = new Int32Array(n);
    expect(markowitzOrder(n, e.rows, e.cols, e.values, 0.1, 1e-13, rows, cols)).toBe(-1);
    expect(new EliminationSchedule(n, e.rows, e.cols, rows, cols).slots).toBe(e.rows.length);
    expect([...rows].indexOf(0)).toBeGreaterThanOrEqual(n - 2); // the dense row waits until a 2×2 is left
    const natural = Int32Array.from({ length: n }, (_, i) => i);
    // Eliminating the dense row first fills every other entry: (n − 1)² − (n − 1).
    expect(new EliminationSchedule(n, e.rows, e.cols, natural, natural).slots - e.rows.length).toBe((n - 1) * (n - 2));
  });

  test("the orders are permutations and every pivot is at least the threshold of its column", () => {
    fc.assert(
      fc.property(sparseCase, fc.nat(1000), ({ n, a, pattern }, shuffle) => {
        const e = entriesOf(n, a, pattern, shuffle);
        const rows = new Int32Array(n);
        const cols = new Int32Array(n);
        expect(markowitzOrder(n, e.rows, e.cols, e.values, 0.1, 1e-13, rows, cols)).toBe(-1);
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

  test("a matrix with a zero column has no usable pivot, and that column is named", () => {
    const e = entriesOf(2, Float64Array.from([1, 0, 2, 0]), Uint8Array.from([1, 1, 1, 1]));
    expect(markowitzOrder(2, e.rows, e.cols, e.values, 0.1, 1e-13, new Int32Array(2), new Int32Array(2))).toBe(1);
  });

  test("a tridiagonal matrix of 20 000 rows is ordered without fill in about linear time", () => {
    const n = 20000;
    const rows: number[] = [];
    const cols: number[] = [];
    const values: number[] = [];
    for (let i = 0; i < n; i++) {
      for (const j of [i - 1, i, i + 1]) {
        if (j < 0 || j >= n) continue;
        rows.push(i);
        cols.push(j);
        values.push(i === j ? 4 : -1);
      }
    }
    const [r, c] = [Int32Array.from(rows), Int32Array.from(cols)];
    const rowOrder = new Int32Array(n);
    const colOrder = new Int32Array(n);
    expect(markowitzOrder(n, r, c, Float64Array.from(values), 0.1, 1e-13, rowOrder, colOrder)).toBe(-1);
    expect(new EliminationSchedule(n, r, c, rowOrder, colOrder).slots).toBe(rows.length);
  });
});

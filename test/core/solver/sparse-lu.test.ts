import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { Matrix, solve as referenceSolve } from "ml-matrix";
import { SparseLu } from "../../../packages/core/src/solver/sparse-lu.js";
import { entriesOf, residual, sparseCase } from "./sparse-matrices.js";

function sparseLuOf(n: number, a: Float64Array, pattern: Uint8Array, shuffle = 0, compile = true): SparseLu {
  const { rows, cols, values } = entriesOf(n, a, pattern, shuffle);
  const lu = new SparseLu(n, rows, cols, { compile });
  lu.a.set(values);
  return lu;
}

/**
 * A random circuit-like system: a sparse symmetric conductance part on `nodes` rows plus
 * `branches` rows of ideal voltage sources (zero on their own diagonal, ±1 coupling to a node),
 * the structure that forces pivots off the diagonal.
 */
const circuitSystem = fc.integer({ min: 2, max: 60 }).chain((nodes) =>
  fc
    .tuple(
      fc.array(fc.tuple(fc.nat(nodes - 1), fc.nat(nodes - 1), fc.double({ min: 1e-3, max: 10, noNaN: true })), { minLength: nodes, maxLength: 3 * nodes }),
      fc.array(fc.tuple(fc.nat(nodes - 1), fc.nat(nodes)), { minLength: 0, maxLength: Math.min(4, nodes - 1) }),
      fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { minLength: nodes + 4, maxLength: nodes + 4 }),
    )
    .map(([conductances, sources, rhs]) => {
      // Distinct source nodes, so the source rows stay independent.
      const seen = new Set<number>();
      const kept = sources.filter(([node]) => !seen.has(node) && seen.add(node));
      const n = nodes + kept.length;
      const a = new Float64Array(n * n);
      const pattern = new Uint8Array(n * n);
      const add = (i: number, j: number, v: number) => {
        a[i * n + j] += v;
        pattern[i * n + j] = 1;
      };
      for (let i = 0; i < nodes; i++) add(i, i, 1e-3); // every node has a path to ground
      for (const [p, q, g] of conductances) {
        add(p, p, g);
        if (p !== q) {
          add(q, q, g);
          add(p, q, -g);
          add(q, p, -g);
        }
      }
      kept.forEach(([node], k) => {
        add(nodes + k, node, 1);
        add(node, nodes + k, 1);
      });
      return { n, a, pattern, b: Float64Array.from(rhs.slice(0, n)) };
    }),
);

describe("SparseLu (Markowitz order kept across factorisations, P·A·Q = L·U)", () => {
  test("P·A·Q = L·U entry by entry on random sparse matrices, entries in any order (mathematics: the defining identity)", () => {
    fc.assert(
      fc.property(sparseCase, fc.nat(1000), ({ n, a, pattern }, shuffle) => {
        const lu = sparseLuOf(n, a, pattern, shuffle);
        expect(lu.factor()).toBe(true);
        expect(lu.scheduled).toBe(true);
        let scale = 0;
        for (const v of a) scale = Math.max(scale, Math.abs(v));
        for (let i = 0; i < n; i++) {
          for (let j = 0; j < n; j++) {
            let s = 0;
            for (let k = 0; k <= Math.min(i, j); k++) s += (k === i ? 1 : lu.factorEntry(i, k)) * lu.factorEntry(k, j);
            expect(Math.abs(s - a[lu.rowOrder[i]! * n + lu.colOrder[j]!]!)).toBeLessThanOrEqual(1e-12 * n * scale);
          }
        }
      }),
      { numRuns: 300 },
    );
  });

  test("solutions of random circuit-like systems agree with an independent dense solve (ml-matrix's LU)", () => {
    fc.assert(
      fc.property(circuitSystem, ({ n, a, pattern, b }) => {
        const lu = sparseLuOf(n, a, pattern);
        expect(lu.factor()).toBe(true);
        const x = new Float64Array(n);
        lu.solve(b, x);
        const rows = Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, i * n + n)));
        const y = referenceSolve(new Matrix(rows), Matrix.columnVector(Array.from(b))).to1DArray();
        let size = 0;
        for (const v of y) size = Math.max(size, Math.abs(v));
        for (let i = 0; i < n; i++) expect(Math.abs(x[i]! - y[i]!)).toBeLessThanOrEqual(1e-8 * (1 + size));
        const { worst, scale } = residual(n, a, x, b);
        expect(worst).toBeLessThanOrEqual(1e-12 * n * scale + 1e-300);
      }),
      { numRuns: 300 },
    );
  });

  test("the solution of an RC ladder's resistive network matches its closed form (voltage divider chain)", () => {
    // A chain of k equal series resistors R from a 1 V source to an open end: every node sits at
    // 1 V. With a resistor R to ground at the end, node m (1..k) sits at 1 − m/(k + 1) V (Ohm's law).
    const k = 2000;
    const n = k + 2; // nodes 0..k, branch current of the source
    const rows: number[] = [];
    const cols: number[] = [];
    const values: number[] = [];
    const g = 1e-3;
    const entry = new Map<number, number>();
    const add = (i: number, j: number, v: number) => {
      const key = i * n + j;
      const at = entry.get(key);
      if (at === undefined) {
        entry.set(key, values.length);
        rows.push(i);
        cols.push(j);
        values.push(v);
      } else values[at] += v;
    };
    for (let m = 1; m <= k; m++) {
      add(m - 1, m - 1, g);
      add(m, m, g);
      add(m - 1, m, -g);
      add(m, m - 1, -g);
    }
    add(k, k, g);
    add(k + 1, 0, 1);
    add(0, k + 1, 1);
    const lu = new SparseLu(n, Int32Array.from(rows), Int32Array.from(cols));
    lu.a.set(values);
    expect(lu.factor()).toBe(true);
    // Elimination along the chain fills nothing: the factors hold only the matrix's own entries.
    expect(lu.factorSize).toBe(values.length);
    const b = new Float64Array(n);
    b[k + 1] = 1;
    const x = new Float64Array(n);
    lu.solve(b, x);
    for (let m = 0; m <= k; m++) expect(x[m]).toBeCloseTo(1 - m / (k + 1), 12);
  });

  test("a refactorisation with moved values keeps the order; a collapsed pivot makes it choose afresh", () => {
    fc.assert(
      fc.property(sparseCase, fc.double({ min: -0.01, max: 0.01, noNaN: true }), ({ n, a, pattern, b }, wobble) => {
        const lu = sparseLuOf(n, a, pattern);
        expect(lu.factor()).toBe(true);
        const moved = a.map((v, k) => v * (1 + wobble * Math.sin(k + 1)));
        lu.a.set(entriesOf(n, moved, pattern).values);
        expect(lu.factor()).toBe(true);
        expect(lu.pivotings).toBe(1);
        const x = new Float64Array(n);
        lu.solve(b, x);
        const { worst, scale } = residual(n, moved, x, b);
        expect(worst).toBeLessThanOrEqual(1e-13 * n * scale + 1e-300);
      }),
      { numRuns: 200 },
    );
  });

  test("when a kept pivot fails the threshold test the order is chosen afresh and the solution stays right", () => {
    const n = 3;
    const a = Float64Array.from([4, 1, 0, 1, 3, 1, 0, 1, 2]);
    const pattern = Uint8Array.from(a, (v) => (v !== 0 ? 1 : 0));
    const lu = sparseLuOf(n, a, pattern);
    expect(lu.factor()).toBe(true);
    expect(lu.pivotings).toBe(1);
    // Shrink the first chosen pivot far below the other entries of its column.
    const collapsed = Float64Array.from(a);
    collapsed[lu.rowOrder[0]! * n + lu.colOrder[0]!] = 1e-9;
    lu.a.set(entriesOf(n, collapsed, pattern).values);
    expect(lu.factor()).toBe(true);
    expect(lu.pivotings).toBe(2);
    expect(Math.abs(collapsed[lu.rowOrder[0]! * n + lu.colOrder[0]!]!)).toBeGreaterThan(1e-9);
    const b = Float64Array.from([1, 2, 3]);
    const x = new Float64Array(n);
    lu.solve(b, x);
    const { worst, scale } = residual(n, collapsed, x, b);
    expect(worst).toBeLessThanOrEqual(1e-14 * scale);
  });

  test("an earlier order that serves again is taken back without ordering afresh", () => {
    const n = 2;
    const pattern = new Uint8Array(4).fill(1);
    const a = Float64Array.from([40, 1, 1, 3]); // pivots (0, 0) then (1, 1)
    const b = Float64Array.from([1e-9, 1, 1, 3]); // (0, 0) is no pivot now: (1, 0) first
    const lu = sparseLuOf(n, a, pattern);
    expect(lu.factor()).toBe(true);
    lu.a.set(b);
    expect(lu.factor()).toBe(true);
    expect(lu.pivotings).toBe(2);
    expect([...lu.rowOrder]).toEqual([1, 0]);
    // On a, pivot (1, 0) = 1 is below 0.1 of the 40 under it: the first order serves again.
    lu.a.set(a);
    expect(lu.factor()).toBe(true);
    expect(lu.pivotings).toBe(2);
    expect([...lu.rowOrder]).toEqual([0, 1]);
    const x = new Float64Array(n);
    lu.solve(Float64Array.from([41, 4]), x);
    expect(x[0]).toBeCloseTo(1, 14);
    expect(x[1]).toBeCloseTo(1, 14);
  });

  test("a singular matrix is reported with the column of the zero pivot", () => {
    const lu = sparseLuOf(3, Float64Array.from([1, 2, 3, 4, 5, 9, 7, 8, 15]), new Uint8Array(9).fill(1));
    expect(lu.factor()).toBe(false);
    expect(lu.singularColumn).toBe(2);
  });

  test("compiled and loop eliminations give bit-identical factors and solutions (same operations in the same order)", () => {
    fc.assert(
      fc.property(sparseCase, fc.double({ min: -0.01, max: 0.01, noNaN: true }), ({ n, a, pattern, b }, wobble) => {
        const compiled = sparseLuOf(n, a, pattern, 0, true);
        const loops = sparseLuOf(n, a, pattern, 0, false);
        const moved = entriesOf(n, a.map((v, k) => v * (1 + wobble * Math.cos(k))), pattern).values;
        for (const values of [compiled.a.slice(), moved]) {
          for (const lu of [compiled, loops]) {
            lu.a.set(values);
            expect(lu.factor()).toBe(true);
          }
          const x = new Float64Array(n);
          const y = new Float64Array(n);
          compiled.solveNegated(b, x);
          loops.solveNegated(b, y);
          for (let i = 0; i < n; i++) expect(Object.is(x[i], y[i])).toBe(true);
          for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) expect(Object.is(compiled.factorEntry(i, j), loops.factorEntry(i, j))).toBe(true);
        }
      }),
      { numRuns: 200 },
    );
  });

  test("a snapshot's factorisation restores the same solutions without factoring again", () => {
    const n = 3;
    const a = Float64Array.from([4, 1, 0, 1, 3, 1, 0, 1, 2]);
    const pattern = Uint8Array.from(a, (v) => (v !== 0 ? 1 : 0));
    const lu = sparseLuOf(n, a, pattern);
    lu.factor();
    const copy = sparseLuOf(n, new Float64Array(9), pattern);
    copy.restore(lu.state());
    const b = Float64Array.from([1, 2, 3]);
    const [x, y] = [new Float64Array(n), new Float64Array(n)];
    lu.solve(b, x);
    copy.solve(b, y);
    expect([...y]).toEqual([...x]);
  });
});

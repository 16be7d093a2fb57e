import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { markowitzOrderByLists } from "../../../packages/core/src/solver/markowitz.js";
import { SMALL_ORDERING, smallMarkowitzOrder } from "../../../packages/core/src/solver/markowitz-small.js";
import { entriesOf, sparseCase } from "./sparse-matrices.js";

type Order = typeof smallMarkowitzOrder;

function run(order: Order, n: number, e: ReturnType<typeof entriesOf>, threshold: number) {
  const rows = new Int32Array(n).fill(-1);
  const cols = new Int32Array(n).fill(-1);
  const stuck = order(n, e.rows, e.cols, e.values, threshold, 1e-13, rows, cols);
  return { stuck, rows: [...rows], cols: [...cols] };
}

/** A small matrix whose entries are drawn from a few values, so that costs and qualities tie often, with zero rows and columns allowed. */
const tieCase = fc.integer({ min: 1, max: SMALL_ORDERING }).chain((n) =>
  fc.array(fc.constantFrom(0, 0, 0, 1, -1, 2, 0.5, 1e-20), { minLength: n * n, maxLength: n * n }).chain((values) =>
    fc.array(fc.boolean(), { minLength: n * n, maxLength: n * n }).map((structural) => {
      const a = Float64Array.from(values);
      const pattern = Uint8Array.from(values, (v, k) => (v !== 0 || structural[k] ? 1 : 0));
      return { n, a, pattern };
    }),
  ),
);

describe("smallMarkowitzOrder(n, rows, cols, a, …) on dense arrays", () => {
  test("chooses the very order of the list search (the criterion and its tie-breaks), on dominant matrices", () => {
    fc.assert(
      fc.property(sparseCase, fc.nat(1000), fc.constantFrom(0.1, 0.5, 1), ({ n, a, pattern }, shuffle, threshold) => {
        const e = entriesOf(n, a, pattern, shuffle);
        expect(run(smallMarkowitzOrder, n, e, threshold)).toEqual(run(markowitzOrderByLists, n, e, threshold));
      }),
      { numRuns: 400 },
    );
  });

  test("and on matrices full of ties, structural zeros and singular ones (the same column named)", () => {
    fc.assert(
      fc.property(tieCase, fc.nat(1000), ({ n, a, pattern }, shuffle) => {
        const e = entriesOf(n, a, pattern, shuffle);
        expect(run(smallMarkowitzOrder, n, e, 0.1)).toEqual(run(markowitzOrderByLists, n, e, 0.1));
      }),
      { numRuns: 400 },
    );
  });
});

import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { decimateColumns } from "../../../packages/cli/src/plot/decimate.js";

function pairs(run: Float64Array): [number, number][] {
  const out: [number, number][] = [];
  for (let i = 0; i < run.length; i += 2) out.push([run[i] as number, run[i + 1] as number]);
  return out;
}

describe("decimateColumns(xs, ys)", () => {
  it("keeps the lowest and highest point of every pixel column, and at most four per column", () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.double({ min: 0, max: 5, noNaN: true }), fc.double({ min: -100, max: 100, noNaN: true })), { minLength: 1, maxLength: 400 }), (raw) => {
        // Steps of 0 to 0.25 px: several samples share most columns, some columns are skipped.
        let x = 0;
        const points = raw.map(([step, y]) => [(x += step / 20), y] as const);
        const xs = Float64Array.from(points, (p) => p[0]);
        const ys = Float64Array.from(points, (p) => p[1]);
        const runs = decimateColumns(xs, ys);
        expect(runs).toHaveLength(1);
        const kept = pairs(runs[0] as Float64Array);
        const columns = new Map<number, number[]>();
        points.forEach(([x, y]) => columns.set(Math.floor(x), [...(columns.get(Math.floor(x)) ?? []), y]));
        for (const [column, values] of columns) {
          const inColumn = kept.filter(([x]) => Math.floor(x) === column).map(([, y]) => y);
          expect(inColumn.length).toBeLessThanOrEqual(4);
          expect(Math.min(...inColumn)).toBe(Math.min(...values));
          expect(Math.max(...inColumn)).toBe(Math.max(...values));
        }
        // First and last points survive, and the order of the samples is kept.
        expect(kept[0]).toEqual([xs[0], ys[0]]);
        expect(kept.at(-1)).toEqual([xs.at(-1), ys.at(-1)]);
        for (let i = 1; i < kept.length; i += 1) expect((kept[i] as [number, number])[0]).toBeGreaterThanOrEqual((kept[i - 1] as [number, number])[0]);
      }),
    );
  });

  it("breaks the line at non-finite points", () => {
    const xs = Float64Array.from([0, 1, 2, 3, 4, 5, 6]);
    const ys = Float64Array.from([0, 1, Number.NaN, 3, Number.POSITIVE_INFINITY, 5, 6]);
    expect(decimateColumns(xs, ys).map((r) => [...r])).toEqual([[0, 0, 1, 1], [3, 3], [5, 5, 6, 6]]);
  });

  it("bounds a million samples by the number of columns", () => {
    const n = 1_000_000;
    const xs = Float64Array.from({ length: n }, (_, i) => (i / n) * 800);
    const ys = Float64Array.from({ length: n }, (_, i) => Math.sin(i / 500) * 100 + ((i * 7919) % 13));
    const runs = decimateColumns(xs, ys);
    expect(runs).toHaveLength(1);
    expect((runs[0] as Float64Array).length / 2).toBeLessThanOrEqual(4 * 800);
  });
});

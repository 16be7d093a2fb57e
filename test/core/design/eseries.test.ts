import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { E_SERIES, snapToSeries } from "@onset/core";

describe("IEC 60063 E-series (docs/references.md §1)", () => {
  test("E96 values are round(10^(i/96), 2) (checked three ways in docs/references.md §1)", () => {
    E_SERIES.E96.forEach((v, i) => expect(v).toBeCloseTo(Math.round(Math.pow(10, i / 96) * 100) / 100, 12));
  });

  test("E24 departs from round(10^(i/24), 1) at exactly the eight positions of docs/references.md §1", () => {
    const differs = E_SERIES.E24.flatMap((v, i) => (Math.abs(v - Math.round(Math.pow(10, i / 24) * 10) / 10) > 1e-9 ? [v] : []));
    expect(differs).toEqual([2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 8.2]);
  });

  test("E12 is every second E24 value", () => {
    expect(E_SERIES.E12).toEqual(E_SERIES.E24.filter((_, i) => i % 2 === 0));
  });

  test.each([
    [10961.08, "E12", 12e3],
    [10961.08, "E24", 11e3],
    [10961.08, "E96", 11.0e3],
    [13545.1, "E12", 15e3],
    [13545.1, "E24", 13e3],
    [13545.1, "E96", 13.7e3],
    [9545, "E24", 10e3],
    [1049, "E24", 1.1e3],
    [9080, "E12", 10e3],
    [9879.5, "E96", 10.0e3],
    [0.0995, "E96", 0.1],
  ] as const)("snap %d to %s → %d (nearest in the log sense, docs/references.md §1)", (x, series, expected) => {
    // relative comparison: 0.1 is not exact in binary
    expect(Math.abs(snapToSeries(x, series) / expected - 1)).toBeLessThan(1e-12);
  });

  test("the snapped value is never farther in log than the series' half step (mathematics)", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-3, max: 1e9, noNaN: true }), fc.constantFrom("E12", "E24", "E96" as const), (x, series) => {
        const n = E_SERIES[series].length;
        const snapped = snapToSeries(x, series);
        // no gap between neighbours exceeds 1.2/n decade (E12's widest, 2.2 → 2.7, is 0.089),
        // so the nearest value lies within half of that
        expect(Math.abs(Math.log10(snapped / x))).toBeLessThan(0.6 / n + 0.01);
      }),
    );
  });
});

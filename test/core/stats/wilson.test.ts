import { describe, expect, test } from "vitest";
import jStat from "jstat";
import { percentileOfSorted, summarize, wilsonInterval, Z95 } from "@onset/core";

describe("Wilson score interval (docs/references.md §6; Wilson 1927; checked against scipy and jstat there)", () => {
  test("z for 95 % equals jstat's normal quantile (independent library)", () => {
    expect(Z95).toBeCloseTo(jStat.normal.inv(0.975, 0, 1), 12);
  });

  test.each([
    [470, 500, 0.915639, 0.957652],
    [500, 500, 0.992376, 1],
    [0, 500, 0, 0.007624],
    [95, 100, 0.88825, 0.978456],
    [9, 10, 0.59585, 0.982124],
  ])("%d/%d → [%d, %d]", (k, n, low, high) => {
    const ci = wilsonInterval(k, n);
    expect(ci.low).toBeCloseTo(low, 6);
    expect(ci.high).toBeCloseTo(high, 6);
  });
});

describe("percentiles (Hyndman & Fan definition 7)", () => {
  test("linear interpolation between closest ranks", () => {
    const sorted = [1, 2, 3, 4, 5];
    expect(percentileOfSorted(sorted, 50)).toBe(3);
    expect(percentileOfSorted(sorted, 25)).toBe(2);
    expect(percentileOfSorted(sorted, 10)).toBeCloseTo(1.4, 12);
  });

  test("summarize skips non-finite values and reports mean and sample σ", () => {
    const s = summarize([3, Number.NaN, 1, 2, Infinity])!;
    expect(s.count).toBe(3);
    expect(s.min).toBe(1);
    expect(s.max).toBe(3);
    expect(s.median).toBe(2);
    expect(s.mean).toBe(2);
    expect(s.std).toBeCloseTo(1, 12);
    expect(summarize([])).toBeNull();
  });
});

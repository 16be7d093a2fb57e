import { describe, expect, it } from "vitest";
import { domainOf, extentOf } from "../../../packages/cli/src/plot/range.js";

describe("domainOf(extent, log, padding)", () => {
  it("pads a span on both ends", () => {
    expect(domainOf([-1, 1], false, 0.05)).toEqual([-1.1, 1.1]);
  });

  it("does not pad a non-negative range below zero", () => {
    expect(domainOf([0, 10], false, 0.05)).toEqual([0, 10.5]);
  });

  it("gives a constant series a span of its own", () => {
    expect(domainOf([5, 5], false, 0.05)).toEqual([4.5, 5.5]);
    expect(domainOf([0, 0], false, 0.05)).toEqual([-1, 1]);
    const [lo, hi] = domainOf([100, 100], true, 0.05);
    expect(hi / lo).toBeCloseTo(10, 12);
  });

  it("falls back to a unit range without data", () => {
    expect(domainOf(undefined, false, 0.05)).toEqual([0, 1]);
    expect(domainOf(undefined, true, 0.05)).toEqual([1, 10]);
  });

  it("pads a log axis in decades", () => {
    const [lo, hi] = domainOf([10, 1e5], true, 0.25);
    expect(Math.log10(lo)).toBeCloseTo(0, 12);
    expect(Math.log10(hi)).toBeCloseTo(6, 12);
  });
});

describe("extentOf(values, log)", () => {
  it("skips non-finite values, and non-positive ones on a log axis", () => {
    expect(extentOf([Number.NaN, 3, -2, Number.POSITIVE_INFINITY, 7], false)).toEqual([-2, 7]);
    expect(extentOf([0, -2, 3, 7], true)).toEqual([3, 7]);
    expect(extentOf([Number.NaN], false)).toBeUndefined();
  });
});

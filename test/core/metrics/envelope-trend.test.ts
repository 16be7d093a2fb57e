import { describe, expect, test } from "vitest";
import { tailTrend } from "../../../packages/core/src/metrics/envelope-trend.js";
import { fitEnvelopeGrowth } from "../../../packages/core/src/metrics/growth-rate.js";
import { settlingTime } from "../../../packages/core/src/metrics/settling.js";
import { formatPercent, formatQuantity, formatRate } from "../../../packages/core/src/metrics/format.js";

describe("tailTrend and fitEnvelopeGrowth", () => {
  test("a geometric envelope r^k has mean log change ln r and every change rising", () => {
    const envelope = Float64Array.from({ length: 20 }, (_, k) => 1.03 ** k);
    const trend = tailTrend(envelope, 10);
    expect(trend.meanLogChange).toBeCloseTo(Math.log(1.03), 14);
    expect(trend.largestChange).toBeCloseTo(0.03, 12);
    expect(trend.risingFraction).toBe(1);
    expect(trend.fallingFraction).toBe(0);
  });

  // Least squares through points on a line returns that line (mathematics).
  test("an exactly exponential envelope gives its rate, over the cycles inside (floor, ceiling) only", () => {
    const midTime = Float64Array.from({ length: 30 }, (_, k) => 1e-3 * (k + 0.5));
    const envelope = midTime.map((x) => Math.min(1, 1e-3 * Math.exp(400 * x)));
    const fit = fitEnvelopeGrowth(midTime, envelope, 2e-3, 0.3, "rising")!;
    expect(fit.rate).toBeCloseTo(400, 9);
    // ln(2)/0.4 < k + 0.5 < ln(300)/0.4: cycles 2 … 13.
    expect(fit.cycles).toBe(12);
    const falling = fitEnvelopeGrowth(midTime, midTime.map((x) => Math.exp(-150 * x)), 1e-3, Infinity, "falling")!;
    expect(falling.rate).toBeCloseTo(-150, 9);
    expect(fitEnvelopeGrowth(midTime, envelope, 0.5, 0.6, "rising")).toBeNull();
  });
});

describe("settlingTime", () => {
  // Cycle k has its mid-time at k + 0.5.
  const settle = (envelope: number[], level: number) =>
    settlingTime(Float64Array.from(envelope, (_, k) => k + 0.5), Float64Array.from(envelope), level);

  test("is where the envelope, linear between cycle mid-times, last enters the ±1 % band", () => {
    // Last outside: 0.97 at t = 2.5; next 0.995 at t = 3.5; the edge 0.99 is 80 % of the way.
    expect(settle([0.5, 0.9, 0.97, 0.995, 1.002, 1, 1], 1)).toBeCloseTo(3.3, 12);
    // From above: 1.05 at 1.5, 1.0 at 2.5; the edge 1.01 is 80 % of the way.
    expect(settle([1.2, 1.05, 1, 1, 1], 1)).toBeCloseTo(2.3, 12);
    expect(settle([1, 1.001, 1], 1)).toBe(0.5);
  });
});

describe("explanation number formats", () => {
  test("SI prefixes with four significant digits, percentages, rates", () => {
    expect(formatQuantity(1580.7013, "Hz")).toBe("1.581 kHz");
    expect(formatQuantity(0.015446, "s")).toBe("15.45 ms");
    expect(formatQuantity(3.57817, "V")).toBe("3.578 V");
    expect(formatQuantity(2.5e-7, "s")).toBe("250 ns");
    expect(formatQuantity(999.99999, "V")).toBe("1 kV");
    expect(formatPercent(0.001)).toBe("0.1 %");
    expect(formatPercent(0.2214, true)).toBe("+22.1 %");
    expect(formatPercent(-0.0052, true)).toBe("-0.52 %");
    expect(formatRate(-149.97)).toBe("-150 /s");
  });
});

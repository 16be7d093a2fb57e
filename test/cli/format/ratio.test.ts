import { describe, expect, it } from "vitest";
import { formatDecibel, formatPercent, formatPlain } from "../../../packages/cli/src/format/ratio.js";
import { MINUS_SIGN } from "../../../packages/cli/src/format/symbols.js";

describe("formatPercent(fraction, significant)", () => {
  it.each([
    [0.0512, 4, "5.12 %"],
    [0.1, 4, "10 %"],
    [1, 4, "100 %"],
    [0.004213, 2, "0.42 %"],
    [0, 4, "0 %"],
    [-0.02, 4, `${MINUS_SIGN}2 %`],
    [1e-9, 4, `1e${MINUS_SIGN}7 %`],
    [Number.NaN, 4, "\u2014"],
  ])("formatPercent(%s, %i) is %j", (fraction, significant, expected) => {
    expect(formatPercent(fraction, significant)).toBe(expected);
  });
});

describe("formatDecibel(level, unit, decimals)", () => {
  it.each([
    [-43.21, "dBc", 1, `${MINUS_SIGN}43.2 dBc`],
    [-0.04, "dB", 1, "0.0 dB"],
    [6.02, "dB", 0, "6 dB"],
    [-9.54, "dB", 2, `${MINUS_SIGN}9.54 dB`],
    [Number.NEGATIVE_INFINITY, "dBc", 1, `${MINUS_SIGN}\u221e dBc`],
  ] as const)("formatDecibel(%s, %j, %i) is %j", (level, unit, decimals, expected) => {
    expect(formatDecibel(level, unit, decimals)).toBe(expected);
  });

  it("rejects a negative number of decimals", () => {
    expect(() => formatDecibel(1, "dB", -1)).toThrow(new RangeError("formatDecibel: decimals must be an integer from 0 to 20, got -1"));
  });
});

describe("formatPlain(value, significant)", () => {
  it("prints ratios and counts without a prefix", () => {
    expect(formatPlain(1 / 3)).toBe("0.3333");
    expect(formatPlain(29)).toBe("29");
    expect(formatPlain(123456)).toBe("123500");
  });
});

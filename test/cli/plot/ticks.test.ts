import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { MINUS_SIGN } from "../../../packages/cli/src/format/symbols.js";
import { linearTicks, linearTickValues, logTicks } from "../../../packages/cli/src/plot/ticks.js";

const labels = (ticks: { label: string }[]): string[] => ticks.filter((t) => t.label !== "").map((t) => t.label);

describe("linearTicks(lo, hi, target, unit)", () => {
  it("labels 0..10 ms in 2 ms steps with one prefix", () => {
    expect(labels(linearTicks(0, 0.01, 5, "s"))).toEqual(["0", "2 ms", "4 ms", "6 ms", "8 ms", "10 ms"]);
  });

  it("keeps the prefix of the largest tick across the axis", () => {
    expect(labels(linearTicks(0, 0.002, 4, "s"))).toEqual(["0", "0.5 ms", "1 ms", "1.5 ms", "2 ms"]);
    expect(labels(linearTicks(-1e-3, 1e-3, 4, "A"))).toEqual([`${MINUS_SIGN}1 mA`, `${MINUS_SIGN}0.5 mA`, "0", "0.5 mA", "1 mA"]);
  });

  it("takes the prefix below when its labels are shorter", () => {
    expect(labels(linearTicks(990, 1010, 4, "Hz"))).toEqual(["990 Hz", "995 Hz", "1000 Hz", "1005 Hz", "1010 Hz"]);
  });

  it("steps angles in whole fractions of a half turn", () => {
    expect(labels(linearTicks(-180, 0, 4, "\u00b0"))).toEqual([`${MINUS_SIGN}180\u00b0`, `${MINUS_SIGN}135\u00b0`, `${MINUS_SIGN}90\u00b0`, `${MINUS_SIGN}45\u00b0`, "0"]);
  });

  it("prints plain counts without a prefix", () => {
    expect(labels(linearTicks(0, 1200, 6, ""))).toEqual(["0", "200", "400", "600", "800", "1000", "1200"]);
  });
});

describe("linearTickValues(lo, hi, target)", () => {
  it("gives equally spaced 1-2-5 multiples inside the range, about target intervals", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.double({ min: 1e-6, max: 1e6, noNaN: true }),
        fc.integer({ min: 2, max: 12 }),
        (lo, span, target) => {
          const hi = lo + span;
          if (!(hi - lo > 1e-9 * Math.max(Math.abs(lo), Math.abs(hi)))) return;
          const ticks = linearTickValues(lo, hi, target);
          const step = (ticks[1] ?? Number.NaN) - (ticks[0] ?? Number.NaN);
          expect(ticks.length).toBeGreaterThanOrEqual(2);
          // Nearest 1-2-5 step on a log scale is within a factor √(50)/5 = 1.414 of span/target.
          expect(ticks.length - 1).toBeLessThanOrEqual(Math.ceil(target * Math.SQRT2) + 1);
          expect(ticks.length - 1).toBeGreaterThanOrEqual(Math.floor(target / Math.SQRT2) - 1);
          const mantissa = step / 10 ** Math.floor(Math.log10(step) + 1e-9);
          expect([1, 2, 5].some((m) => Math.abs(mantissa - m) < 1e-6)).toBe(true);
          // hi = lo + span is itself rounded: allow a few ulps of the range's magnitude too.
          const slack = 1e-9 * span + 4 * Number.EPSILON * Math.max(Math.abs(lo), Math.abs(hi));
          for (const [i, v] of ticks.entries()) {
            expect(v).toBeGreaterThanOrEqual(lo - slack);
            expect(v).toBeLessThanOrEqual(hi + slack);
            expect(Math.abs(v - (ticks[0] as number) - i * step)).toBeLessThanOrEqual(1e-9 * Math.max(span, Math.abs(v)));
          }
        },
      ),
    );
  });
});

describe("logTicks(lo, hi, maxLabels, unit)", () => {
  it("labels the decades from 10 Hz to 100 kHz and puts 2…9 between them", () => {
    const ticks = logTicks(10, 1e5, 10, "Hz");
    expect(labels(ticks)).toEqual(["10 Hz", "100 Hz", "1 kHz", "10 kHz", "100 kHz"]);
    expect(ticks.filter((t) => t.major).map((t) => t.value)).toEqual([10, 100, 1000, 1e4, 1e5]);
    const minor = ticks.filter((t) => !t.major).map((t) => t.value);
    expect(minor).toHaveLength(4 * 8);
    expect(minor.slice(0, 8)).toEqual([20, 30, 40, 50, 60, 70, 80, 90]);
  });

  it("labels every third decade, on multiples of three, when there are too many", () => {
    const ticks = logTicks(1e-3, 1e9, 5, "Hz");
    expect(labels(ticks)).toEqual(["1 mHz", "1 Hz", "1 kHz", "1 MHz", "1 GHz"]);
    expect(ticks.some((t) => !t.major && t.value === 20)).toBe(false);
  });

  it("falls back to 1-2-5 inside a single decade", () => {
    expect(labels(logTicks(150, 900, 10, "Hz"))).toEqual(["200 Hz", "500 Hz"]);
  });

  it("falls back to linear steps when even 1-2-5 gives fewer than two labels", () => {
    expect(labels(logTicks(300, 450, 10, "Hz")).length).toBeGreaterThanOrEqual(2);
  });
});

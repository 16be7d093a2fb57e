import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { formatSI, formatTickSI } from "../../../packages/cli/src/format/si.js";
import { MICRO_SIGN, MINUS_SIGN } from "../../../packages/cli/src/format/symbols.js";

// A tiny independent prefix table (SI Brochure, 9th edition, table 7) to read labels back.
const PREFIX_POWER: Record<string, number> = { f: -15, p: -12, n: -9, [MICRO_SIGN]: -6, m: -3, "": 0, k: 3, M: 6, G: 9, T: 12 };
const LABEL = /^(\u2212?)(\d+(?:\.\d+)?)(?:e(\u2212?\d+))?(?: ([fpn\u00b5mkMGT]?)V)?$/;

function readBack(text: string): number {
  const match = LABEL.exec(text);
  if (match === null) throw new Error(`unreadable label ${JSON.stringify(text)}`);
  const [, sign = "", mantissa = "0", exponent, prefix = ""] = match;
  const power = (PREFIX_POWER[prefix] ?? Number.NaN) + (exponent === undefined ? 0 : Number(exponent.replace(MINUS_SIGN, "-")));
  const magnitude = Number(`${mantissa}e${power}`);
  return sign === "" ? magnitude : -magnitude;
}

describe("formatSI(value, unit, significant)", () => {
  const cases: [number, string, number, string][] = [
    [4.73, "V", 4, "4.73 V"],
    [1012, "Hz", 4, "1.012 kHz"],
    [0.0132, "s", 4, "13.2 ms"],
    [0, "V", 4, "0 V"],
    [-0, "V", 4, "0 V"],
    [-0.0015, "A", 4, `${MINUS_SIGN}1.5 mA`],
    [2200, "\u03a9", 4, "2.2 k\u03a9"],
    [47e-9, "F", 4, "47 nF"],
    [4.7e-6, "F", 4, `4.7 ${MICRO_SIGN}F`],
    [10e-3, "H", 4, "10 mH"],
    [1, "s", 4, "1 s"],
    [999.94, "V", 4, "999.9 V"],
    [999.96, "V", 4, "1 kV"],
    [0.00099996, "s", 4, "1 ms"],
    [0.96, "V", 1, "1 V"],
    [9.6, "V", 1, "10 V"],
    [960, "V", 1, "1 kV"],
    [123456, "\u03a9", 2, "120 k\u03a9"],
    [1e-15, "F", 4, "1 fF"],
    [1.5e-18, "F", 4, "0.0015 fF"],
    [1e-25, "F", 4, `1e${MINUS_SIGN}25 F`],
    [1.234e16, "V", 4, "12340 TV"],
    [1e20, "Hz", 4, "1e20 Hz"],
    [1.23456e12, "Hz", 3, "1.23 THz"],
    [0.05, "%", 4, "0.05 %"],
    [45, "\u00b0", 4, "45\u00b0"],
    [-180, "\u00b0", 4, `${MINUS_SIGN}180\u00b0`],
    [1 / 3, "", 4, "0.3333"],
    [29, "1", 4, "29"],
    [2.5e-8, "", 4, `2.5e${MINUS_SIGN}8`],
    [Number.NaN, "V", 4, "\u2014"],
    [Number.POSITIVE_INFINITY, "V", 4, "\u221e V"],
    [Number.NEGATIVE_INFINITY, "Hz", 4, `${MINUS_SIGN}\u221e Hz`],
  ];
  it.each(cases)("formatSI(%s, %j, %i) is %j", (value, unit, significant, expected) => {
    expect(formatSI(value, unit, significant)).toBe(expected);
  });

  it("keeps trailing zeros when asked, so every value shows the same number of digits", () => {
    expect(formatSI(4.73, "V", 4, { zeros: "keep" })).toBe("4.730 V");
    expect(formatSI(47e-9, "F", 4, { zeros: "keep" })).toBe("47.00 nF");
    expect(formatSI(999.96, "V", 4, { zeros: "keep" })).toBe("1.000 kV");
    expect(formatSI(0, "V", 3, { zeros: "keep" })).toBe("0.00 V");
  });

  it("rejects a significant-digit count outside 1..21 with the rule in the message", () => {
    expect(() => formatSI(1, "V", 0)).toThrow(new RangeError("formatSI: significant must be an integer from 1 to 21, got 0"));
    expect(() => formatSI(1, "V", 2.5)).toThrow(RangeError);
  });

  // Mathematics: rounding d.ddd… × 10^e to s digits moves it by at most half a unit in the last
  // place, 0.5 × 10^(e−s+1), which relative to a value ≥ 10^e is 0.5 × 10^(1−s).
  it("reads back within the rounding of its significant digits", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-20, max: 1e20, noNaN: true }),
        fc.boolean(),
        fc.integer({ min: 1, max: 12 }),
        (magnitude, negative, significant) => {
          const value = negative ? -magnitude : magnitude;
          const back = readBack(formatSI(value, "V", significant));
          expect(Math.abs(back - value)).toBeLessThanOrEqual(0.5 * 10 ** (1 - significant) * magnitude * (1 + 1e-9));
        },
      ),
    );
  });

  it("keeps the mantissa from 1 to below 1000 inside the prefix table", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-15, max: 1e14, noNaN: true }), fc.integer({ min: 1, max: 8 }), (value, significant) => {
        const match = LABEL.exec(formatSI(value, "V", significant));
        const mantissa = Number(match?.[2]);
        expect(mantissa).toBeGreaterThanOrEqual(1);
        expect(mantissa).toBeLessThan(1000);
        expect(match?.[3]).toBeUndefined();
      }),
    );
  });
});

describe("formatTickSI(value, unit, prefixExponent)", () => {
  const cases: [number, string, number | undefined, string][] = [
    [0, "s", undefined, "0"],
    [0.002, "s", undefined, "2 ms"],
    [0.0025, "s", undefined, "2.5 ms"],
    [0.1 + 0.2, "", undefined, "0.3"],
    [0.1 + 0.2, "V", undefined, "300 mV"],
    [1e4, "Hz", undefined, "10 kHz"],
    [1e5, "Hz", undefined, "100 kHz"],
    [0.0005, "s", -3, "0.5 ms"],
    [-0.001, "s", -3, `${MINUS_SIGN}1 ms`],
    [1.5e-3, "A", -3, "1.5 mA"],
    [1e-5, "s", -3, "0.01 ms"],
    [1e-9, "s", -3, `1e${MINUS_SIGN}9 s`],
    [250, "", undefined, "250"],
    [-90, "\u00b0", undefined, `${MINUS_SIGN}90\u00b0`],
    [12.5, "%", undefined, "12.5 %"],
    [Number.NaN, "V", undefined, "\u2014"],
  ];
  it.each(cases)("formatTickSI(%s, %j, %s) is %j", (value, unit, exponent, expected) => {
    expect(formatTickSI(value, unit, exponent)).toBe(expected);
  });

  it("labels every 1-2-5 multiple exactly and with the fewest digits", () => {
    fc.assert(
      fc.property(fc.integer({ min: -500, max: 500 }), fc.constantFrom(1, 2, 5), fc.integer({ min: -14, max: 10 }), (i, step, power) => {
        const exact = power >= 0 ? i * step * 10 ** power : (i * step) / 10 ** -power;
        const label = formatTickSI(exact, "V");
        if (exact === 0) {
          expect(label).toBe("0");
          return;
        }
        expect(Math.abs(readBack(label) - exact)).toBeLessThanOrEqual(1e-12 * Math.abs(exact));
        // The digits of i·step alone, without trailing zeros: no label carries padding.
        const digits = label.replace(/[^0-9]/g, "").replace(/^0+/, "").replace(/0+$/, "");
        expect(digits).toBe(String(Math.abs(i * step)).replace(/0+$/, ""));
      }),
    );
  });
});

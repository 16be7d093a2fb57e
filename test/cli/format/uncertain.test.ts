import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { formatWithError } from "../../../packages/cli/src/format/uncertain.js";

describe("formatWithError(value, error, unit)", () => {
  test.each([
    [1.22391, 0.0004, "V", "1.2239 V ± 0.0004 V"],
    [2441.50695, 0.2812, "Hz", "2441.51 Hz ± 0.28 Hz"],
    [2441.50695, 3.1, "Hz", "2.442 kHz ± 0.003 kHz"],
    [1.5e6 + 0.123, 0.02, "Hz", "1500000.123 Hz ± 0.020 Hz"],
    [1.5e6 + 123, 20, "Hz", "1500.123 kHz ± 0.020 kHz"],
    [0.0224454, 4.2e-6, "1", "2.2445 % ± 0.0004 %"],
    [-0.0123456, 0.000031, "V", "−12.35 mV ± 0.03 mV"],
    [-0.0123456, 0.000021, "V", "−12.346 mV ± 0.021 mV"],
    [6.5032489, 0.0000499, "V", "6.50325 V ± 0.00005 V"],
    [3.0, 0, "V", "3 V"],
  ])("%d ± %d %s → %s", (value, error, unit, expected) => {
    expect(formatWithError(value, error, unit)).toBe(expected);
  });

  test("value and bar are each within half a unit of the last digit printed", () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.double({ min: 1e-9, max: 1e-2, noNaN: true }), (v, rel) => {
        fc.pre(Math.abs(v) > 1e-6);
        const error = Math.abs(v) * rel;
        const text = formatWithError(v, error, "");
        const [shown, bar] = text.split(" ± ").map((s) => Number(s.replace("\u2212", "-")));
        const decimals = (text.split(" ± ")[0]!.split(".")[1] ?? "").length;
        expect(Math.abs(shown! - v)).toBeLessThanOrEqual(0.5 * 10 ** -decimals + 1e-12 * Math.abs(v));
        expect(Math.abs(bar! - error)).toBeLessThanOrEqual(0.5 * 10 ** -decimals + 1e-12 * error);
      }),
    );
  });
});

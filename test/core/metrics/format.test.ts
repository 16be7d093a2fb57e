import { describe, expect, test } from "vitest";
import { formatQuantity } from "../../../packages/core/src/metrics/format.js";

describe("formatQuantity(value, unit)", () => {
  test("beyond femto and tera the value is written with its exponent and the bare unit (it printed 3.671e-18 fV)", () => {
    expect(formatQuantity(3.671e-33, "V")).toBe("3.671e-33 V");
    expect(formatQuantity(-2.5e-16, "A")).toBe("-2.500e-16 A");
    expect(formatQuantity(4.2e18, "Hz")).toBe("4.200e+18 Hz");
  });

  test("inside them the SI prefix as before", () => {
    expect(formatQuantity(1e-15, "V")).toBe("1 fV");
    expect(formatQuantity(999e12, "Hz")).toBe("999 THz");
    expect(formatQuantity(1580.7013, "Hz")).toBe("1.581 kHz");
  });
});

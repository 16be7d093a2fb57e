import { describe, expect, test } from "vitest";
import type { PolesResult } from "@onset/core";
import { paint } from "../../../packages/cli/src/color.js";
import { polesReport } from "../../../packages/cli/src/report/poles.js";

/** A poles result with one dominant pair at `real` ± j·2π·1 kHz. */
const polesAt = (real: number, starts: boolean): PolesResult => {
  const imag = 2 * Math.PI * 1000;
  return { analysis: "poles", poles: [{ real, imag }, { real, imag: -imag }], dominant: { real, imag }, frequency: 1000, growthRate: real, starts };
};
const verdict = (r: PolesResult) => polesReport(r, null, "V", paint(false)).find((l) => l.includes("dominant pair"))!;

describe("polesReport(result, check, unit, paint)", () => {
  test("names a pair on the imaginary axis (a lossless tank) as neither growing nor decaying", () => {
    expect(verdict(polesAt(0, false))).toContain("on the imaginary axis");
    expect(verdict(polesAt(0, false))).not.toContain("it decays");
  });

  test("names a pair in the left half-plane as decaying and one in the right as starting", () => {
    expect(verdict(polesAt(-10, false))).toContain("it decays");
    expect(verdict(polesAt(10, true))).toContain("an oscillation starts");
  });
});

// A steady result as a study sample's verdict: `decaying` only when nothing at the bias point
// grows. A sample of a circuit that grows along a real pole (a latch, a relaxation oscillator, a
// double scroll) has no orbit to measure, but it does not decay: it was counted `decaying`.
import { describe, expect, test } from "vitest";
import { steadyVerdict, type SteadyResult } from "@onset/core";

function withoutOrbit(starts: boolean, realGrowth: boolean): SteadyResult {
  return { found: false, kind: "autonomous", stability: null, predicted: { frequency: 1e3, growthRate: starts ? 10 : -10, starts, realGrowth, startupTime: null } } as unknown as SteadyResult;
}

describe("steadyVerdict(result) without an orbit", () => {
  test.each([
    [false, false, "decaying"],
    [false, true, "unsettled"],
    [true, false, "unsettled"],
    [true, true, "unsettled"],
  ] as const)("a pair that starts: %s, a real pole that grows: %s → %s", (starts, realGrowth, verdict) => {
    expect(steadyVerdict(withoutOrbit(starts, realGrowth))).toBe(verdict);
  });
});

// The shooting's bound on periods (`IterationCap`): 25 as before, and beyond them up to 100 only
// while the best mismatch still falls by 5 % every 10 periods.
import { describe, expect, test } from "vitest";
import { IterationCap, LONGEST_SHOOTING } from "@onset/core/engine";

/** The periods a cap allows for a run of mismatches (one recorded per period integrated). */
const periodsAllowed = (cap: IterationCap, mismatchOf: (k: number) => number): number => {
  let k = 1;
  for (; cap.allows(k); k++) cap.record(mismatchOf(k));
  return k - 1;
};

describe("IterationCap", () => {
  test("without headway it stops at the usual bound", () => {
    expect(periodsAllowed(new IterationCap(25, LONGEST_SHOOTING), () => 100)).toBe(25);
    // 1 % per 10 periods is a crawl, not headway.
    expect(periodsAllowed(new IterationCap(25, LONGEST_SHOOTING), (k) => 100 * 0.999 ** k)).toBe(25);
  });

  test("a mismatch falling steadily goes on to the longest bound, and no further", () => {
    // 1 % a period: about 10 % every 10 periods.
    expect(periodsAllowed(new IterationCap(25, LONGEST_SHOOTING), (k) => 1e4 * 0.99 ** k)).toBe(LONGEST_SHOOTING);
  });

  test("headway that stops ends the extension within the window", () => {
    const stalled = periodsAllowed(new IterationCap(25, LONGEST_SHOOTING), (k) => 1e4 * 0.98 ** Math.min(k, 40));
    expect(stalled).toBeGreaterThan(40);
    expect(stalled).toBeLessThanOrEqual(51);
  });

  test("the best mismatch counts: a bouncing one that keeps setting lows goes on", () => {
    expect(periodsAllowed(new IterationCap(25, LONGEST_SHOOTING), (k) => 1e4 * 0.98 ** k * (k % 2 === 0 ? 3 : 1))).toBe(LONGEST_SHOOTING);
  });

  test("a given bound equal to the longest is never extended", () => {
    expect(periodsAllowed(new IterationCap(10, 10), (k) => 1e4 * 0.5 ** k)).toBe(10);
  });
});

// Collapses and restarts of the per-cycle envelope around a stop: the oscillation fell inside the
// crossing hysteresis (a cycle over three median periods long), so the lowest of the collapse
// cannot be read; what follows must come back to five times the noise floor given to count as a
// restart, not to just above it (bursts of noise a circuit near its start threshold amplifies).
import { describe, expect, test } from "vitest";
import { collapses, RESTART } from "../../../packages/core/src/metrics/collapses.js";
import type { CycleTable } from "../../../packages/core/src/metrics/cycles.js";

const period = 1e-3;

/** Cycles of envelope `e` starting at the times `start` (one more than cycles). */
function table(e: readonly number[], start: readonly number[]): CycleTable {
  const envelope = Float64Array.from(e);
  return { count: e.length, start: Float64Array.from(start), envelope } as CycleTable;
}

/** Cycles one period apart, with a stop of `stopped` periods before cycle `at`. */
function withStop(e: readonly number[], at: number, stopped: number): CycleTable {
  const start: number[] = [0];
  for (let k = 0; k < e.length; k++) start.push(start[k]! + (k === at - 1 ? stopped : 1) * period);
  return table(e, start);
}

describe("collapses(cycles, floor) after a stop", () => {
  const floor = 1e-3;
  const grown = [0.01, 0.1, 1, 5];
  test("noise bursts above the floor but under five times it, after the stop, are no restart", () => {
    const bursts = [...grown, 0.5, 1.8e-3, 2.5e-3, 1.2e-3, 4.5e-3, 3e-3];
    expect(collapses(withStop(bursts, 5, 50), floor)).toHaveLength(0);
  });
  test("an oscillation that grows back past five times the floor is a restart, its lowest 0 (stopped)", () => {
    const back = [...grown, 0.5, 2e-3, 8e-3, 0.05, 0.5, 4];
    const found = collapses(withStop(back, 5, 50), floor);
    expect(found).toHaveLength(1);
    expect(found[0]!.low).toBe(0);
    expect(found[0]!.peak).toBe(5);
    expect(RESTART * floor).toBeLessThan(8e-3);
  });
  test("without a stop the restart is still five times the collapse's own lowest and above the floor", () => {
    const dip = [...grown, 0.5, 1e-4, 1.5e-3, 4];
    // 1.5e-3 is over five times 1e-4 and above the floor: the restart is there, not at 4
    const found = collapses(withStop(dip, 0, 1), floor);
    expect(found).toHaveLength(1);
    expect(found[0]!.low).toBe(1e-4);
    expect(found[0]!.duration).toBeCloseTo(2 * period, 12);
  });
});

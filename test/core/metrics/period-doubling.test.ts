// A swing that repeats every second cycle (past a flip of the amplitude loop, a Floquet multiplier
// through −1) never steadies from one cycle to the next: it is settled, period doubled, when each
// cycle repeats the one two before; a drift or a wander is not.
import { describe, expect, test } from "vitest";
import { alternatingSwing } from "../../../packages/core/src/metrics/period-doubling.js";
import { measureStartup } from "../../../packages/core/src/metrics/startup.js";
import { jitteredTimes, sampled } from "./signals.js";

const f = 2e3;
const t = jitteredTimes(0, 0.05, 1 / (100 * f), 7);
/** A unit sine whose cycles (from its rising zero crossings) have the peak `peak(k)` in cycle k. */
const swing = (peak: (k: number) => number) => sampled(t, (time) => peak(Math.floor(time * f)) * Math.sin(2 * Math.PI * f * time));

describe("a period-doubled swing", () => {
  test("peaks alternating 0.997 and 1.003 V (0.6 %, as past a flip of a JFET loop): settled, its two levels named, at the tone's frequency", () => {
    const m = measureStartup(t, swing((k) => (k % 2 === 0 ? 0.997 : 1.003)), { noiseFloor: 1e-6 });
    expect(m.verdict).toBe("settled");
    // The levels as drawn (the cubic through four samples reads a peak within 1e-4 of it, 100 samples a cycle).
    expect(m.periodDoubled!.low).toBeCloseTo(0.997, 4);
    expect(m.periodDoubled!.high).toBeCloseTo(1.003, 4);
    expect(m.frequency!).toBeCloseTo(f, 0);
    expect(m.amplitude!).toBeCloseTo(1, 3);
    expect(m.explanation).toMatch(/repeats every second cycle \(period doubled\): its peaks alternate between 997(\.\d)? mV and 1\.003 V/);
  });

  test("a steady swing is no period doubling, and one that also drifts 0.3 % a cycle has not settled", () => {
    expect(measureStartup(t, swing(() => 1), { noiseFloor: 1e-6 }).periodDoubled).toBeUndefined();
    const drifting = measureStartup(t, swing((k) => (k % 2 === 0 ? 0.99 : 1.01) * 1.003 ** k), { noiseFloor: 1e-6 });
    expect(drifting.verdict).not.toBe("settled");
    expect(drifting.periodDoubled).toBeUndefined();
  });

  test("alternatingSwing needs every change to turn and each cycle to repeat the one two before", () => {
    const table = (e: number[]) => ({ count: e.length, envelope: Float64Array.from(e), mean: new Float64Array(e.length) }) as Parameters<typeof alternatingSwing>[0];
    const alternate = Array.from({ length: 14 }, (_, k) => (k % 2 ? 1.01 : 0.99));
    expect(alternatingSwing(table(alternate), 10, 1e-3)).toEqual({ low: 0.99, high: 1.01 });
    // one change that does not turn
    expect(alternatingSwing(table([...alternate.slice(0, 13), 0.98]), 10, 1e-3)).toBeNull();
    // too few cycles for ten changes two apart
    expect(alternatingSwing(table(alternate.slice(0, 11)), 10, 1e-3)).toBeNull();
    // the per-cycle mean moving by more than the tolerance
    const moving = table(alternate);
    (moving.mean as Float64Array)[13] = 0.01;
    expect(alternatingSwing(moving, 10, 1e-3)).toBeNull();
  });
});

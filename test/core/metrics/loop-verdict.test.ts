// The amplitude loop's verdict on envelopes that collapse and restart: collapses that grow
// shallower one after the other are a stable loop's large bounce dying away (still settling),
// collapses that repeat as deep or deeper an unstable loop (bouncing).
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { collapses, collapsesDying, type Collapse } from "../../../packages/core/src/metrics/collapses.js";
import type { CycleTable } from "../../../packages/core/src/metrics/cycles.js";
import { DYING_KEEP, judgeLoop } from "../../../packages/core/src/metrics/loop-verdict.js";
import { measureStartup } from "../../../packages/core/src/metrics/startup.js";
import { resolveStartupOptions } from "../../../packages/core/src/metrics/startup-options.js";
import { judgeEnvelope } from "../../../packages/core/src/metrics/verdict.js";
import { jitteredTimes, sampled } from "./signals.js";

const period = 1e-3;

/** A cycle table of a sine whose per-cycle envelope is `e`, one cycle per millisecond. */
function table(e: readonly number[]): CycleTable {
  const n = e.length;
  const envelope = Float64Array.from(e);
  return {
    count: n,
    start: Float64Array.from({ length: n + 1 }, (_, k) => k * period),
    maximum: envelope,
    minimum: envelope.map((x) => -x),
    envelope,
    strength: envelope,
    mean: new Float64Array(n),
    midTime: Float64Array.from({ length: n }, (_, k) => (k + 0.5) * period),
  };
}

/** `cycles` values from `from` to `to` geometrically, `to` included, `from` not. */
function geometric(from: number, to: number, cycles: number): number[] {
  return Array.from({ length: cycles }, (_, k) => from * (to / from) ** ((k + 1) / cycles));
}

/**
 * An envelope about the level 1 that grows from 1e-3, then collapses and restarts once per depth:
 * collapse i swings over ln(peak/low) = depths[i], a share `above` of it above the level, falling
 * in 10 cycles and regrowing in 15 to the next peak; the record ends on the peak after the last
 * (as high as the one before it).
 */
function collapsing(depths: readonly number[], above: number): number[] {
  const peak = (d: number) => Math.exp(above * d);
  const low = (d: number) => Math.exp(-(1 - above) * d);
  const e = geometric(1e-3, peak(depths[0]!), 15);
  depths.forEach((d, i) => {
    e.push(...geometric(peak(d), low(d), 10));
    e.push(...geometric(low(d), peak(depths[i + 1] ?? d), 15));
  });
  return e;
}

const settings = resolveStartupOptions({});
const verdictOf = (e: readonly number[]) => {
  const cycles = table(e);
  return judgeLoop(cycles, judgeEnvelope(cycles, settings), settings).judgement;
};

describe("judgeLoop on collapsing envelopes", () => {
  // The law: a swing whose excursions about its level shrink geometrically dies away; one whose
  // excursions repeat or grow does not (mathematics of a geometric sequence; the threshold is
  // the sustained bounce's, 20 % lost over 3 bounces).
  test("collapses shrinking geometrically (each at most 0.9 of the one before) are unsettled, still settling; the same or growing ones bouncing", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 4 }),
        fc.double({ min: 0.5, max: 0.9, noNaN: true }),
        fc.double({ min: 2, max: 4, noNaN: true }),
        fc.double({ min: 0.2, max: 0.6, noNaN: true }),
        (count, ratio, last, above) => {
          const depths = Array.from({ length: count }, (_, i) => last * ratio ** (i - count + 1));
          const j = verdictOf(collapsing(depths, above));
          expect(j.verdict).toBe("unsettled");
          expect(j.reason).toMatchObject({ kind: "collapses-dying", count });
        },
      ),
    );
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 4 }),
        fc.double({ min: 1, max: 1.4, noNaN: true }),
        fc.double({ min: 2, max: 5, noNaN: true }),
        fc.double({ min: 0.2, max: 0.6, noNaN: true }),
        fc.array(fc.double({ min: -0.015, max: 0.015, noNaN: true }), { minLength: 4, maxLength: 4 }),
        (count, ratio, first, above, jitter) => {
          // a repeating collapse wanders by up to ±1.5 % in depth from one to the next
          const depths = Array.from({ length: count }, (_, i) => first * ratio ** i * (1 + jitter[i]!));
          const j = verdictOf(collapsing(depths, above));
          expect(j.verdict).toBe("bouncing");
          expect(j.reason).toEqual({ kind: "collapses", count });
        },
      ),
    );
  });

  test("the collapses read off such an envelope: each one's peak and lowest", () => {
    const series = collapses(table(collapsing([6, 3], 0.5)));
    expect(series.map((c) => [c.peak, c.low])).toEqual([
      [Math.exp(3), Math.exp(-3)],
      [Math.exp(1.5), Math.exp(-1.5)],
    ]);
  });
});

describe("collapsesDying(series, keep)", () => {
  const dip = (depth: number): Collapse => ({ peak: Math.exp(depth), low: 1, duration: 0.02, at: 0 });
  const stop = (duration: number): Collapse => ({ peak: 10, low: 0, duration, at: 0 });

  test("keep is what a sustained bounce keeps at most per bounce: 0.8 over 3 bounces (0.928)", () => {
    expect(DYING_KEEP).toBeCloseTo(0.8 ** (1 / 3), 12);
  });

  test("a dip after a stop is shallower; a stop after a dip deeper; two stops compare by their time down", () => {
    expect(collapsesDying([stop(0.03), dip(4), dip(2)], DYING_KEEP)).toBe(true);
    expect(collapsesDying([dip(4), stop(0.03)], DYING_KEEP)).toBe(false);
    expect(collapsesDying([stop(0.03), stop(0.02), dip(3)], DYING_KEEP)).toBe(true);
    expect(collapsesDying([stop(0.03), stop(0.03)], DYING_KEEP)).toBe(false);
  });

  test("counts from the deepest collapse: an earlier shallower one does not matter, an earlier as deep one does", () => {
    // 3, then 5, 2.5: the loop's first overshoot was the milder one; from the deepest on they shrink
    expect(collapsesDying([dip(3), dip(5), dip(2.5)], DYING_KEEP)).toBe(true);
    // 5, 3, 5, 2.5: the depth 5 came back, so the loop repeats itself
    expect(collapsesDying([dip(5), dip(3), dip(5), dip(2.5)], DYING_KEEP)).toBe(false);
    // a collapse losing under the factor is not shrinking: 4 → 3.8 keeps 0.95
    expect(collapsesDying([dip(4), dip(3.8)], DYING_KEEP)).toBe(false);
  });
});

describe("measureStartup on a sampled envelope whose collapses die away", () => {
  test("unsettled, and the explanation names the collapses' peaks and lows", () => {
    const f = 1000;
    const envelope = collapsing([6, 3.5, 2], 0.5);
    const at = (x: number) => envelope[Math.min(envelope.length - 1, Math.floor(x / period))]!;
    const t = jitteredTimes(0, envelope.length * period, period / 60, 81);
    const v = sampled(t, (x) => at(x) * Math.sin(2 * Math.PI * f * x));
    const m = measureStartup(t, v);
    expect(m.verdict).toBe("unsettled");
    // peaks e^3, e^1.75, e^1 and lows e^−3, e^−1.75, e^−1 (the depths 6, 3.5, 2 split evenly about 1)
    expect(m.explanation).toBe(
      "the amplitude loop is settling: the envelope collapsed and restarted 3 times, each collapse shallower than the one before " +
        "(peaks 20.09 V, 5.755 V, 2.718 V; lowest 49.79 mV, 173.8 mV, 367.9 mV); run longer",
    );
  });
});

// Whether the envelope's collapses repeat a cycle (an unstable loop squegging: its bursts come back
// as high and as far apart, or its excursions grow) or wander (a stable loop thrown about by its
// large-signal overshoots, which can land on its orbit after any of them). The law: a limit cycle
// of the envelope repeats its bursts' heights and spacings; the tolerance is the dying factor
// (20 % lost over 3 bounces, DYING_KEEP ≈ 0.928).
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { collapsesRepeat, type Collapse } from "../../../packages/core/src/metrics/collapses.js";
import { DYING_KEEP } from "../../../packages/core/src/metrics/loop-verdict.js";

/** A collapse from `peak` down to `low` (0: a stop), falling at `at` s and down for `duration` s. */
const collapse = (peak: number, low: number, at: number, duration = 5e-3): Collapse => ({ peak, low, at, duration });
/** Collapses falling every `spacing` s with these peaks and lows. */
const every = (spacing: number, peaks: readonly number[], lows: readonly number[]): Collapse[] => peaks.map((p, k) => collapse(p, lows[k]!, (k + 1) * spacing));

describe("collapsesRepeat(series, keep)", () => {
  test("collapses of the same height, depth and spacing repeat; so do heights and lows within ±3 %, falls within ±1 % of a spacing", () => {
    expect(collapsesRepeat(every(0.09, [13.4, 13.4, 13.4, 13.4], [0.12, 0.12, 0.12, 0.12]), DYING_KEEP)).toBe(true);
    fc.assert(
      fc.property(fc.array(fc.double({ min: -0.03, max: 0.03, noNaN: true }), { minLength: 12, maxLength: 12 }), (j) => {
        const series = [0, 1, 2, 3].map((k) => collapse(4 * (1 + j[k]!), 0.1 * (1 + j[k + 4]!), 0.05 * (k + 1 + j[k + 8]! / 3)));
        expect(collapsesRepeat(series, DYING_KEEP)).toBe(true);
      }),
    );
  });

  test("bursts alternating in height (4.19, 2.95, 4.49, 2.94 V), or spacings wandering by 20 %, do not repeat; nor do three alike", () => {
    expect(collapsesRepeat(every(0.05, [4.19, 2.95, 4.49, 2.94], [0.02, 0.02, 0.02, 0.02]), DYING_KEEP)).toBe(false);
    const wandering = [0.05, 0.1, 0.16, 0.21].map((at) => collapse(5.6, 0, at));
    expect(collapsesRepeat(wandering, DYING_KEEP)).toBe(false);
    // a chaotic run's three stops alike (10.2, 10.2, 10.0 V, 21.0 and 20.8 ms apart) before an 8.6 V one
    expect(collapsesRepeat([collapse(10.2, 0, 0.1008), collapse(10.2, 0, 0.1218), collapse(10.0, 0, 0.1426)], DYING_KEEP)).toBe(false);
  });

  test("excursions growing by more than 1/keep each time repeat (the loop runs away); two collapses never decide", () => {
    // depths ln(peak/low): 1.72, 2.22, 4.90 (each deeper than the one before by over 1/0.928)
    const growing = [collapse(4.13, 0.74, 0.013), collapse(4.42, 0.48, 0.025), collapse(4.62, 0.034, 0.038)];
    expect(collapsesRepeat(growing, DYING_KEEP)).toBe(true);
    expect(collapsesRepeat(growing.slice(0, 2), DYING_KEEP)).toBe(false);
    expect(collapsesRepeat(every(0.05, [5, 5], [0.1, 0.1]), DYING_KEEP)).toBe(false);
  });

  test("the last three decide: a wild first overshoot before a repeating cycle does not hide it", () => {
    const series = [collapse(89.7, 0, 0.04), ...every(0.32, [3.59, 3.74, 3.53, 3.52], [0, 0, 0, 0]).map((c) => ({ ...c, at: c.at + 0.45 }))];
    expect(collapsesRepeat(series, DYING_KEEP)).toBe(true);
  });
});

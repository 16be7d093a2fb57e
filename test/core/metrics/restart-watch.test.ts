// How long a start-up run (until=auto, or judging where a fixed until= ended) watches a record that grew and died away for a restart: eight times its
// growth, or three of the bias point's slowest decaying time constants past its peak, whichever
// is later; and the bias point's slowest decaying time constant itself.
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { RECOVERY, RESTART_WATCH, explainCutWatch, restartWatch, slowestTimeConstant } from "../../../packages/core/src/metrics/restart-watch.js";

const envelopeOf = (value: readonly number[], period = 1e-3) => ({
  time: Float64Array.from(value, (_, k) => (k + 0.5) * period),
  value: Float64Array.from(value),
});

describe("slowestTimeConstant(realParts)", () => {
  test("1/|Re p| of the decaying pole nearest the axis; growing and marginal poles are left out", () => {
    expect(slowestTimeConstant([312, 2e9, -5.29, -1005, -0.25, 0])).toBe(4);
  });
  test("0 when no pole decays", () => {
    expect(slowestTimeConstant([])).toBe(0);
    expect(slowestTimeConstant([10, 0])).toBe(0);
  });
  test("property: no decaying pole is slower than the time constant returned", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 12 }), (re) => {
        const tau = slowestTimeConstant(re);
        for (const r of re) if (r < 0) expect(1 / -r).toBeLessThanOrEqual(tau * (1 + 1e-12));
        if (re.every((r) => r >= 0)) expect(tau).toBe(0);
      }),
    );
  });
});

describe("restartWatch(envelope, timeConstant)", () => {
  test("a record that never grew twofold is not watched", () => {
    expect(restartWatch(envelopeOf([1, 1.5, 1.9, 1.2, 0.5, 0.1]), 10)).toBeNull();
    expect(restartWatch(envelopeOf([5, 4, 3, 2, 1]), 10)).toBeNull();
  });
  test("property: a record that grew is watched from its peak until the later of eight times the growth and three time constants past the peak", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 60 }),
        fc.integer({ min: 1, max: 60 }),
        fc.double({ min: 2.5, max: 1e6, noNaN: true }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        (rise, fall, gain, tau) => {
          // geometric growth from 1 to `gain`, then a geometric fall
          const value = [...Array.from({ length: rise + 1 }, (_, k) => gain ** (k / rise)), ...Array.from({ length: fall }, (_, k) => gain * 0.5 ** (k + 1))];
          const e = envelopeOf(value);
          const w = restartWatch(e, tau)!;
          expect(w.peakAt).toBe(e.time[rise]);
          expect(w.peak).toBe(value[rise]);
          expect(w.until).toBeGreaterThanOrEqual(RESTART_WATCH * w.peakAt);
          expect(w.until).toBeGreaterThanOrEqual(w.peakAt + RECOVERY * tau);
          expect(w.until === RESTART_WATCH * w.peakAt || w.until === w.peakAt + RECOVERY * tau).toBe(true);
        },
      ),
    );
  });
  test("the explanation of a watch cut short is no 'no oscillation' and says how to wait longer", () => {
    const w = restartWatch(envelopeOf([0.01, 0.1, 1, 5, 0.5, 0.01], 2e-3), 0.83)!;
    expect(explainCutWatch(w, 0.03, 0.83)).toBe(
      "the oscillation grew to 5 V peak at 7 ms and died away after it, but it may come back once the slow state its overshoot over-charged (an amplitude loop's filter) has bled back (the bias point's slowest time constant is 830 ms): it is watched until 2.497 s, the run stopped at 30 ms; raise settle-within= to wait longer",
    );
    expect(explainCutWatch(restartWatch(envelopeOf([0.01, 0.1, 1, 5, 0.5, 0.01], 2e-3), 0)!, 0.02, 0)).toBe(
      "the oscillation grew to 5 V peak at 7 ms and died away after it, but it may come back once the slow state its overshoot over-charged (an amplitude loop's filter) has bled back: it is watched until 56 ms, the run stopped at 20 ms; raise settle-within= to wait longer",
    );
    // a fixed until= cut the watch: the hint names it, and the peak is in the probe's unit
    expect(explainCutWatch(restartWatch(envelopeOf([0.01, 0.1, 1, 5, 0.5, 0.01], 2e-3), 0)!, 0.02, 0, "A", "until=")).toBe(
      "the oscillation grew to 5 A peak at 7 ms and died away after it, but it may come back once the slow state its overshoot over-charged (an amplitude loop's filter) has bled back: it is watched until 56 ms, the run stopped at 20 ms; raise until= to wait longer",
    );
  });
});

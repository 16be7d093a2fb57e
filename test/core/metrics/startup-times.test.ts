import { describe, expect, test } from "vitest";
import { measureStartup } from "../../../packages/core/src/metrics/startup.js";
import { jitteredTimes, sampled } from "./signals.js";

const f = 1000;
const period = 1 / f;
const omega = 2 * Math.PI * f;
const amplitude = 2;
const offset = -0.4;
const rate = (2 * Math.PI * f) / 20; // the envelope's logistic rate r, 1/s
const t0 = 0.03; // its midpoint, s

// Logistic envelope e(t) = A / (1 + e^{−r(t − t0)}): it reaches a fraction q of A at
// t0 + ln(q/(1 − q))/r (mathematics).
const envelope = (x: number): number => amplitude / (1 + Math.exp(-rate * (x - t0)));
const reaches = (q: number): number => t0 + Math.log(q / (1 - q)) / rate;
const signal = (x: number): number => offset + envelope(x) * Math.sin(omega * x + 0.7);

// First time |e(t)·sin(ωt + 0.7)| reaches `threshold`, straight from the formula: a fine scan,
// then bisection.
function firstReach(threshold: number, end: number): number {
  const g = (x: number): number => Math.abs(signal(x) - offset) - threshold;
  const step = period / 2000;
  let x = 0;
  while (g(x + step) < 0 && x < end) x += step;
  let lo = x;
  let hi = x + step;
  for (let i = 0; i < 60; i++) {
    const mid = 0.5 * (lo + hi);
    if (g(mid) < 0) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

describe("measureStartup startupTime and settlingTime on a logistic envelope", () => {
  const end = 0.1;
  // 36 to 500 samples per period as the step sweeps.
  const t = jitteredTimes(0, end, period / 150, 41, { sweep: true, jitter: 0.3 });
  const metrics = measureStartup(t, sampled(t, signal));

  test("the record settles at the logistic's limit A", () => {
    expect(metrics.verdict).toBe("settled");
    expect(metrics.amplitude).toBeCloseTo(amplitude, 4);
    expect(metrics.offset).toBeCloseTo(offset, 6);
  });

  test("startupTime is the first moment |v − offset| reaches 0.9·amplitude, between t90 and t90 + P/2", () => {
    const t90 = reaches(0.9);
    expect(metrics.startupTime!).toBeGreaterThanOrEqual(t90);
    expect(metrics.startupTime!).toBeLessThanOrEqual(t90 + period / 2);
    expect(Math.abs(metrics.startupTime! - firstReach(0.9 * metrics.amplitude!, end))).toBeLessThan(1e-4 * period);
  });

  // The per-cycle envelope samples e(t) at cycle mid-times, with an O((rP)²) bias from the
  // envelope's curvature within a cycle, and is interpolated linearly between cycles; both
  // together stay well inside a tenth of a period at r·P = π/10.
  test("settlingTime is where the envelope enters ±1 % for good: t0 + ln 99 / r within P/10", () => {
    expect(Math.abs(metrics.settlingTime! - reaches(0.99))).toBeLessThan(period / 10);
  });

  test("the envelope for plots is one point per complete cycle at its mid-time", () => {
    expect(metrics.envelope.time.length).toBe(metrics.cycles);
    expect(metrics.envelope.value.length).toBe(metrics.cycles);
    const k = metrics.cycles - 1;
    expect(metrics.envelope.value[k]).toBeCloseTo(amplitude, 4);
    // 100 periods, less the first 8 whose swing stays inside the default hysteresis band
    // (1e-3 of the 2 V half swing, reached at t0 − ln(999)/r ≈ 8 ms), less the partial last one.
    expect(metrics.cycles).toBe(91);
  });
});

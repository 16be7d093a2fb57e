import { describe, expect, test } from "vitest";
import { measureStartup } from "../../../packages/core/src/metrics/startup.js";
import { jitteredTimes, sampled } from "./signals.js";

const f = 500;
const period = 1 / f;
const omega = 2 * Math.PI * f;

describe("measureStartup on waveforms that cross their mean several times per period", () => {
  // 0.3·sin θ + sin 3θ rises through 0 three times per period (its third harmonic dominates),
  // yet its period is 1/f and its THD_F is 1/0.3 (mathematics).
  test("a dominant third harmonic: one cycle per period, frequency f, THD 3.33", () => {
    const t = jitteredTimes(0, 40 * period, period / 150, 81);
    const metrics = measureStartup(t, sampled(t, (x) => 0.3 * Math.sin(omega * x) + Math.sin(3 * omega * x + 0.4)));
    expect(metrics.verdict).toBe("settled");
    expect(Math.abs(metrics.frequency! / f - 1)).toBeLessThan(1e-6);
    // The third harmonic has only 50 samples per its period: the cubic's 0.015·(ωh)⁴ shrink.
    expect(Math.abs(metrics.thd! * 0.3 - 1)).toBeLessThan(1e-4);
    expect(metrics.harmonics[0].amplitude).toBeCloseTo(0.3, 6);
    expect(metrics.cycles).toBe(39);
  });

  // The shape of the harmonic-rich tail sets the grouping; the near-sinusoidal start-up before
  // it keeps one crossing per period, so every period of the record is one cycle.
  test("a start-up whose harmonics appear only as it saturates: every period is one cycle", () => {
    const sigma = 250;
    const envelope = (x: number): number => Math.tanh(1e-3 * Math.exp(sigma * x));
    const t = jitteredTimes(0, 80 * period, period / 150, 82);
    const v = sampled(t, (x) => {
      const e = envelope(x);
      return e * (Math.sin(omega * x) + 3 * e ** 4 * Math.sin(3 * omega * x));
    });
    const metrics = measureStartup(t, v);
    expect(metrics.verdict).toBe("settled");
    expect(Math.abs(metrics.frequency! / f - 1)).toBeLessThan(1e-6);
    // Periods with a swing above the default 1e-3 hysteresis band start near period 2.
    expect(metrics.cycles).toBeGreaterThanOrEqual(76);
    expect(metrics.cycles).toBeLessThanOrEqual(79);
    const lengths = Array.from({ length: metrics.cycles - 1 }, (_, k) => metrics.envelope.time[k + 1] - metrics.envelope.time[k]);
    expect(Math.max(...lengths)).toBeLessThan(1.5 * period);
    expect(Math.min(...lengths)).toBeGreaterThan(0.5 * period);
    expect(Math.abs(metrics.growthRate! / sigma - 1)).toBeLessThan(0.02);
  });
});

import { describe, expect, test } from "vitest";
import { centreLevel } from "../../../packages/core/src/metrics/centre-level.js";
import { findRisingCrossings } from "../../../packages/core/src/metrics/crossings.js";
import { cyclesBetween } from "../../../packages/core/src/metrics/cycles.js";
import { firstExcursion } from "../../../packages/core/src/metrics/excursion.js";
import { jitteredTimes, sampled } from "./signals.js";

const f = 1000;
const period = 1 / f;
const omega = 2 * Math.PI * f;
const cyclesOf = (t: Float64Array, v: Float64Array, level = 0, hysteresis = 1e-3) =>
  cyclesBetween(t, v, findRisingCrossings(t, v, level, hysteresis));

describe("cyclesBetween: per-cycle extremes on the local cubic", () => {
  test("cycle k of (1 + 0.1k)·sin ωt peaks at ±(1 + 0.1k), within the cubic's (ωh)⁴ error", () => {
    // Starts below the band, so the detector is armed for the crossing at 0.
    const t = jitteredTimes(-0.3 * period, 8.2 * period, period / 60, 71);
    // The amplitude steps at the zero crossings, so each whole cycle is a pure sine.
    const v = sampled(t, (x) => (1 + 0.1 * Math.floor(x / period)) * Math.sin(omega * x));
    const cycles = cyclesOf(t, v);
    expect(cycles.count).toBe(8);
    for (let k = 0; k < cycles.count; k++) {
      const a = 1 + 0.1 * k;
      // Each crossing sits on a slope kink where the amplitude steps, so it is only close.
      expect(Math.abs(cycles.start[k] - k * period)).toBeLessThan(1e-3 * period);
      expect(Math.abs(cycles.maximum[k] / a - 1)).toBeLessThan(2e-5);
      expect(Math.abs(cycles.minimum[k] / -a - 1)).toBeLessThan(2e-5);
      expect(cycles.envelope[k]).toBeCloseTo(0.5 * (cycles.maximum[k] - cycles.minimum[k]), 15);
      expect(cycles.midTime[k]).toBeCloseTo(0.5 * (cycles.start[k] + cycles.start[k + 1]), 15);
    }
  });

  test("a peak exactly between two equal samples is refined (a cap), not read off a sample", () => {
    // 60 uniform samples per period, phase chosen so samples straddle each peak symmetrically.
    const h = period / 60;
    const t = Float64Array.from({ length: 60 * 6 }, (_, i) => (i + 0.5) * h);
    const v = sampled(t, (x) => Math.sin(omega * x));
    const cycles = cyclesOf(t, v);
    // The top samples are cos(π/60) = 0.99863 (mathematics); the cubic recovers 1 to (ωh)⁴.
    for (let k = 0; k < cycles.count; k++) expect(Math.abs(cycles.maximum[k] - 1)).toBeLessThan(2e-5);
  });

  test("a clipped plateau reads exactly the clip level, whatever the samples' phase", () => {
    const t = jitteredTimes(0, 12 * period, period / 50, 72);
    const v = sampled(t, (x) => Math.max(-0.8, Math.min(0.8, Math.sin(omega * x))));
    const cycles = cyclesOf(t, v);
    // Crossings at P … 11P (the one at 0 finds the detector not yet armed).
    expect(cycles.count).toBe(10);
    for (let k = 0; k < cycles.count; k++) {
      expect(cycles.maximum[k]).toBe(0.8);
      expect(cycles.minimum[k]).toBe(-0.8);
    }
  });
});

describe("centreLevel", () => {
  // Mathematics: with weight 1/E(t) = e^{−σt}/E₀ the growing part E₀e^{σt}·s(t) integrates to
  // E₀·∫s = 0 over whole periods, leaving the centre c; the plain mean would be off by ~σ/ω·E.
  test.each([
    [300, 0.25],
    [-200, -1.5],
    [0, 0.75],
  ])("c + e^{σt}·(sin ωt + 0.2·sin 3ωt) with σ = %f 1/s swings about c = %f", (sigma, c) => {
    const t = jitteredTimes(0, 20 * period, period / 80, 73);
    const v = sampled(t, (x) => c + 0.1 * Math.exp(sigma * x) * (Math.sin(omega * x) + 0.2 * Math.sin(3 * omega * x)));
    const cycles = cyclesOf(t, v, c, 1e-4);
    const level = centreLevel(t, v, cycles, 10);
    const scale = 0.1 * Math.exp(sigma * 20 * period);
    expect(Math.abs(level - c) / Math.max(scale, 0.1)).toBeLessThan(1e-6);
  });
});

describe("firstExcursion", () => {
  test("finds a threshold crossed only between samples, on the cubic's peak (asin, mathematics)", () => {
    // Peaks fall midway between samples at 0.99863; 0.9995 is exceeded only by the interpolant.
    const h = period / 60;
    const t = Float64Array.from({ length: 240 }, (_, i) => (i + 0.5) * h);
    const v = sampled(t, (x) => Math.sin(omega * x));
    expect(Math.max(...v)).toBeLessThan(0.9995);
    const time = firstExcursion(t, v, 0, 0.9995)!;
    expect(time).toBeCloseTo(Math.asin(0.9995) / omega, 7);
  });

  test("measures |v − centre| on both sides and returns null when the threshold is never reached", () => {
    const t = jitteredTimes(0, 3 * period, period / 60, 74);
    const v = sampled(t, (x) => 0.2 - Math.sin(omega * x));
    expect(firstExcursion(t, v, 0.2, 0.5)!).toBeCloseTo(Math.asin(0.5) / omega, 8);
    expect(firstExcursion(t, v, 0.2, 1.5)).toBeNull();
  });
});

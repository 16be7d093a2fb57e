import { describe, expect, test } from "vitest";
import { harmonicAnalysis } from "../../../packages/core/src/metrics/harmonic-analysis.js";
import { jitteredTimes, sampled } from "./signals.js";

const f = 2000;
const period = 1 / f;
// Non-uniform sampling: independent ±40 % jitter on each step.
const times = (samplesPerPeriod: number, seed: number): Float64Array =>
  jitteredTimes(0, 12 * period, period / samplesPerPeriod, seed, { jitter: 0.4 });
const theta = (x: number): number => 2 * Math.PI * f * x;
// Whole cycles taken from an arbitrary phase, so the window does not start on a sample.
const from = 2.37 * period;
const cycles = 5;

// THD_F up to harmonic H from peak amplitudes b_n (n = 1 … H; mathematics).
function truncatedThd(b: (n: number) => number, maxOrder: number): number {
  let sum = 0;
  for (let n = 2; n <= maxOrder; n++) sum += b(n) ** 2;
  return Math.sqrt(sum) / Math.abs(b(1));
}

describe("harmonicAnalysis on jittered samples against Fourier coefficients (docs/references.md §4 [math])", () => {
  test("triangle, 8/(π²n²) for odd n: THD up to H = 10 and up to H = 40 (table 0.121142)", () => {
    const t = times(1000, 21);
    const v = sampled(t, (x) => (2 / Math.PI) * Math.asin(Math.sin(theta(x))));
    const b = (n: number): number => (n % 2 === 1 ? 8 / (Math.PI * Math.PI * n * n) : 0);
    const ten = harmonicAnalysis(t, v, from, cycles, f, 10);
    expect(ten.thd).toBeCloseTo(truncatedThd(b, 10), 5);
    expect(ten.harmonics[0].amplitude).toBeCloseTo(b(1), 6);
    expect(ten.harmonics[2].dBc).toBeCloseTo(20 * Math.log10(1 / 9), 3);
    // The full-series value is √(π⁴/96 − 1) = 0.121153; H = 10 is visibly short of it.
    expect(Math.sqrt(Math.PI ** 4 / 96 - 1) - ten.thd).toBeGreaterThan(4e-5);
    const forty = harmonicAnalysis(t, v, from, cycles, f, 40);
    expect(forty.thd).toBeCloseTo(0.121142, 5);
  });

  // b1 = (2/π)(θc + c·cos θc); b_n = (4/π)[sin((n−1)θc)/(2(n−1)) − sin((n+1)θc)/(2(n+1)) + c·cos(nθc)/n]
  // for odd n ≥ 3, θc = asin c; even harmonics vanish by symmetry.
  test.each([
    [0.9, 0.032863, 0.022873, 0.042199],
    [0.7, 0.133276, 0.024523, 0.137588],
    [0.5, 0.226326, 0.045265, 0.232938],
  ])("hard-clipped sine at c = %f: b3/b1 = %f, b5/b1 = %f, THD_F to H = 10 and to H = 60 near %f", (c, b3, b5, thdAll) => {
    const thetaC = Math.asin(c);
    const b = (n: number): number => {
      if (n === 1) return (2 / Math.PI) * (thetaC + c * Math.cos(thetaC));
      if (n % 2 === 0) return 0;
      return (
        (4 / Math.PI) *
        (Math.sin((n - 1) * thetaC) / (2 * (n - 1)) - Math.sin((n + 1) * thetaC) / (2 * (n + 1)) + (c * Math.cos(n * thetaC)) / n)
      );
    };
    const t = times(1000, 22);
    const v = sampled(t, (x) => Math.min(c, Math.max(-c, Math.sin(theta(x)))));
    const ten = harmonicAnalysis(t, v, from, cycles, f);
    expect(ten.thd).toBeCloseTo(truncatedThd(b, 10), 5);
    expect(ten.harmonics[0].amplitude).toBeCloseTo(b(1), 6);
    expect(ten.harmonics[2].amplitude / ten.harmonics[0].amplitude).toBeCloseTo(b3, 5);
    expect(ten.harmonics[4].amplitude / ten.harmonics[0].amplitude).toBeCloseTo(b5, 5);
    expect(ten.harmonics[1].amplitude).toBeLessThan(1e-6);
    const sixty = harmonicAnalysis(t, v, from, cycles, f, 60);
    expect(sixty.thd).toBeCloseTo(truncatedThd(b, 60), 5);
    // The tail beyond 60 is under 1e-4 of b1 for these clip levels.
    expect(Math.abs(sixty.thd - thdAll)).toBeLessThan(1e-4);
  });

  // A jump cannot be sampled exactly: the local cubic rings for a step or two either side of it,
  // so the error scales with the step over the period, not with its fourth power. A simulated
  // waveform is continuous; this check only bounds how far a near-discontinuity strays.
  test("square wave (a discontinuity): THD up to H = 10 within 0.5 % of the Fourier value 0.4288", () => {
    const t = times(2000, 23);
    const v = sampled(t, (x) => (Math.sin(theta(x)) >= 0 ? 1 : -1));
    const b = (n: number): number => (n % 2 === 1 ? 4 / (Math.PI * n) : 0);
    const expected = truncatedThd(b, 10);
    expect(expected).toBeCloseTo(0.42875, 4);
    expect(Math.abs(harmonicAnalysis(t, v, from, cycles, f).thd / expected - 1)).toBeLessThan(5e-3);
  });

  test("offset and r.m.s. over whole cycles: 0.3 + sin gives 0.3 and √(0.09 + 0.5) (mathematics)", () => {
    const t = times(100, 24);
    const analysis = harmonicAnalysis(t, sampled(t, (x) => 0.3 + Math.sin(theta(x))), from, cycles, f);
    expect(analysis.offset).toBeCloseTo(0.3, 7);
    // The r.m.s. carries the cubic's small amplitude shrink, 0.015·(ωh)⁴ (see sine-fit.test.ts).
    expect(analysis.rms).toBeCloseTo(Math.sqrt(0.59), 6);
    expect(analysis.harmonics.map((h) => h.order)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
    expect(analysis.harmonics[3].frequency).toBeCloseTo(4 * f, 9);
    expect(Math.log2(analysis.sampleCount) % 1).toBe(0);
  });

  test("rejects a span outside the record, naming it", () => {
    const t = Float64Array.from([0, 1, 2, 3, 4]);
    expect(() => harmonicAnalysis(t, new Float64Array(5), 1, 4, 1)).toThrow(
      "harmonicAnalysis: 4 cycles of 1 Hz from 1 s end at 5 s, outside the record [0, 4] s",
    );
    expect(() => harmonicAnalysis(t, new Float64Array(5), 0, 2, 0)).toThrow(
      "harmonicAnalysis: fundamental must be a positive frequency in Hz (got 0)",
    );
  });
});

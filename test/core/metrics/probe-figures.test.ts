import fc from "fast-check";
import { describe, expect, test } from "vitest";
import "../../support/fast-check-seed.js";
import { probeFigures } from "../../../packages/core/src/metrics/probe-figures.js";
import { judgeStartup } from "../../../packages/core/src/metrics/startup.js";
import { jitteredTimes, sampled } from "./signals.js";

const f = 1000;
const omega = 2 * Math.PI * f;
/** A sine with 1 % of third harmonic that grows from a small start and settles at `amplitude` about `offset` (a logistic envelope). */
const settling = (amplitude: number, offset: number) => (x: number) => offset + (amplitude / (1 + Math.exp(-300 * (x - 0.02)))) * (Math.sin(omega * x + 0.3) + 0.01 * Math.sin(3 * omega * x));

const close = (a: number | null, b: number | null, relative: number) => {
  expect(a).not.toBeNull();
  expect(Math.abs(a! - b!)).toBeLessThanOrEqual(relative * Math.max(Math.abs(b!), 1e-12));
};

describe("probeFigures(t, v, judgement): a probe's figures over the cycles another waveform was judged on", () => {
  const t = jitteredTimes(0, 0.08, 1 / f / 120, 7, { jitter: 0.3 });

  test("the judged waveform itself gives measureStartup's own figures, bit for bit", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.1, max: 10, noNaN: true }), fc.double({ min: -3, max: 3, noNaN: true }), (amplitude, offset) => {
        const v = sampled(t, settling(amplitude, offset));
        const judged = judgeStartup(t, v, { maxOrder: 30 });
        expect(judged.metrics.verdict).toBe("settled");
        const { figures } = probeFigures(t, v, judged, 30);
        const m = judged.metrics;
        expect(figures).toEqual({ amplitude: m.amplitude, peakToPeak: m.peakToPeak, rms: m.rms, offset: m.offset, thd: m.thd, thdPlusNoise: m.thdPlusNoise, harmonics: m.harmonics });
      }),
      { numRuns: 20 },
    );
  });

  test("a probe a·v + b of the judged waveform v (a > 0) swings a times as much about a·offset + b, with the same THD", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-3, max: 1e3, noNaN: true }), fc.double({ min: -10, max: 10, noNaN: true }), (a, b) => {
        const v = sampled(t, settling(2, 0.1));
        const judged = judgeStartup(t, v);
        const { figures } = probeFigures(t, v.map((x) => a * x + b), judged, 30);
        const m = judged.metrics;
        close(figures.amplitude, a * m.amplitude!, 1e-9);
        close(figures.peakToPeak, a * m.peakToPeak!, 1e-9);
        close(figures.offset, a * m.offset! + b, 1e-9);
        close(figures.thd, m.thd, 1e-6);
      }),
      { numRuns: 20 },
    );
  });

  test("a probe that swings at twice the frequency (c·sin²ωt, a filament's temperature) is measured over whole periods of the judged one", () => {
    const c = 0.4;
    const v = sampled(t, settling(2, 0));
    const judged = judgeStartup(t, v);
    // sin²ωt = (1 − cos 2ωt)/2: a swing of c/2 peak about c/2, all of it at 2f (trigonometry).
    const { figures } = probeFigures(t, sampled(t, (x) => 300 + c * Math.sin(omega * x + 0.3) ** 2), judged, 30);
    // The extremes come from local cubics through samples about 60 per period of the 2f swing.
    close(figures.amplitude, c / 2, 1e-4);
    close(figures.offset, 300 + c / 2, 1e-8);
    expect(figures.harmonics[0]!.frequency).toBeCloseTo(judged.metrics.frequency!, 9);
    expect(figures.harmonics[1]!.amplitude).toBeCloseTo(c / 2, 5);
    expect(figures.harmonics[0]!.amplitude).toBeLessThan(1e-6 * c);
  });

  test("a silent judgement gives the probe's last half: its mean, r.m.s. and peak-to-peak, no amplitude", () => {
    const quiet = judgeStartup(t, sampled(t, () => 1));
    expect(quiet.metrics.verdict).toBe("silent");
    const { figures } = probeFigures(t, sampled(t, () => 5), quiet, 30);
    expect(figures).toMatchObject({ amplitude: null, peakToPeak: 0, thd: null, thdPlusNoise: null, harmonics: [] });
    expect(figures.offset).toBeCloseTo(5, 12);
    expect(figures.rms).toBeCloseTo(5, 12);
  });
});

// A record whose oscillation grew far above the noise and died within too few cycles to measure
// is not silent (acceptance pass 7: a JFET-held Wien over-corrected by its detector reached 13 V
// and died within 3 ms, and was called "silent: only 1 complete cycle").
import { describe, expect, test } from "vitest";
import { measureStartup } from "@onset/core";
import { diedBurst } from "../../../packages/core/src/metrics/died-burst.js";
import { lastHalfStatistics } from "../../../packages/core/src/metrics/record-statistics.js";
import { recordWatch, RECOVERY, RESTART_WATCH } from "../../../packages/core/src/metrics/restart-watch.js";

const f = 1e3;
const sampled = (until: number, wave: (t: number) => number) => {
  const n = Math.round(until * f * 200);
  const t = new Float64Array(n + 1);
  const v = new Float64Array(n + 1);
  for (let i = 0; i <= n; i++) {
    t[i] = (i * until) / n;
    v[i] = wave(t[i]!);
  }
  return { t, v };
};
// Two cycles of a 1 kHz sine, 8 V dying with τ = 1 ms, from 2 ms on a 0.2 V level, then the level alone.
const burst = (t: number) => 0.2 + (t >= 2e-3 && t < 4e-3 ? 8 * Math.exp(-(t - 2e-3) / 1e-3) * Math.sin(2 * Math.PI * f * (t - 2e-3)) : 0);
// Mathematics: d/dx(e^(−x/τ)·sin ωx) = 0 at tan ωx = ωτ, so the peak is at x = atan(2π)/(2π·1 kHz) after 2 ms.
const peakAfter = Math.atan(2 * Math.PI) / (2 * Math.PI * f);
const peak = 8 * Math.exp(-peakAfter / 1e-3) * Math.sin(Math.atan(2 * Math.PI));

describe("diedBurst", () => {
  test("two dying cycles on a quiet level: a burst at its first crest", () => {
    const { t, v } = sampled(60e-3, burst);
    const b = diedBurst(t, v, lastHalfStatistics(t, v), 1e-4, 0)!;
    // sampled 200 points per cycle: within (π/200)²/2 of the crest, 2 µs of its time
    expect(Math.abs(b.peak / peak - 1)).toBeLessThan(2e-4);
    expect(Math.abs(b.peakAt - (2e-3 + peakAfter))).toBeLessThan(5e-6);
  });
  test("a step that settles without swinging back, or a swing within 10× the noise floor: none", () => {
    const step = sampled(60e-3, (t) => 3.3 * (1 - Math.exp(-t / 1e-3)));
    expect(diedBurst(step.t, step.v, lastHalfStatistics(step.t, step.v), 1e-4, 0)).toBeNull();
    const small = sampled(60e-3, (t) => (t < 4e-3 ? 5e-4 * Math.sin(2 * Math.PI * f * t) : 0));
    expect(diedBurst(small.t, small.v, lastHalfStatistics(small.t, small.v), 1e-4, 0)).toBeNull();
  });
});

describe("measureStartup of a burst that died", () => {
  test("is decaying, not silent, and is watched for a restart from its peak", () => {
    const { t, v } = sampled(60e-3, burst);
    const m = measureStartup(t, v, { noiseFloor: 1e-4 });
    expect(m.verdict).toBe("decaying");
    expect(m.explanation).toContain("grew to 6.3");
    const watch = recordWatch(m, 10)!;
    // The watch of restart-watch.ts: the later of RESTART_WATCH × the time to peak and RECOVERY time constants past it.
    expect(watch.until).toBeCloseTo(Math.max(RESTART_WATCH * m.burst!.peakAt, m.burst!.peakAt + RECOVERY * 10), 9);
    expect(recordWatch(m, 0)!.until).toBeCloseTo(RESTART_WATCH * m.burst!.peakAt, 12);
  });
  test("a quiet record is still silent", () => {
    const { t, v } = sampled(60e-3, () => 0.2);
    expect(measureStartup(t, v, { noiseFloor: 1e-4 }).verdict).toBe("silent");
  });
});

import { describe, expect, test } from "vitest";
import { measureStartup } from "../../../packages/core/src/metrics/startup.js";
import { jitteredTimes, sampled } from "./signals.js";

const f = 1500;
const omega = 2 * Math.PI * f;

describe("measureStartup growthRate", () => {
  // The small-signal envelope of A·tanh(ε·e^{σt}) is A·ε·e^{σt} (tanh x ≈ x, mathematics), so
  // the fitted σ must match; saturation bends ln E by −x²/3, about 0.2 % of slope at the 30 %
  // ceiling of the fit window.
  test.each([
    [400, 1e-5, 0],
    [150, 1e-4, 0],
    [900, 1e-6, 3e-6],
  ])("tanh-limited e^{σt}·sin ωt with σ = %f 1/s (ε = %f, noise floor %f V): within 1 %", (sigma, epsilon, noiseFloor) => {
    const amplitude = 3;
    const end = Math.log(1 / epsilon) / sigma + 40 / f;
    // 32 to 320 samples per period as the step sweeps 10×.
    const t = jitteredTimes(0, end, 1 / (f * 150), 31, { sweep: true });
    const v = sampled(t, (x) => 0.05 + amplitude * Math.tanh(epsilon * Math.exp(sigma * x)) * Math.sin(omega * x + 0.3));
    const metrics = measureStartup(t, v, { noiseFloor });
    expect(metrics.verdict).toBe("settled");
    expect(Math.abs(metrics.growthRate! / sigma - 1)).toBeLessThan(0.01);
  });

  // Below the clip the envelope is exactly ε·e^{σt}, and whole cycles of e^{σt}·sin ωt between
  // zero crossings scale by exactly e^{σ/f} (mathematics), so the fit is exact up to interpolation.
  test("hard-clipped exponential growth (steady clipped sine at the end): σ within 0.1 %, envelope = clip level", () => {
    const sigma = 500;
    const t = jitteredTimes(0, 0.05, 1 / (f * 60), 32);
    const v = sampled(t, (x) => Math.max(-2, Math.min(2, Math.min(2.5, 1e-4 * Math.exp(sigma * x)) * Math.sin(omega * x))));
    const metrics = measureStartup(t, v);
    expect(metrics.verdict).toBe("settled");
    expect(Math.abs(metrics.growthRate! / sigma - 1)).toBeLessThan(1e-3);
    expect(metrics.amplitude).toBe(2);
    expect(metrics.peakToPeak).toBe(4);
  });

  test("a record that starts settled has no growth phase: growthRate is null", () => {
    const t = jitteredTimes(0, 30 / f, 1 / (f * 60), 33);
    const metrics = measureStartup(t, sampled(t, (x) => Math.sin(omega * x)));
    expect(metrics.verdict).toBe("settled");
    expect(metrics.growthRate).toBeNull();
  });
});

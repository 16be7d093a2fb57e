import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { cornerIntegralBounds, orbitFigures, type PeriodicOrbit } from "@onset/core/engine";
import { jitteredOrbit } from "../../support/jittered-orbit.js";

const T = 1e-3;
const A = 10;

const orbitOf = (wave: (t: number) => number, N: number, jitter: number[]) => jitteredOrbit(wave, T, N, jitter);
const read = (x: Float64Array) => x[0]!;

/** A·sin(ωt + φ) clipped at ±L. */
const clipped = (L: number, phase: number) => (t: number) => Math.max(-L, Math.min(L, A * Math.sin((2 * Math.PI * t) / T + phase)));

/**
 * Closed form of a sine of peak A clipped at ±L (α = asin(L/A)), by quarter-wave symmetry:
 * rms² = (2/π)·[A²(α/2 − sin 2α/4) + L²(π/2 − α)]; odd harmonic n's amplitude
 * bₙ = (4/π)·[A·∫₀^α sin x sin nx dx + L·∫_α^{π/2} sin nx dx]
 *    = (4/π)·[A·(sin((n−1)α)/(n−1) − sin((n+1)α)/(n+1))/2 + L·cos(nα)/n]  (n ≥ 3),
 * b₁ = (4/π)·[A·(α/2 − sin 2α/4) + L·cos α]; even harmonics vanish. THD_F over 2 … M.
 */
function clippedSineFigures(L: number, M: number): { rms: number; thd: number } {
  const alpha = Math.asin(L / A);
  const rms = Math.sqrt((2 / Math.PI) * (A * A * (alpha / 2 - Math.sin(2 * alpha) / 4) + L * L * (Math.PI / 2 - alpha)));
  const b1 = (4 / Math.PI) * (A * (alpha / 2 - Math.sin(2 * alpha) / 4) + L * Math.cos(alpha));
  let squares = 0;
  for (let n = 3; n <= M; n += 2) {
    const bn = (4 / Math.PI) * ((A * (Math.sin((n - 1) * alpha) / (n - 1) - Math.sin((n + 1) * alpha) / (n + 1))) / 2 + (L * Math.cos(n * alpha)) / n);
    squares += bn * bn;
  }
  return { rms, thd: Math.sqrt(squares) / b1 };
}

function boundsOf(orbit: PeriodicOrbit, M: number) {
  const { metrics, samples, uniform } = orbitFigures(orbit, read, M);
  return { metrics, bounds: cornerIntegralBounds(samples, uniform, metrics.rms, metrics.thd, metrics.harmonics) };
}

const grids = fc.record({
  N: fc.integer({ min: 100, max: 400 }),
  jitter: fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 1, maxLength: 7 }),
  phase: fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
  level: fc.double({ min: 0.5, max: 0.95, noNaN: true }),
});

describe("cornerIntegralBounds(samples, uniform, rms, thd, harmonics)", () => {
  test("a sine clipped hard, on any grid of 100 to 400 uneven steps and any phase: the bounds cover the r.m.s.'s and THD's difference from the closed form (the samples exact, so the local cubic's and the resampling's error are what is left)", () => {
    fc.assert(
      fc.property(grids, ({ N, jitter, phase, level }) => {
        const L = level * A;
        const { metrics, bounds } = boundsOf(orbitOf(clipped(L, phase), N, jitter), 30);
        const exact = clippedSineFigures(L, 30);
        expect(bounds.corners).toBeGreaterThan(0);
        expect(Math.abs(metrics.rms - exact.rms)).toBeLessThanOrEqual(bounds.rms);
        expect(Math.abs(metrics.thd - exact.thd)).toBeLessThanOrEqual(bounds.thd);
      }),
    );
  });

  test("a sine has no corners on any grid: its bounds are zero, so a smooth waveform keeps the two grids' bars", () => {
    fc.assert(
      fc.property(grids, ({ N, jitter, phase }) => {
        const { bounds } = boundsOf(orbitOf((t) => 0.3 + 2 * Math.sin((2 * Math.PI * t) / T + phase) + 0.1 * Math.sin((6 * Math.PI * t) / T), N, jitter), 30);
        expect(bounds).toEqual({ rms: 0, thd: 0, corners: 0 });
      }),
    );
  });

  test("the bounds shrink with the step's square: a clipped sine on 200 and on 400 even steps", () => {
    const coarse = boundsOf(orbitOf(clipped(8, 0.3), 200, [0]), 30).bounds;
    const fine = boundsOf(orbitOf(clipped(8, 0.3), 400, [0]), 30).bounds;
    expect(fine.rms / coarse.rms).toBeGreaterThan(0.15);
    expect(fine.rms / coarse.rms).toBeLessThan(0.35);
  });
});

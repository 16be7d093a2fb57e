import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { envelopeDynamics, fitWindow } from "../../../packages/core/src/metrics/envelope-dynamics.js";
import { envelopeFitAt, fitSecondOrder } from "../../../packages/core/src/metrics/envelope-fit.js";
import { randomStream } from "../../../packages/core/src/random/stream.js";

// The unit-step response of the standard second-order system ωn²/(s² + 2ζωn·s + ωn²) (Ogata,
// "Modern Control Engineering", 5th ed., §5-3): underdamped
//   c(t) = 1 − e^(−ζωn·t)·(cos ωd·t + ζ/√(1 − ζ²)·sin ωd·t),  ωd = ωn·√(1 − ζ²),
// overdamped (ζ > 1) with the two real poles s₁,₂ = −ωn·(ζ ∓ √(ζ² − 1))
//   c(t) = 1 + (s₂·e^(s₁t) − s₁·e^(s₂t))/(s₁ − s₂).
function stepResponse(zeta: number, wn: number, t: number): number {
  if (zeta < 1) {
    const wd = wn * Math.sqrt(1 - zeta * zeta);
    return 1 - Math.exp(-zeta * wn * t) * (Math.cos(wd * t) + (zeta / Math.sqrt(1 - zeta * zeta)) * Math.sin(wd * t));
  }
  const r = Math.sqrt(zeta * zeta - 1);
  const s1 = -wn * (zeta - r);
  const s2 = -wn * (zeta + r);
  return 1 + (s2 * Math.exp(s1 * t) - s1 * Math.exp(s2 * t)) / (s1 - s2);
}

/**
 * A per-cycle envelope that settles at `level` like the step response above, seen from the
 * moment it has risen to `start` of the level: sampled once per carrier cycle of `period`
 * (with ±`jitter` of a period on each mid-time, as a slightly wandering carrier gives), plus
 * uniform noise of ±`noise` relative.
 */
function envelope(o: { zeta: number; bounce: number; level: number; period: number; cycles: number; jitter?: number; noise?: number; seed?: number }) {
  // `bounce` is the damped frequency when ζ < 1, the natural one otherwise.
  const wn = (2 * Math.PI * o.bounce) / (o.zeta < 1 ? Math.sqrt(1 - o.zeta ** 2) : 1);
  const random = randomStream(o.seed ?? 1);
  const time = new Float64Array(o.cycles);
  const value = new Float64Array(o.cycles);
  for (let k = 0; k < o.cycles; k++) {
    time[k] = (k + 0.5 + (o.jitter ?? 0) * (2 * random.uniform() - 1)) * o.period;
    value[k] = o.level * (stepResponse(o.zeta, wn, time[k]) + (o.noise ?? 0) * (2 * random.uniform() - 1));
  }
  return { time, value, wn };
}

describe("fitSecondOrder(t, e, from, to) on second-order step responses (Ogata §5-3)", () => {
  test.each([
    [0.05, 2],
    [0.1, 3],
    [0.3, 0.5],
    [0.5, 1],
    [0.7, 2],
    [0.95, 2],
  ])("ζ = %f, bounce %f Hz: damped frequency and damping ratio within 1e-4 relative", (zeta, bounce) => {
    const { time, value } = envelope({ zeta, bounce, level: 2, period: 1e-3 * (1 + zeta), cycles: 3000 });
    const [from, to] = fitWindow(value, 2);
    const { bounce: fit } = fitSecondOrder(time, value, from, to);
    if (fit.kind !== "bounce") throw new Error("not a bounce");
    const ratio = fit.decayRate / Math.hypot(fit.decayRate, fit.angularFrequency);
    expect(Math.abs(fit.angularFrequency / (2 * Math.PI * bounce) - 1)).toBeLessThan(1e-4);
    expect(Math.abs(ratio / zeta - 1)).toBeLessThan(1e-4);
    expect(Math.abs(fit.level / 2 - 1)).toBeLessThan(1e-6);
    // The model reproduces the samples it was fitted to.
    expect(Math.abs(envelopeFitAt(fit, time[from + 50]) - value[from + 50])).toBeLessThan(1e-5);
  });

  test("overdamped (ζ = 1.5): the creep fit finds the slow pole ωn·(ζ − √(ζ² − 1)) and explains the record", () => {
    const zeta = 1.5;
    const { time, value, wn } = envelope({ zeta, bounce: 2, level: 1, period: 2e-3, cycles: 2000 });
    const { creep } = fitSecondOrder(time, value, 20, time.length);
    if (creep.kind !== "creep") throw new Error("not a creep");
    expect(creep.unexplained).toBeLessThan(1e-8);
    expect(Math.abs(creep.rates[0] / (wn * (zeta - Math.sqrt(zeta * zeta - 1))) - 1)).toBeLessThan(1e-3);
  });

  test("property: any underdamped bounce sampled with a jittered carrier and 1e-5 noise is found within 1 % (frequency) and 0.02 (ζ)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.03, max: 0.8, noNaN: true }),
        fc.double({ min: 20, max: 200, noNaN: true }),
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        fc.integer({ min: 1, max: 1000 }),
        (zeta, cyclesPerBounce, level, seed) => {
          const period = 1e-3;
          const bounce = 1 / (cyclesPerBounce * period);
          // Long enough for the bounce to die to 1e-6 of its first overshoot, or 20 bounces.
          const cycles = Math.min(4000, Math.ceil(Math.max(2 * cyclesPerBounce, Math.min(20 * cyclesPerBounce, 14 / (zeta * 2 * Math.PI * bounce * period)))));
          const { time, value } = envelope({ zeta, bounce, level, period, cycles, jitter: 0.02, noise: 1e-5, seed });
          const [from, to] = fitWindow(value, level);
          const { bounce: fit } = fitSecondOrder(time, value, from, to);
          if (fit.kind !== "bounce") return false;
          const ratio = fit.decayRate / Math.hypot(fit.decayRate, fit.angularFrequency);
          return Math.abs(fit.angularFrequency / (2 * Math.PI * bounce) - 1) < 0.01 && Math.abs(ratio - zeta) < 0.02;
        },
      ),
      { numRuns: 25 },
    );
  });
});

describe("envelopeDynamics(midTime, e, level)", () => {
  test("a bouncing envelope reports its bounce frequency and damping ratio, and how far it still moves", () => {
    const { time, value } = envelope({ zeta: 0.2, bounce: 4, level: 3, period: 1e-3, cycles: 800 });
    const d = envelopeDynamics(time, value, 3);
    expect(d.bounceFrequency!).toBeCloseTo(4, 3);
    expect(d.dampingRatio!).toBeCloseTo(0.2, 3);
    expect(d.sustained).toBe(false);
    // What is left after 0.8 s: the overshoot envelope e^(−ζωn·t)/√(1 − ζ²) (Ogata §5-3).
    const wn = (2 * Math.PI * 4) / Math.sqrt(1 - 0.04);
    const expected = Math.exp(-0.2 * wn * time[799]) / Math.sqrt(1 - 0.04);
    expect(Math.abs(d.remaining / expected - 1)).toBeLessThan(1e-3);
  });

  test("an overdamped approach settles without bouncing: null figures", () => {
    const { time, value } = envelope({ zeta: 1.5, bounce: 2, level: 1, period: 2e-3, cycles: 2000 });
    const d = envelopeDynamics(time, value, value[value.length - 1]);
    expect(d.bounceFrequency).toBeNull();
    expect(d.dampingRatio).toBeNull();
    expect(d.fit?.kind).toBe("creep");
  });

  test("a flat envelope with noise only: no bounce, no fit, nothing left to move", () => {
    const random = randomStream(7);
    const time = Float64Array.from({ length: 400 }, (_, k) => (k + 0.5) * 1e-3);
    const value = time.map(() => 1 + 1e-6 * (2 * random.uniform() - 1));
    const d = envelopeDynamics(time, value, 1);
    expect(d.bounceFrequency).toBeNull();
    expect(d.remaining).toBe(0);
  });

  test("an undamped envelope oscillation (ζ = 0, five bounces) is sustained", () => {
    const time = Float64Array.from({ length: 500 }, (_, k) => (k + 0.5) * 1e-3);
    const value = time.map((t) => 1 + 0.1 * Math.sin(2 * Math.PI * 10 * t));
    const d = envelopeDynamics(time, value, 1);
    expect(d.bounceFrequency!).toBeCloseTo(10, 4);
    expect(Math.abs(d.dampingRatio!)).toBeLessThan(1e-4);
    expect(d.sustained).toBe(true);
  });
});

import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { repeatsWithin } from "../../../packages/core/src/steady/sub-period.js";
import type { PeriodicOrbit } from "../../../packages/core/src/steady/shooting.js";

/** An orbit of period P on a jittered grid of `points` steps, whose two states are `signal`'s value and its quarter-period-shifted value. */
function orbitOf(signal: (t: number) => number, P: number, points: number, jitter: number): PeriodicOrbit {
  const weights = Float64Array.from({ length: points }, (_, k) => 1 + jitter * Math.sin(7.3 * k));
  const total = weights.reduce((a, b) => a + b, 0);
  const fractions = weights.map((w) => w / total);
  const times = [0];
  for (const f of fractions) times.push(times[times.length - 1]! + f * P);
  times[points] = P;
  const states = times.map((t) => Float64Array.from([signal(t), signal(t + P / 4.37)]));
  return { start: { t0: 0, x: states[0]!, period: P }, fractions, states, iterations: 1, mismatch: 0, multipliers: [] };
}

const floor = [1e-9, 1e-9];

describe("repeatsWithin(orbit, columns, floor)", () => {
  test("an orbit shot over k turns of a signal of period P/k (a fundamental of at least half its strength, harmonics 2 and 3 at any phase) repeats k times", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 8 }),
        fc.double({ min: 0.5, max: 2, noNaN: true }),
        fc.double({ min: -0.5, max: 0.5, noNaN: true }),
        fc.double({ min: -0.5, max: 0.5, noNaN: true }),
        fc.double({ min: 0, max: 6, noNaN: true }),
        (k, a1, a2, a3, phase) => {
          const P = 1e-3;
          const w = (2 * Math.PI * k) / P;
          const signal = (t: number) => a1 * Math.sin(w * t) + a2 * Math.sin(2 * w * t + phase) + a3 * Math.cos(3 * w * t + phase);
          expect(repeatsWithin(orbitOf(signal, P, 100 * k, 0.3), [0, 1], floor)).toBe(k);
        },
      ),
      { numRuns: 60 },
    );
  });

  test("a period-doubled orbit (a subharmonic of 5 % beside its fundamental) does not repeat within its period", () => {
    const P = 1e-3;
    const signal = (t: number) => Math.sin((4 * Math.PI * t) / P) + 0.05 * Math.sin((2 * Math.PI * t) / P);
    expect(repeatsWithin(orbitOf(signal, P, 200, 0.3), [0, 1], floor)).toBe(1);
  });

  test("a swing clipped at its rails, shot over four turns whose grids leave them 2e-3 of the swing apart, repeats 4 times", () => {
    const P = 4e-3;
    const clipped = (t: number) => Math.max(-1, Math.min(1, 1.6 * Math.sin((8 * Math.PI * t) / P))) * (1 + 2e-3 * Math.floor((4 * t) / P) / 3);
    expect(repeatsWithin(orbitOf(clipped, P, 660, 0.3), [0], [1e-9])).toBe(4);
  });

  test("a state that does not move (a DC level) does not stop the others from repeating", () => {
    const P = 2e-3;
    const orbit = orbitOf((t) => Math.sin((6 * Math.PI * t) / P), P, 300, 0.2);
    const withDc: PeriodicOrbit = { ...orbit, states: orbit.states.map((x) => Float64Array.from([x[0]!, x[1]!, 2.5])) };
    expect(repeatsWithin(withDc, [0, 1, 2], [1e-9, 1e-9, 1e-9])).toBe(3);
  });
});

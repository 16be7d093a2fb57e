import { describe, expect, test } from "vitest";
import { PeriodicMap, resolveTolerances } from "@onset/core/engine";
import { TangentPeriod } from "../../../packages/core/src/steady/tangent-period.js";
import { clippedWien, settledPeriod } from "./support.js";

describe("TangentPeriod.apply(v, τ) is the map's sensitivity S·[v; τ]", () => {
  test("on the clipped Wien bridge every column (x₀'s and T's) matches the dense sensitivities to 1e-8 relative", () => {
    const { system, guess, fractions, trajectory } = settledPeriod(clippedWien(3.1), "p", 1 / 1580.7, 0.04);
    const map = new PeriodicMap(system, resolveTolerances({}));
    const start = { ...guess, x: Float64Array.from(guess.x) };
    const dense = map.run(start, fractions, trajectory, true).sensitivity!;
    const tangent = new TangentPeriod(system, { start, fractions, states: map.states, middles: map.middlePoints });
    const n = system.n;
    const out = new Float64Array(n);
    let largest = 0;
    for (let c = 0; c <= n; c++) for (let i = 0; i < n; i++) largest = Math.max(largest, Math.abs(dense.x[i * dense.columns + c]!));
    for (let c = 0; c <= n; c++) {
      const v = new Float64Array(n);
      if (c < n) v[c] = 1;
      tangent.apply(v, c === n ? 1 : 0, out);
      // The T column is in units per second: judged against its own size.
      const size = c === n ? Math.max(...Array.from({ length: n }, (_, i) => Math.abs(dense.x[i * dense.columns + n]!))) : largest;
      for (let i = 0; i < n; i++) expect(Math.abs(out[i]! - dense.x[i * dense.columns + c]!)).toBeLessThanOrEqual(1e-8 * size);
    }
  });

  test("a combination of directions is the combination of the columns (the pass is linear in [v; τ])", () => {
    const { system, guess, fractions, trajectory } = settledPeriod(clippedWien(3.3), "p", 1 / 1541.5, 0.04);
    const map = new PeriodicMap(system, resolveTolerances({}));
    const dense = map.run(guess, fractions, trajectory, true).sensitivity!;
    const tangent = new TangentPeriod(system, { start: guess, fractions, states: map.states, middles: map.middlePoints });
    const n = system.n;
    const v = Float64Array.from({ length: n }, (_, i) => Math.sin(i + 1));
    const tau = 1e-5;
    const out = new Float64Array(n);
    tangent.apply(v, tau, out);
    for (let i = 0; i < n; i++) {
      let expected = tau * dense.x[i * dense.columns + n]!;
      for (let c = 0; c < n; c++) expected += dense.x[i * dense.columns + c]! * v[c]!;
      expect(Math.abs(out[i]! - expected)).toBeLessThanOrEqual(1e-8 * (Math.abs(expected) + 1));
    }
  });

  test("with the linearisations not kept (loaded again at each pass), the same numbers bit for bit", () => {
    const { system, guess, fractions, trajectory } = settledPeriod(clippedWien(3.1), "p", 1 / 1580.7, 0.04);
    const map = new PeriodicMap(system, resolveTolerances({}));
    map.run(guess, fractions, trajectory, false);
    const run = { start: guess, fractions, states: map.states, middles: map.middlePoints };
    const kept = new TangentPeriod(system, run);
    const loaded = new TangentPeriod(system, run, undefined, 0);
    const v = Float64Array.from({ length: system.n }, (_, i) => Math.cos(3 * i));
    const a = new Float64Array(system.n);
    const b = new Float64Array(system.n);
    kept.apply(v, 2e-6, a);
    loaded.apply(v, 2e-6, b);
    expect(Array.from(b)).toEqual(Array.from(a));
    expect(a.some((x) => x !== 0)).toBe(true);
  });
});

describe("TangentPeriod.applyEach: several directions in one sweep", () => {
  test("each direction's image is the one its own pass gives, to rounding (a pass starts from the pivot order the last one left)", () => {
    const { system, guess, fractions, trajectory } = settledPeriod(clippedWien(3.1), "p", 1 / 1580.7, 0.04);
    const map = new PeriodicMap(system, resolveTolerances({}));
    map.run(guess, fractions, trajectory, false);
    const tangent = new TangentPeriod(system, { start: guess, fractions, states: map.states, middles: map.middlePoints });
    const n = system.n;
    const directions = [0, 1, 2].map((k) => Float64Array.from({ length: n }, (_, i) => Math.cos(k + i)));
    const taus = [0, 1e-5, 0];
    const together = directions.map(() => new Float64Array(n));
    tangent.applyEach(directions, taus, together);
    for (const [k, v] of directions.entries()) {
      const alone = new Float64Array(n);
      tangent.apply(v, taus[k]!, alone);
      const size = Math.max(...alone.map(Math.abs));
      expect(size).toBeGreaterThan(0);
      for (let i = 0; i < n; i++) expect(Math.abs(together[k]![i]! - alone[i]!)).toBeLessThanOrEqual(1e-12 * size);
    }
  });
});

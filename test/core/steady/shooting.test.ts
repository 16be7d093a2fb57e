import { describe, expect, test } from "vitest";
import { buildSystem, orbitMetrics, probeReader, recordPeriod, refineOrbit, shootOrbit, TransientStepper } from "@onset/core/engine";
import { circuit, part } from "../../support/circuits.js";
import { clippedWien, settledPeriod } from "./support.js";

describe("shootOrbit on the clipped Wien bridge (docs/references.md §2.4: ideal clip(A·v₊, ±10 V), DOP853/Radau at rtol 1e-10)", () => {
  test.each([
    [3.1, 1580.7013, 10.73461, 0.051234],
    [3.3, 1541.4769, 11.3473, 0.115782],
  ])("A = %d: f = %d Hz within 0.005 %, output fundamental %d V within 0.01 %, THD %d (all harmonics) within 0.05 %", (A, f, fundamental, thd) => {
    const { system, guess, fractions, trajectory, read } = settledPeriod(clippedWien(A), "p", 1 / f, 0.04);
    const refined = refineOrbit(system, guess, fractions, trajectory, read, 100);
    expect(Math.abs(refined.frequency / f - 1)).toBeLessThan(5e-5);
    // The reference is exact to the digits shown, so the error bar covers the difference.
    expect(Math.abs(refined.frequency - f)).toBeLessThan(refined.numericalError.frequency + 1e-4);
    expect(Math.abs(refined.harmonics[0]!.amplitude / fundamental - 1)).toBeLessThan(1e-4);
    // (the references' THD counts every harmonic; the model's 0.1 mV knee rounds the clip a little)
    expect(Math.abs(refined.thd / thd - 1)).toBeLessThan(5e-4);
  });

  test("the orbit is a fixed point of the map, with one Floquet multiplier at 1 and the others inside the unit circle", () => {
    const { system, guess, fractions, trajectory } = settledPeriod(clippedWien(3.1), "p", 1 / 1580.7, 0.04);
    const orbit = shootOrbit(system, guess, fractions, trajectory, { autonomous: true, multipliers: true });
    const [trivial, next] = orbit.multipliers;
    expect(Math.hypot(trivial!.re - 1, trivial!.im)).toBeLessThan(1e-3);
    expect(Math.hypot(next!.re, next!.im)).toBeLessThan(0.99);
    expect(orbit.mismatch).toBeLessThanOrEqual(1);
    const first = orbit.states[0]!;
    const last = orbit.states[orbit.states.length - 1]!;
    for (let i = 0; i < first.length; i++) expect(Math.abs(last[i]! - first[i]!)).toBeLessThan(1e-7 * 10 + 1e-9);
  });
});

describe("shootOrbit on a driven circuit (the period is the drive's)", () => {
  test("an RC low-pass driven by a 1 kHz sine settles at amplitude A/√(1 + (ωRC)²) (mathematics: the steady-state phasor)", () => {
    const R = 1e3;
    const C = 1e-6;
    const f = 1e3;
    const rc = circuit([
      part("vsource", "V1", ["in", "gnd"], undefined, { wave: "sine", amp: 2, freq: f }),
      part("resistor", "R1", ["in", "o"], R),
      part("capacitor", "C1", ["o", "gnd"], C),
    ]);
    const system = buildSystem(rc);
    const stepper = new TransientStepper(system, { start: "bias", maxStep: 1 / f / 100 });
    stepper.advance(2 / f);
    const { guess, fractions, trajectory } = recordPeriod(system, stepper.snapshot(), 1 / f, 1 / f / 100);
    const read = probeReader(system, { kind: "node", node: "o" });
    const w = 2 * Math.PI * f * R * C;
    const exact = 2 / Math.sqrt(1 + w * w);
    const errorOn = (grid: Float64Array) => {
      const orbit = shootOrbit(system, guess, grid, grid.length === fractions.length ? trajectory : undefined, { autonomous: false });
      expect(orbit.start.period).toBe(1 / f);
      return orbitMetrics(orbit, read, 10).harmonics[0]!.amplitude / exact - 1;
    };
    const coarse = errorOn(fractions);
    const fine = errorOn(Float64Array.from({ length: 2 * fractions.length }, (_, k) => fractions[k >> 1]! / 2));
    // About 100 steps per period: within 3e-4; TR-BDF2 is second order, so halving the steps quarters the error.
    expect(Math.abs(coarse)).toBeLessThan(3e-4);
    expect(coarse / fine).toBeGreaterThan(3.5);
    expect(coarse / fine).toBeLessThan(4.5);
    const metrics = orbitMetrics(shootOrbit(system, guess, fractions, trajectory, { autonomous: false }), read, 10);
    expect(Math.abs(metrics.offset)).toBeLessThan(1e-9);
  });
});

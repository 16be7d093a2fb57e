import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { buildSystem, orbitPointLimit, probeReader, recordPeriod, refineOrbit, TransientStepper } from "@onset/core/engine";
import { circuit, part } from "../../support/circuits.js";
import { clippedWien, settledPeriod } from "./support.js";

/** A 2 V sine of `f` into 1 kΩ and `c` to ground. */
const sineDrivenRc = (f: number, c: number) =>
  buildSystem(
    circuit([
      part("vsource", "V1", ["in", "gnd"], undefined, { wave: "sine", amp: 2, freq: f }),
      part("resistor", "R1", ["in", "o"], 1e3),
      part("capacitor", "C1", ["o", "gnd"], c),
    ]),
  );

describe("recordPeriod with a bound on the grid's points per period", () => {
  const f = 1e3;
  const rc = sineDrivenRc(f, 1e-6);
  const stepper = new TransientStepper(rc, { start: "bias", maxStep: 1 / f / 400 });
  stepper.advance(2 / f);
  const snapshot = stepper.snapshot();
  const all = recordPeriod(rc, snapshot, 1 / f, 1 / f / 400);

  test("a bound at or above the run's steps keeps them all", () => {
    const kept = recordPeriod(rc, snapshot, 1 / f, 1 / f / 400, undefined, all.fractions.length);
    expect(kept.merged).toBe(1);
    expect(Array.from(kept.fractions)).toEqual(Array.from(all.fractions));
  });

  test("any bound: at most that many points, merged a power of two, the grid still one whole period", () => {
    fc.assert(
      fc.property(fc.integer({ min: 8, max: 600 }), (maxPoints) => {
        const r = recordPeriod(rc, snapshot, 1 / f, 1 / f / 400, undefined, maxPoints);
        expect(r.fractions.length).toBeLessThanOrEqual(maxPoints);
        expect(Math.log2(r.merged) % 1).toBe(0);
        expect(r.trajectory.length).toBe(r.fractions.length + 1);
        expect(Math.abs(r.fractions.reduce((a, b) => a + b, 0) - 1)).toBeLessThan(1e-12);
        // Every kept step spans at most `merged` of the run's steps (the one ending the period, twice that).
        const widest = Math.max(...all.fractions) * (1 + 1e-9);
        const spans = Array.from(r.fractions).sort((a, b) => b - a);
        expect(spans[0]!).toBeLessThanOrEqual(2 * r.merged * widest);
        expect(spans[1]!).toBeLessThanOrEqual(r.merged * widest);
      }),
      { numRuns: 40 },
    );
  });

  test("the stored-points bound leaves room for eight copies of the unknowns per point, never below 256 points", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 200 }), fc.integer({ min: 1, max: 1e8 }), (n, stored) => {
        const limit = orbitPointLimit(stored, n);
        expect(limit).toBeGreaterThanOrEqual(256);
        if (limit > 256) expect(8 * n * limit).toBeLessThanOrEqual(stored);
      }),
    );
  });
});

describe("a merged grid keeps the figures and their error bars honest (clipped Wien bridge, docs/references.md §2.4: DOP853/Radau at rtol 1e-10)", () => {
  test("2 000 steps a period merged to at most 300 points: f within 0.005 % of the reference, and its error bar covers the unmerged grid's", () => {
    const fRef = 1580.7013;
    const settled = settledPeriod(clippedWien(3.1), "p", 1 / fRef, 0.04);
    const { system } = settled;
    const read = probeReader(system, { kind: "node", node: "o" });
    // The run continued at a twentieth of the step, recorded with and without a bound of 300 points.
    const refined = (maxPoints: number) => {
      const stepper = new TransientStepper(system, { start: { t: settled.guess.t0, x: settled.guess.x }, maxStep: 1 / fRef / 2000 });
      const r = recordPeriod(system, stepper.snapshot(), 1 / fRef, 1 / fRef / 2000, undefined, maxPoints);
      return { merged: r.merged, orbit: refineOrbit(system, r.guess, r.fractions, r.trajectory, read, 100) };
    };
    const merged = refined(300);
    const all = refined(Infinity);
    expect(merged.merged).toBeGreaterThanOrEqual(8);
    expect(all.merged).toBe(1);
    expect(Math.abs(merged.orbit.frequency / fRef - 1)).toBeLessThan(5e-5);
    // (The model's 0.1 mV knee moves f by about 0.01 Hz from the ideal clip: the unmerged grid, with
    // a bar a hundred times narrower, stands for the discretised model's own value.)
    expect(Math.abs(merged.orbit.frequency - all.orbit.frequency)).toBeLessThan(merged.orbit.numericalError.frequency + all.orbit.numericalError.frequency);
    expect(Math.abs(merged.orbit.amplitude - all.orbit.amplitude)).toBeLessThan(merged.orbit.numericalError.amplitude + all.orbit.numericalError.amplitude);
  });
});

describe("an autonomous period's guess retimed by its seam (clipped Wien bridge, docs/references.md §2.4: DOP853/Radau at rtol 1e-10)", () => {
  const fRef = 1580.7013;
  const system = buildSystem(clippedWien(3.1));
  const maxStep = 1 / fRef / 100;
  const rest = new TransientStepper(system, { start: "bias", maxStep });
  const x = Float64Array.from(rest.x);
  x[system.nodeIndex.get("p")!] += 1e-2;
  const run = new TransientStepper(system, { start: { t: 0, x }, maxStep });
  run.advance(0.04);
  const snapshot = run.snapshot();

  test("a guess 0.5 % long or short comes back to within 0.1 % of the reference period (the seam's linear estimate leaves a second-order error)", () => {
    for (const off of [1.005, 0.995]) {
      const { guess } = recordPeriod(system, snapshot, off / fRef, maxStep, undefined, Infinity, true);
      expect(Math.abs(guess.period * fRef - 1)).toBeLessThan(1e-3);
    }
  });

  test("a guess 3 % off (beyond the 1 % the seam's linear estimate is trusted for), or one not retimed, is kept", () => {
    expect(recordPeriod(system, snapshot, 1.03 / fRef, maxStep, undefined, Infinity, true).guess.period).toBe(1.03 / fRef);
    expect(recordPeriod(system, snapshot, 1.005 / fRef, maxStep).guess.period).toBe(1.005 / fRef);
  });
});

describe("recordPeriod for a driven orbit (driven = true)", () => {
  test("starts the period where the charged states change least for their swings: on a sine through an RC (closed form v = |H|·sin(ωt + φ)), within one step of the capacitor's peak, where its rate is zero", () => {
    const f = 1e3;
    const rc = sineDrivenRc(f, 1e-7);
    const stepper = new TransientStepper(rc, { start: "bias", maxStep: 1 / f / 200 });
    stepper.advance(20 / f);
    const r = recordPeriod(rc, stepper.snapshot(), 1 / f, 1 / f / 200, undefined, Infinity, false, true);
    const o = rc.unknowns.findIndex((u) => u.label === "o");
    const gain = 1 / Math.hypot(1, 2 * Math.PI * f * 1e3 * 1e-7);
    // Within one step (of at most T/200) of the peak, the value is within 1 − cos(2π/200) of it.
    expect(Math.abs(r.guess.x[o]!)).toBeGreaterThan(2 * gain * Math.cos((2 * Math.PI) / 200) * (1 - 1e-3));
  });
});

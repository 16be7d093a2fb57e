import { describe, expect, test } from "vitest";
import { Solver } from "odex";
import { runTransient, THERMAL_VOLTAGE } from "@onset/core";
import { buildSystem, TransientStepper } from "@onset/core/engine";
import { circuit, part, sampleAt } from "../../support/circuits.js";

describe("LC tank at a fixed step (docs/references.md §3: the trapezoidal rule on an undamped oscillator)", () => {
  const L = 1e-3;
  const C = 1e-6;
  const h = 10e-6;
  const tank = circuit([
    part("capacitor", "C1", ["t", "gnd"], C, { initial: 1 }),
    part("inductor", "L1", ["t", "gnd"], L, { series: 0 }),
  ]);

  function run() {
    const system = buildSystem(tank);
    // An enormous LTE tolerance keeps every step at the maximum: a fixed-step run.
    const stepper = new TransientStepper(system, { start: "rest", maxStep: h, firstStep: h, tolerances: { lteRelative: 1e9 } });
    const t: number[] = [];
    const v: number[] = [];
    const energy: number[] = [];
    const vi = system.nodeIndex.get("t")!;
    const ii = system.unknowns.findIndex((u) => u.label === "L1.i");
    stepper.observe((time, x) => {
      t.push(time);
      v.push(x[vi]!);
      energy.push(0.5 * C * x[vi]! ** 2 + 0.5 * L * x[ii]! ** 2);
    });
    stepper.advance(200 * 2 * Math.PI * Math.sqrt(L * C));
    return { t, v, energy, stepper };
  }

  test("every step has the same length and the matrix is factored once per coefficient set", () => {
    const { t, stepper } = run();
    // The checked start is two backward-Euler steps of h/2; then every step is h (the last is
    // shorter: the run ends between two grid points).
    expect(t[1]! - t[0]!).toBeCloseTo(h / 2, 15);
    expect(t[2]! - t[1]!).toBeCloseTo(h / 2, 15);
    for (let k = 3; k < t.length - 1; k++) expect(t[k]! - t[k - 1]!).toBeCloseTo(h, 15);
    // The consistent start, the whole first-order step that checks the halves, the halves (whose
    // G + (2/h)·C is also the trapezoidal matrix at h), the short last step.
    expect(stepper.stats.factorizations).toBe(4);
  });

  test("energy ½Cv² + ½Li² is conserved after the first-order start (two backward-Euler halves)", () => {
    const { energy } = run();
    const e2 = energy[2]!;
    for (let k = 2; k < energy.length; k++) expect(Math.abs(energy[k]! - e2) / e2).toBeLessThan(1e-11);
  });

  test("the frequency equals the warped ω_num = (2/h)·atan(ωh/2) = 31363.137069 rad/s", () => {
    const { t, v } = run();
    const crossings: number[] = [];
    for (let k = 2; k < t.length; k++) {
      if (v[k - 1]! < 0 && v[k]! >= 0) crossings.push(t[k - 1]! + ((t[k]! - t[k - 1]!) * -v[k - 1]!) / (v[k]! - v[k - 1]!));
    }
    const omega = (2 * Math.PI * (crossings.length - 1)) / (crossings[crossings.length - 1]! - crossings[0]!);
    const w = 1 / Math.sqrt(L * C);
    const expected = (2 / h) * Math.atan((w * h) / 2);
    expect(expected).toBeCloseTo(31363.137069, 5);
    // Linear-interpolated crossings match f_num to 3.5e-7 at 20 samples per period (docs/references.md §3).
    expect(Math.abs(omega / expected - 1)).toBeLessThan(1e-6);
  });
});

describe("against an independent ODE integrator (odex, Gragg–Bulirsch–Stoer extrapolation)", () => {
  test("a two-node RC network with a clipping diode driven by a sine agrees with odex to 1e-5 V", () => {
    const R1 = 1e3;
    const R2 = 2.2e3;
    const C1 = 470e-9;
    const C2 = 220e-9;
    const is = 1e-14;
    const nvt = THERMAL_VOLTAGE;
    const amp = 3;
    const f = 500;
    const c = circuit([
      part("vsource", "Vs", ["in", "gnd"], undefined, { wave: "sine", amp, freq: f }),
      part("resistor", "R1", ["in", "a"], R1),
      part("capacitor", "C1", ["a", "gnd"], C1),
      part("diode", "D1", ["a", "gnd"], undefined, { saturation: is, emission: 1, series: 0 }),
      part("resistor", "R2", ["a", "b"], R2),
      part("capacitor", "C2", ["b", "gnd"], C2),
    ]);
    const until = 4e-3;
    const r = runTransient(
      c,
      { kind: "transient", until, start: "bias", maxStep: 5e-6, probes: [{ kind: "node", node: "a" }, { kind: "node", node: "b" }] },
      { tolerances: { lteRelative: 1e-8, lteVoltage: 1e-10 } },
    );
    // The same circuit as state equations, integrated by odex.
    const rhs = (t: number, y: number[]) => {
      const [va, vb] = y as [number, number];
      const vs = amp * Math.sin(2 * Math.PI * f * t);
      const id = is * (Math.exp(va / nvt) - 1) + 1e-12 * va;
      return [((vs - va) / R1 - (va - vb) / R2 - id) / C1, (va - vb) / R2 / C2];
    };
    const solver = new Solver(2);
    solver.relativeTolerance = 1e-11;
    solver.absoluteTolerance = 1e-13;
    solver.maxSteps = 1e6;
    for (const t of [0.7e-3, 1.3e-3, 2.1e-3, 3.6e-3]) {
      const y = solver.solve(rhs, 0, [0, 0], t).y;
      expect(Math.abs(sampleAt(r.time, r.signals[0]!.values, t) - y[0]!)).toBeLessThan(1e-5);
      expect(Math.abs(sampleAt(r.time, r.signals[1]!.values, t) - y[1]!)).toBeLessThan(1e-5);
    }
    // The diode really clips: node a never exceeds about 0.8 V.
    expect(Math.max(...r.signals[0]!.values)).toBeLessThan(0.8);
  });
});

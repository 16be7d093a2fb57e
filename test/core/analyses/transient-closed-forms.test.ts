import { describe, expect, test } from "vitest";
import { runTransient } from "@onset/core";
import { circuit, part, sampleAt } from "../../support/circuits.js";

// A tight error tolerance so the comparison measures the method, not the default accuracy.
const tight = { tolerances: { lteRelative: 1e-9, lteVoltage: 1e-12, lteCurrent: 1e-15 } };

const step = (name: string, plus: string, level = 1) =>
  part("vsource", name, [plus, "gnd"], undefined, { wave: "pulse", low: 0, high: level });

describe("transient against closed forms (docs/references.md §3; Nilsson & Riedel, Electric Circuits, RC/RL/RLC chapters)", () => {
  test("RC step: v = V(1 − e^(−t/RC)) at τ, 2τ, 5τ with R = 1 kΩ, C = 1 µF", () => {
    const c = circuit([step("V1", "in"), part("resistor", "R1", ["in", "o"], 1e3), part("capacitor", "C1", ["o", "gnd"], 1e-6)]);
    const r = runTransient(c, { kind: "transient", until: 6e-3, start: "bias", probes: [{ kind: "node", node: "o" }] }, tight);
    const v = r.signals[0]!.values;
    // docs/references.md §3: v(τ) = 0.632120559, v(2τ) = 0.864664717, v(5τ) = 0.993262053
    expect(sampleAt(r.time, v, 1e-3)).toBeCloseTo(0.632120559, 6);
    expect(sampleAt(r.time, v, 2e-3)).toBeCloseTo(0.864664717, 6);
    expect(sampleAt(r.time, v, 5e-3)).toBeCloseTo(0.993262053, 6);
    expect(v[0]).toBe(0);
  });

  test("RL step: i = (V/R)(1 − e^(−Rt/L)), i(100 µs) = 6.321205588 mA with R = 100 Ω, L = 10 mH", () => {
    const c = circuit([step("V1", "in"), part("resistor", "R1", ["in", "m"], 100), part("inductor", "L1", ["m", "gnd"], 10e-3)]);
    const r = runTransient(c, { kind: "transient", until: 400e-6, start: "bias", probes: [{ kind: "current", part: "L1" }] }, tight);
    expect(sampleAt(r.time, r.signals[0]!.values, 100e-6)).toBeCloseTo(6.321205588e-3, 8);
  });

  test("series RLC underdamped step: v_C and i at the tabulated times (R = 10 Ω, L = 1 mH, C = 1 µF)", () => {
    const c = circuit([
      step("V1", "in"),
      part("resistor", "R1", ["in", "a"], 10),
      part("inductor", "L1", ["a", "b"], 1e-3),
      part("capacitor", "C1", ["b", "gnd"], 1e-6),
    ]);
    const r = runTransient(c, {
      kind: "transient",
      until: 600e-6,
      start: "bias",
      probes: [{ kind: "node", node: "b" }, { kind: "current", part: "L1" }],
    }, tight);
    const vc = r.signals[0]!.values;
    const i = r.signals[1]!.values;
    // docs/references.md §3: v_C(50 µs) = 0.8678627879, v_C(100 µs) = 1.6045657890, v_C(500 µs) = 1.0804582724, i(50 µs) = 24.940449712 mA
    expect(sampleAt(r.time, vc, 50e-6)).toBeCloseTo(0.8678627879, 5);
    expect(sampleAt(r.time, vc, 100e-6)).toBeCloseTo(1.604565789, 5);
    expect(sampleAt(r.time, vc, 500e-6)).toBeCloseTo(1.0804582724, 5);
    expect(sampleAt(r.time, i, 50e-6)).toBeCloseTo(24.940449712e-3, 7);
  });

  test("accuracy= tightens the step control: the RLC ringing error at 500 µs falls as the accuracy is raised", () => {
    const c = circuit([
      step("V1", "in"),
      part("resistor", "R1", ["in", "a"], 10),
      part("inductor", "L1", ["a", "b"], 1e-3),
      part("capacitor", "C1", ["b", "gnd"], 1e-6),
    ]);
    const run = (accuracy: number) => {
      const r = runTransient(c, { kind: "transient", until: 600e-6, start: "bias", probes: [{ kind: "node", node: "b" }], accuracy, accuracyFloor: 1e-12 });
      // docs/references.md §3: v_C(500 µs) = 1.0804582724
      return { error: Math.abs(sampleAt(r.time, r.signals[0]!.values, 500e-6) - 1.0804582724), steps: r.stats.accepted };
    };
    const loose = run(1e-3);
    const strict = run(1e-7);
    expect(strict.steps).toBeGreaterThan(loose.steps);
    expect(strict.error).toBeLessThan(loose.error / 10);
    expect(strict.error).toBeLessThan(1e-5);
  });
});

import { describe, expect, test } from "vitest";
import { checkTopology, isOnsetError, DEFAULT_TOLERANCES } from "@onset/core";
import { buildSystem, deviceModels, NewtonSolver, solveBias, type DeviceModel } from "@onset/core/engine";
import { circuit, part } from "../../support/circuits.js";

function thrown(fn: () => unknown) {
  try {
    fn();
  } catch (error) {
    if (isOnsetError(error)) return error.diagnostic;
    throw error;
  }
  throw new Error("expected an OnsetError");
}

describe("bad circuits give typed errors that name parts and nodes", () => {
  test("a node reached only through a capacitor has no DC path to gnd", () => {
    const problems = checkTopology(
      circuit([
        part("vsource", "V1", ["in", "gnd"], 1),
        part("resistor", "R1", ["in", "a"], 1e3),
        part("capacitor", "C1", ["a", "f"], 1e-9),
        part("resistor", "R2", ["f", "g"], 1e3),
        part("capacitor", "C2", ["g", "gnd"], 1e-9),
      ]),
    );
    const floating = problems.find((p) => p.code === "no-dc-path")!;
    expect(floating.message).toBe("nodes 'f', 'g' have no DC path to gnd");
    expect(floating.notes).toEqual(["capacitor C1 touches 'f'", "resistor R2 touches 'f', 'g'", "capacitor C2 touches 'g'"]);
    expect(floating.stage).toBe("input");
  });

  test("op-amp supply= nodes left undriven want a voltage source, not a resistor to gnd", () => {
    const amplifier = [
      part("opamp", "U1", ["p", "n", "o"], undefined, { supply: ["vn", "vp"] }),
      part("resistor", "Rf", ["o", "n"], 10e3),
      part("resistor", "Rg", ["n", "gnd"], 10e3),
      part("resistor", "Rb", ["p", "gnd"], 10e3),
    ];
    const problems = checkTopology(circuit([...amplifier, part("capacitor", "Cd", ["vp", "gnd"], 100e-9)])).filter((p) => p.code === "no-dc-path");
    expect(problems.map((p) => [p.message, p.hint])).toEqual([
      ["node 'vn' has no DC path to gnd", "nothing sets the voltage of 'vn' (read by supply= of opamp U1, which draws no current): give it a voltage source to gnd (vsource Vvn vn gnd VOLTS)"],
      ["node 'vp' has no DC path to gnd", "nothing sets the voltage of 'vp' (read by supply= of opamp U1, which draws no current): give it a voltage source to gnd (vsource Vvp vp gnd VOLTS)"],
    ]);
    // A supply node and a coupling node in one floating group: each gets the advice that fits it.
    const mixed = checkTopology(circuit([...amplifier, part("capacitor", "Cd", ["vp", "gnd"], 100e-9), part("resistor", "Rx", ["vp", "x"], 1e3), part("capacitor", "Cx", ["x", "gnd"], 1e-9), part("vsource", "Vn", ["vn", "gnd"], -12)]));
    expect(mixed.filter((p) => p.code === "no-dc-path").map((p) => p.hint)).toEqual([
      "nothing sets the voltage of 'vp' (read by supply= of opamp U1, which draws no current): give it a voltage source to gnd (vsource Vvp vp gnd VOLTS); " +
        "'x': only capacitors or current sources reach it, so its DC voltage is undefined: add a resistor to gnd (a large one is enough)",
    ]);
    const driven = checkTopology(circuit([...amplifier, part("vsource", "Vp", ["vp", "gnd"], 12), part("vsource", "Vn", ["vn", "gnd"], -12)]));
    expect(driven.filter((p) => p.severity === "error")).toEqual([]);
  });

  test("a device may declare what a pin needs, and the floating-node hint says it", () => {
    const models = deviceModels as Record<string, DeviceModel>;
    const base = models.resistor!;
    models.sensor = { ...base, schema: { ...base.schema, kind: "sensor", pinNeeds: { b: "a reference voltage from a source" } }, topology: () => ({ conducting: [], voltageDefined: [] }) };
    try {
      const problems = checkTopology(circuit([part("vsource", "V1", ["a", "gnd"], 1), part("sensor", "S1", ["a", "ref"], 1e3)]));
      expect(problems.find((p) => p.code === "no-dc-path")?.hint).toBe("nothing sets the voltage of 'ref' (pin b of sensor S1): give it a reference voltage from a source (vsource Vref ref gnd VOLTS)");
    } finally {
      delete models.sensor;
    }
  });

  test("two voltage sources in parallel form a loop", () => {
    const problems = checkTopology(
      circuit([part("vsource", "V1", ["a", "gnd"], 1), part("vsource", "V2", ["a", "gnd"], 2), part("resistor", "R1", ["a", "gnd"], 1e3)]),
    );
    const loop = problems.find((p) => p.code === "voltage-loop")!;
    expect(loop.message).toBe("parts 'V2', 'V1' form a loop of voltage sources");
  });

  test("a source and a bare inductor across it form a loop; winding resistance breaks it", () => {
    const base = [part("vsource", "V1", ["a", "gnd"], 1), part("resistor", "R1", ["a", "gnd"], 1e3)];
    const bare = checkTopology(circuit([...base, part("inductor", "L1", ["a", "gnd"], 1e-3)]));
    expect(bare.find((p) => p.code === "voltage-loop")?.message).toBe("parts 'L1', 'V1' form a loop of voltage sources and inductors");
    const wound = checkTopology(circuit([...base, part("inductor", "L1", ["a", "gnd"], 1e-3, { series: 1 })]));
    expect(wound.some((p) => p.code === "voltage-loop")).toBe(false);
  });

  test("a node touched by one pin only is a warning", () => {
    const problems = checkTopology(circuit([part("vsource", "V1", ["a", "gnd"], 1), part("resistor", "R1", ["a", "dangling"], 1e3)]));
    expect(problems).toEqual([
      expect.objectContaining({ severity: "warning", code: "dangling-node", message: "node 'dangling' is touched by one pin only (resistor R1)" }),
    ]);
  });

  test.each([
    ["resistor", 0, "resistor R1: resistance must be positive and finite, got 0 Ω"],
    ["resistor", -5, "resistor R1: resistance must be positive and finite, got -5 Ω"],
    ["capacitor", 0, "capacitor R1: capacitance must be positive and finite, got 0 F"],
    ["inductor", -1e-3, "inductor R1: inductance must be positive and finite, got -0.001 H"],
  ])("a %s of %d is rejected by name", (kind, value, message) => {
    const d = thrown(() => buildSystem(circuit([part("vsource", "V1", ["a", "gnd"], 1), part(kind, "R1", ["a", "gnd"], value)])));
    expect(d.code).toBe("out-of-range");
    expect(d.message).toBe(message);
  });

  test("a wiper position outside 0..1 is rejected", () => {
    const d = thrown(() => buildSystem(circuit([part("pot", "P1", ["a", "w", "gnd"], 10e3, { at: 1.2 })])));
    expect(d.message).toBe("pot P1: at=1.2 is outside 0..1");
    expect(d.hint).toBe("at= is measured from end1: 0 puts the wiper on end1, 1 on end2 (end1 to wiper is at × the track on a linear taper)");
  });

  test("solving a floating node anyway reports a singular system at that node", () => {
    const system = buildSystem(circuit([part("vsource", "V1", ["a", "gnd"], 1), part("resistor", "R1", ["a", "gnd"], 1e3), part("capacitor", "C1", ["a", "f"], 1e-9)]));
    const d = thrown(() => solveBias(system, new NewtonSolver(system, DEFAULT_TOLERANCES)));
    expect(d.code).toBe("singular-matrix");
    expect(d.stage).toBe("simulation");
    expect(d.message).toBe("the circuit equations are singular at unknown 'f'");
  });
});

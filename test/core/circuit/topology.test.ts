import { describe, expect, test } from "vitest";
import { checkTopology, isOnsetError, DEFAULT_TOLERANCES } from "@onset/core";
import { buildSystem, NewtonSolver, solveBias } from "@onset/core/engine";
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
  });

  test("solving a floating node anyway reports a singular system at that node", () => {
    const system = buildSystem(circuit([part("vsource", "V1", ["a", "gnd"], 1), part("resistor", "R1", ["a", "gnd"], 1e3), part("capacitor", "C1", ["a", "f"], 1e-9)]));
    const d = thrown(() => solveBias(system, new NewtonSolver(system, DEFAULT_TOLERANCES)));
    expect(d.code).toBe("singular-matrix");
    expect(d.stage).toBe("simulation");
    expect(d.message).toBe("the circuit equations are singular at unknown 'f'");
  });
});

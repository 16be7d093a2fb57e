import { describe, expect, test } from "vitest";
import { DEFAULT_TOLERANCES } from "@onset/core";
import { buildSystem, QUANTITIES, resolveTolerances, type UnknownInfo } from "@onset/core/engine";
import { circuit, part } from "../../support/circuits.js";

const row = (u: UnknownInfo) => [u.label, u.role, u.quantity, u.unit, u.stiff, u.errorControl];

describe("buildSystem(circuit): the state table", () => {
  test("every unknown carries its role, quantity, unit, integration and error control", () => {
    const system = buildSystem(
      circuit([
        part("vsource", "V1", ["in", "gnd"], 1),
        part("resistor", "R1", ["in", "a"], 1e3),
        part("capacitor", "C1", ["a", "gnd"], 1e-9),
        part("inductor", "L1", ["a", "b"], 1e-3),
        part("diode", "D1", ["b", "gnd"], undefined, { series: 2 }),
        part("opamp", "U1", ["a", "o", "o"]),
      ]),
    );
    expect(system.unknowns.map(row)).toEqual([
      ["in", "node", "voltage", "V", false, false],
      ["a", "node", "voltage", "V", false, true],
      ["b", "node", "voltage", "V", false, false],
      ["o", "node", "voltage", "V", false, false],
      ["V1.i", "branch", "current", "A", false, false],
      ["L1.i", "branch", "current", "A", false, true],
      ["D1.junction", "internal", "voltage", "V", false, false],
      ["U1.pole", "internal", "voltage", "V", true, true],
    ]);
    expect([...system.stateIndex.keys()]).toEqual(["in", "a", "b", "o", "V1.i", "L1.i", "D1.junction", "U1.pole"]);
  });

  test("an unknown whose only charge is a device's nonlinear charge is under error control", () => {
    const withJunction = buildSystem(
      circuit([part("resistor", "R1", ["in", "a"], 10e3), part("vsource", "V1", ["in", "gnd"], 1), part("diode", "D1", ["gnd", "a"], undefined, { junction: 10e-9, series: 0 })]),
    );
    expect(withJunction.unknowns.find((u) => u.label === "a")!.errorControl).toBe(true);
    const without = buildSystem(
      circuit([part("resistor", "R1", ["in", "a"], 10e3), part("vsource", "V1", ["in", "gnd"], 1), part("diode", "D1", ["gnd", "a"], undefined, { series: 0 })]),
    );
    expect(without.unknowns.find((u) => u.label === "a")!.errorControl).toBe(false);
  });

  test("a diode without series resistance answers to D1.junction at its anode", () => {
    const system = buildSystem(circuit([part("vsource", "V1", ["a", "gnd"], 1), part("diode", "D1", ["a", "gnd"], undefined, { series: 0 })]));
    expect(system.stateIndex.get("D1.junction")).toBe(system.nodeIndex.get("a"));
  });
});

describe("tolerances by quantity", () => {
  test("every quantity names a Newton and an LTE setting that has a default", () => {
    for (const q of Object.values(QUANTITIES)) {
      expect(DEFAULT_TOLERANCES[q.newton]).toBeGreaterThan(0);
      expect(DEFAULT_TOLERANCES[q.lte]).toBeGreaterThan(0);
    }
  });

  test("resolveTolerances carries a tightened LTE setting over to Newton (a tenth, a thousandth)", () => {
    const t = resolveTolerances({ lteRelative: 1e-7, lteTemperature: 1e-3 });
    expect(t.newtonRelative).toBeCloseTo(1e-8, 20);
    expect(t.newtonTemperature).toBeCloseTo(1e-6, 20);
    expect(t.newtonVoltage).toBe(DEFAULT_TOLERANCES.newtonVoltage);
    expect(resolveTolerances({ lteRelative: 1e-7, newtonRelative: 1e-6 }).newtonRelative).toBe(1e-6);
  });
});

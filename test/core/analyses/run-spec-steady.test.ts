// A file whose only simulating analysis is `steady` has its spec checked on the steady state
// (it was dropped without a word: no spec in the report or the JSON, exit status 0).
import { describe, expect, test } from "vitest";
import { runCircuit } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";

const driven = (spec: string) =>
  buildCircuit(loadSource("steady-spec.onset", `vsource V1 a gnd wave=sine amp=2 freq=1k delay=3m\nresistor R1 a o 1k\ncapacitor C1 o gnd 1u\nsteady probe=o\nspec ${spec}\n`)).circuit;
// closed form: an RC low-pass driven at ω passes 2 V/√(1 + (ωRC)²)
const passed = 2 / Math.sqrt(1 + (2 * Math.PI * 1e3 * 1e3 * 1e-6) ** 2);

describe("runCircuit(circuit) with a steady analysis and no startup", () => {
  test("checks the spec on the steady state: the RC's amplitude (closed form 314.35 mV) passes 0.3..0.33 and fails 0.5..1", () => {
    const pass = runCircuit(driven("amplitude=0.3..0.33 frequency=1k±1%")).spec!;
    expect(pass.pass).toBe(true);
    expect(Math.abs(pass.criteria[0]!.measured! / passed - 1)).toBeLessThan(1e-5);
    const fail = runCircuit(driven("amplitude=0.5..1")).spec!;
    expect(fail.pass).toBe(false);
    expect(fail.criteria[0]!.pass).toBe(false);
  });
});

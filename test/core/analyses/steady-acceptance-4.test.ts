// Issue 15, an acceptance pass on circuits of its own (not the examples, not the other steady
// tests' topologies): the steady analysis against closed forms, the odex ODE integrator and the
// settled start-up run; the probe does not change the orbit; no orbit where there is none.
import { describe, expect, test } from "vitest";
import { runSteady, type Circuit, type SteadyResult } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";
import { lampAmplitude } from "../../e2e/support/steady-circuits.js";

const circuitOf = (text: string): Circuit => elaborate(loadProgram("acceptance-4.onset", text).program, {}).circuit!;
const node = (name: string) => ({ kind: "node", node: name }) as const;
const steadyOn = (circuit: Circuit, probe: Parameters<typeof runSteady>[1]["probe"], extra: object = {}): SteadyResult =>
  runSteady(circuit, { kind: "steady", probe, ...extra });
const rel = (a: number, b: number) => Math.abs(a / b - 1);
/** |μ| of the largest non-trivial Floquet multiplier. */
const largest = (r: SteadyResult) => Math.hypot(r.stability!.largest!.re, r.stability!.largest!.im);

/** The same orbit seen from two probes: frequency within `f`, the largest non-trivial multiplier within `mu`. */
function expectSameOrbit(a: SteadyResult, b: SteadyResult, f = 1e-6, mu = 1e-4): void {
  expect(a.found && b.found).toBe(true);
  expect(rel(a.frequency!, b.frequency!)).toBeLessThan(f);
  expect(Math.abs(largest(a) - largest(b))).toBeLessThan(mu);
}

const wien = (R1: string, C1: string, R2: string, C2: string) => `resistor  R1 o s   ${R1}
capacitor C1 s p   ${C1}
resistor  R2 p gnd ${R2}
capacitor C2 p gnd ${C2}
`;

describe("the probe does not choose the orbit", () => {
  // A lamp-held Wien (3.3 kΩ, 47 nF; cold 180 Ω: gain 4.8; settles where the lamp is Rf/2 = 340 Ω).
  // Its temperature ripples at twice the oscillation's frequency: the approach used to measure
  // that half period on the probe, and the shooting from it found no orbit ("drove the period
  // to zero"), while the same analysis on the output found the orbit at 1021.36 Hz.
  const lamp = circuitOf(`${wien("3.3k", "47n", "3.3k", "47n")}resistor  Rf o n   680
lamp      L1 n gnd 180 hot=800 rated=6 tau=60m
opamp     U1 p n o preset=general rails=(-15, 15)
`);
  test("a lamp-held Wien: the lamp's temperature as the probe finds the output's orbit; its mean and the output's amplitude are the lamp's thermal balance (closed form)", () => {
    const output = steadyOn(lamp, node("o"));
    const temperature = steadyOn(lamp, { kind: "state", part: "L1", state: "temperature" });
    expectSameOrbit(output, temperature);
    expect(temperature.unit).toBe("K");
    // Source: closed form (docs/language.md's lamp law at R_lamp = Rf/2): 509.930 K, 8.8346 V.
    const ambient = 300.15;
    const theta = ambient * (340 / 180) ** (1 / 1.2);
    expect(rel(temperature.offset!, theta)).toBeLessThan(1e-4);
    expect(rel(output.amplitude!, lampAmplitude(680, 180, 800, 6))).toBeLessThan(1e-3);
  });
});

// An over-correcting JFET amplitude loop (acceptance pass 8): a gain leg of a JFET whose gate a
// peak rectifier and a hold capacitor drive, bled by 2.2 MΩ. Its first overshoot charges the hold
// capacitor so far that the oscillation stops until the capacitor bleeds back. Without noise the
// steady analysis' swing sank below the solver's resolution meanwhile, and the default search
// answered "no orbit, raise cycles=" where the start-up run (which grows from thermal noise) settles.
import { describe, expect, test } from "vitest";
import { runStartup, runSteady, type Circuit, type StartupAnalysis } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const loop = (hold: string) => `resistor  R1  o   s    12k
capacitor C1  s   p    10n
resistor  R2  p   gnd  12k
capacitor C2  p   gnd  10n
resistor  Rf  o   n    27k
resistor  Rs  n   d    10k
jfet      J1  d   g    gnd  idss=5m pinchoff=-2.2
resistor  Rg  c   g    150k
diode     D1  c   o
capacitor Ch  c   gnd  ${hold}
resistor  Rb  c   gnd  2.2M
opamp     U1  p   n    o    preset=general rails=(-12, 12)
startup probe=o until=auto
`;

const circuitOf = (text: string): Circuit => elaborate(loadProgram("over-correcting.onset", text).program, {}).circuit!;

describe("an over-correcting JFET loop, 2.2 MΩ bleed", () => {
  test("hold 4.7 µF: the default steady search finds the orbit the start-up run settles on (frequency 0.05 %, amplitude 0.5 %)", () => {
    const circuit = circuitOf(loop("4.7u"));
    const settled = runStartup(circuit, circuit.analyses[0] as StartupAnalysis);
    expect(settled.verdict).toBe("settled");
    const steady = runSteady(circuit, { kind: "steady", probe: { kind: "node", node: "o" } });
    expect(steady.found).toBe(true);
    expect(steady.stability!.verdict).toBe("stable");
    expect(Math.abs(steady.frequency! / settled.frequency! - 1)).toBeLessThan(5e-4);
    expect(Math.abs(steady.amplitude! / settled.amplitude! - 1)).toBeLessThan(5e-3);
    // scipy (solve_ivp Radau, rtol 1e-10; the op-amp and diode laws of test/validation/reference,
    // the JFET's square law and gate junctions written from its documented model), started at this
    // orbit's start and run 60 periods (its slowest multiplier, 0.883, shrinks the start's offset
    // by 6e-4): 1283.51369 Hz, 2.0989423 V peak; each within the figure's own error bar.
    expect(Math.abs(steady.frequency! - 1283.51369)).toBeLessThanOrEqual(steady.numericalError!.frequency);
    expect(Math.abs(steady.amplitude! - 2.0989423)).toBeLessThanOrEqual(steady.numericalError!.amplitude);
  }, 120_000);
});

describe("the same loop with a 10 µF hold, whose start-up run does not settle within its own bound (4000 periods)", () => {
  test("no orbit: the answer says how often and how long the swing was re-seeded, within the bound of 4000 periods, and how to wait longer", () => {
    const circuit = circuitOf(loop("10u"));
    const r = runSteady(circuit, { kind: "steady", probe: { kind: "node", node: "o" } });
    expect(r.found).toBe(false);
    expect(r.explanation).toMatch(/re-seeded in its growing mode at the small start's swing each time the swing died .*, \d+ times over \d+ more periods \(at most 4000\)/);
    expect(r.explanation).toContain("raise cycles=");
  }, 120_000);
});

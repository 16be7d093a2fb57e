// A JFET-held Wien (13.3 kΩ, 10 nF) whose peak detector (22 µF, 10 MΩ) over-corrects: the output
// grows to 13 V within 5 ms and dies, and the detector bleeds back over 10 MΩ · 22 µF = 220 s.
// Start-up called the run "silent"; it is unfinished: the loop's slow state may bring it back.
import { describe, expect, test } from "vitest";
import { runStartup, type Circuit, type StartupAnalysis } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const BOUNCE = `opamp    U1 p n o preset=general rails=(-15, 15)
resistor  R1  o   s    13.3k
capacitor C1  s   p    10n
resistor  R2  p   gnd  13.3k
capacitor C2  p   gnd  10n
resistor  Rf  o   n    22k
resistor  Rs  n   d    6.8k
jfet      J1  d   g    gnd  idss=6m pinchoff=-2
resistor  Ra  d   g    330k
resistor  Rc  c   g    330k
diode     D1  c   o
capacitor Cfil c  gnd  22u
resistor  Rb  c   gnd  10M
startup probe=o until=62m
`;

describe("a Wien whose amplitude loop over-corrects, run 62 ms", () => {
  test("is unsettled (may restart), not silent, and says to raise until=", () => {
    const circuit = elaborate(loadProgram("bounce.onset", BOUNCE).program, {}).circuit as Circuit;
    const r = runStartup(circuit, circuit.analyses.find((a) => a.kind === "startup") as StartupAnalysis);
    expect(r.verdict, r.explanation).toBe("unsettled");
    expect(r.explanation).toContain("raise until=");
    // It swung to the rails' reach: far above the 15.6 µV of noise at the probe (common practice: a
    // general op-amp's output reaches about 1.5 V short of ±15 V rails).
    expect(r.explanation).toMatch(/grew to 1\d(\.\d+)? V peak/);
  });
});

// Issue 15, a seventh acceptance pass on circuits of its own: an LC tank undamped by a small
// negative conductance and held by an ideal clip (diodes without series resistance). Its large
// first kick stops the transient at once (the ideal diodes' first step fails), so the search
// starts again small, a thousand times below, where the tank gains only 1.4 % a period: the
// orbit must still be found at the defaults, from either start, at the closed form's frequency.
import { describe, expect, test } from "vitest";
import { runPoles, runStartup, runSteady, startupAnalysisOf, type Circuit, type SteadyResult } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const L = 10e-3;
const C = 47e-9;
const TANK = `inductor  L1 t gnd 10m
capacitor C1 t gnd 47n
resistor  Rl t gnd 20k
vccs      G1 gnd t t gnd 60u
diode     D1 t k1 series=0
diode     D2 k1 gnd series=0
diode     D3 gnd k2 series=0
diode     D4 k2 t series=0
resistor  Rb t t2 1M
resistor  Rb2 t2 gnd 1M`;

const circuitOf = (text: string): Circuit => elaborate(loadProgram("acceptance-7.onset", text).program, {}).circuit!;
const steadyOf = (options: string, text = TANK): SteadyResult => {
  const circuit = circuitOf(`${text}\nsteady ${options}\n`);
  return runSteady(circuit, circuit.analyses.find((a) => a.kind === "steady")! as Parameters<typeof runSteady>[1]);
};

describe("an LC tank held by an ideal clip, slowly undamped", () => {
  test.each(["probe=t", "probe=t from=poles", "probe=t2"])("steady %s finds the orbit at 1/(2π√(LC))", (options) => {
    const result = steadyOf(options);
    expect(result.found, result.explanation).toBe(true);
    // Closed form: the lossless tank's resonance 1/(2π√(LC)) = 7341.2 Hz (the clip's harmonics move it by < 1e-5 at this Q).
    const closedForm = 1 / (2 * Math.PI * Math.sqrt(L * C));
    expect(Math.abs(result.frequency! / closedForm - 1)).toBeLessThan(5e-4);
    expect(result.stability!.verdict).toBe("stable");
  });

  test("the frequency is the poles' imaginary part (closed form of issue 15: a linear LC oscillator held by an ideal clip)", () => {
    const circuit = circuitOf(`${TANK}\npoles\n`);
    const poles = runPoles(circuit, { kind: "poles" });
    const pair = poles.poles.find((p) => p.imag > 0)!;
    const result = steadyOf("probe=t");
    expect(Math.abs(result.frequency! / (pair.imag / (2 * Math.PI)) - 1)).toBeLessThan(5e-4);
  });
});

/**
 * A Wien bridge (13.3 kΩ, 10 nF) whose gain a JFET holds, its gate fed by a peak detector (470 nF,
 * 680 kΩ): the loop over-corrects, so its orbit is unstable (a disturbance of the envelope grows).
 */
const JFET_WIEN = `opamp     U1 p n o preset=general rails=(-15, 15)
resistor  R1 o s 13.3k
capacitor C1 s p 10n
resistor  R2 p gnd 13.3k
capacitor C2 p gnd 10n
resistor  Rf o n 22k
resistor  Rs n d 9.1k
jfet      J1 d g gnd idss=6m pinchoff=-2
resistor  Ra d g 330k
resistor  Rc c g 330k
diode     D1 c o
capacitor Cf c gnd 470n
resistor  Rb c gnd 680k`;

describe("an amplitude loop that over-corrects: an unstable orbit", () => {
  test("from=poles finds the unstable orbit from=startup finds, with the same figures", () => {
    const startup = steadyOf("probe=o", JFET_WIEN);
    const poles = steadyOf("probe=o from=poles", JFET_WIEN);
    expect(startup.found, startup.explanation).toBe(true);
    expect(poles.found, poles.explanation).toBe(true);
    expect(startup.stability!.verdict).toBe("unstable");
    expect(poles.stability!.verdict).toBe("unstable");
    expect(Math.abs(poles.frequency! / startup.frequency! - 1)).toBeLessThan(5e-4);
    expect(Math.abs(poles.amplitude! / startup.amplitude! - 1)).toBeLessThan(5e-3);
  });

  test("the start-up run from the circuit's noise agrees: its amplitude loop is unstable", () => {
    // Outside the shooting: the start-up run's envelope collapses and restarts (verdict bouncing).
    const circuit = circuitOf(`${JFET_WIEN}\nstartup probe=o\n`);
    const run = runStartup(circuit, startupAnalysisOf(circuit)!);
    expect(run.verdict).toBe("bouncing");
  });
});

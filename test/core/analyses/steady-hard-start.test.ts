// A hard start: an LC tank whose rest point is stable (its negative conductance acts only through
// diodes, so it is off for small swings) but which, kicked hard enough, swings on a stable orbit
// held by a clip of four diodes each way. The steady analysis searches for that orbit from a
// large kick in the decaying pair's mode and says it is a hard start; studies do not search.
import { describe, expect, test } from "vitest";
import { runSteady, steadyVerdict, type Circuit, type SteadyResult } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const HARD = `inductor  L1 t gnd 10m
capacitor C1 t gnd 100n
resistor  Rl t gnd 10k
diode D1 t d series=0
diode D2 d t series=0
resistor Rd d gnd 10k
vccs G1 gnd t d gnd 1m
diode D3 t k1 series=0
diode D4 k1 k2 series=0
diode D5 k2 k3 series=0
diode D6 k3 gnd series=0
diode D7 gnd j1 series=0
diode D8 j1 j2 series=0
diode D9 j2 j3 series=0
diode D10 j3 t series=0
resistor  Rb t t2 1M
resistor  Rb2 t2 gnd 1M`;

/**
 * scipy 1.17 solve_ivp (Radau, rtol 1e-11) on the same state equations (C·v' = −i_L − v/Rl −
 * i_D1,D2 + g·v_d − i_clip − v/2 MΩ, L·i_L' = v, v_d solved from its node by brentq; Shockley
 * diodes Is 2.5 nA, n 1.8, at 300.15 K), started at 2.6 V and measured over its last period.
 */
const SCIPY = { frequency: 4974.791203930475, amplitude: 2.644653828586301, rms: 1.8970271076416216 };

const circuitOf = (text: string): Circuit => elaborate(loadProgram("hard-start.onset", text).program, {}).circuit!;
const steadyOf = (text: string, options: Parameters<typeof runSteady>[2] = {}): SteadyResult => {
  const circuit = circuitOf(`${text}\nsteady probe=t\n`);
  return runSteady(circuit, circuit.analyses.find((a) => a.kind === "steady")! as Parameters<typeof runSteady>[1], options);
};

describe("a hard-start LC oscillator (stable rest point, stable orbit beyond a threshold)", () => {
  test("steady finds the orbit a large disturbance reaches, within its error bars of scipy's, and calls it a hard start", () => {
    const r = steadyOf(HARD);
    expect(r.found, r.explanation).toBe(true);
    expect(r.hardStart).toBe(true);
    expect(r.predicted.starts).toBe(false);
    expect(r.stability!.verdict).toBe("stable");
    expect(r.explanation).toMatch(/hard start.*does not start by itself/);
    // Independent reference: scipy's Radau integration (see SCIPY), within the printed bars (and at most 1e-4).
    const e = r.numericalError!;
    expect(Math.abs(r.frequency! - SCIPY.frequency)).toBeLessThanOrEqual(Math.max(e.frequency, 1e-4 * SCIPY.frequency));
    expect(Math.abs(r.amplitude! - SCIPY.amplitude)).toBeLessThanOrEqual(e.amplitude);
    expect(Math.abs(r.rms! - SCIPY.rms)).toBeLessThanOrEqual(e.rms);
    // Left alone the circuit rests: as a start-up verdict, a hard start's orbit is `decaying`.
    expect(steadyVerdict(r)).toBe("decaying");
  });

  test("a study's run (hardStart: false) does not search, and answers as before", () => {
    const r = steadyOf(HARD, { hardStart: false });
    expect(r.found).toBe(false);
    expect(r.hardStart).toBe(false);
    expect(r.explanation).toMatch(/hard start, is not searched in a study/);
    expect(steadyVerdict(r)).toBe("decaying");
  });

  test("with a weaker negative conductance no orbit lies within the kick's reach: no orbit, never a fabricated one", () => {
    // g = 0.4 mS through Rd = 1 kΩ: the diodes' drop eats the gain, and a 4 V kick dies out.
    const r = steadyOf(HARD.replace("Rd d gnd 10k", "Rd d gnd 1k").replace("gnd 1m", "gnd 400u"));
    expect(r.found, r.explanation).toBe(false);
    expect(r.hardStart).toBe(false);
    expect(r.explanation).toMatch(/died out within \d+ periods: no orbit lies within that reach/);
    expect(r.transient.periods).toBeGreaterThan(0);
  });

  test("options.hardStart is checked at the door", () => {
    expect(() => steadyOf(HARD, { hardStart: "yes" as unknown as boolean })).toThrow(/options.hardStart must be true or false/);
  });
});

import { describe, expect, test } from "vitest";
import { analysisOf, runBias, runStartup, runSteady, runTransient, type Circuit, type SteadyAnalysis } from "@onset/core";
import { buildSystem } from "../../../packages/core/src/solver/system.js";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { implausibleOnOrbit, IMPLAUSIBLE_CURRENT, OperatingWatch } from "../../../packages/core/src/analyses/operating-check.js";

const build = (text: string): Circuit => buildCircuit(loadSource("t.onset", text)).circuit;

/** Off at the bias point, then a ramp to 1 kV from 1 ms to 2 ms across 0.1 Ω: 10 kA from 2 ms on (Ohm's law). */
const RAMP = `vsource V1 a gnd wave=pulse low=0 high=1k delay=1m rise=1m
resistor R1 a gnd 0.1
`;

/** The Wien bridge oscillator of the e2e tests, with the ramp above beside it (it shares only ground). */
const WIEN_AND_RAMP = `resistor  R1 o  s   10k
capacitor C1 s  p   10n
resistor  R2 p  gnd 10k
capacitor C2 p  gnd 10n
resistor  Rf o  n   22k
resistor  Rg n  gnd 10k
opamp     U1 p  n   o  preset=general
vsource V9 a gnd wave=pulse low=0 high=1k delay=1m rise=1m
resistor R9 a gnd 0.1
`;

describe("implausible operating points", () => {
  test("a diode with series=0 straight across 1 kV is reported as a warning naming the part, at its line", () => {
    const text = "vsource V1 a gnd 1k\ndiode D1 a gnd series=0\nbias\n";
    const circuit = build(text);
    const r = runBias(circuit, analysisOf(circuit, "bias"));
    const warnings = r.warnings ?? [];
    expect(warnings.map((w) => [w.part, w.diagnostic.code, w.diagnostic.severity])).toEqual([
      ["V1", "implausible-operation", "warning"],
      ["D1", "implausible-operation", "warning"],
    ]);
    const diode = warnings[1]!.diagnostic;
    expect(diode.message).toMatch(/^diode D1 carries \d\.\d{3}e\+\d+ A at the bias point, far outside any physical operating point$/);
    expect(diode.span).toEqual({ file: "t.onset", start: text.indexOf("diode"), end: text.indexOf("\n", text.indexOf("diode")) });
  });

  test("an ordinary operating point has no warnings (a diode at a few milliamperes)", () => {
    // 5 V through 1 kΩ into a diode: about 4.3 mA (Ohm's law with a ~0.7 V drop).
    const circuit = build("vsource V1 a gnd 5\nresistor R1 a k 1k\ndiode D1 k gnd\nbias\n");
    expect(runBias(circuit, analysisOf(circuit, "bias")).warnings).toBeUndefined();
  });

  test("a transient that is fine at its bias point but reaches 10 kA is reported once per part, with the worst current and its time", () => {
    const circuit = build(`${RAMP}bias\ntransient until=5m max-step=10u\n`);
    expect(runBias(circuit, analysisOf(circuit, "bias")).warnings).toBeUndefined();
    const r = runTransient(circuit, analysisOf(circuit, "transient"));
    const warnings = r.warnings ?? [];
    expect(warnings.map((w) => w.part)).toEqual(["V1", "R1"]);
    const m = /^resistor R1 carries (\S+) A at t = (\S+) (\w?)s in the transient, far outside any physical operating point$/.exec(warnings[1]!.diagnostic.message);
    expect(m).not.toBeNull();
    // Closed form: 1 kV / 0.1 Ω = 10 kA once the ramp ends at 2 ms (and never more).
    expect(Number(m![1])).toBeCloseTo(1e4, 6);
    const at = Number(m![2]) * ({ "": 1, m: 1e-3, µ: 1e-6, u: 1e-6 } as Record<string, number>)[m![3]!]!;
    expect(at).toBeGreaterThanOrEqual(2e-3);
    expect(at).toBeLessThanOrEqual(5e-3);
  });

  test("a ramp that stays below a kiloampere is not reported (1 kV across 10 Ω: 100 A)", () => {
    const circuit = build(`${RAMP.replace("0.1", "10")}transient until=5m max-step=10u\n`);
    expect(runTransient(circuit, analysisOf(circuit, "transient")).warnings).toBeUndefined();
  });

  test("a start-up run reports the part that went to 10 kA among its warnings, and an ordinary oscillator has none", () => {
    const analysis = "startup probe=o until=20m kick=noise seed=1\n";
    const bad = build(WIEN_AND_RAMP + analysis);
    const warned = runStartup(bad, analysisOf(bad, "startup"), { settledFromOrbit: false }).warnings.filter((w) => w.code === "implausible-operation");
    expect(warned.map((w) => w.message.split(" ").slice(0, 2).join(" "))).toEqual(["vsource V9", "resistor R9"]);
    expect(warned.map((w) => w.part)).toEqual(["V9", "R9"]);
    expect(warned[1]!.message).toMatch(/^resistor R9 carries 10000 A at t = \S+ m?s in the start-up run, far outside any physical operating point$/);
    const fine = build(WIEN_AND_RAMP.replace("high=1k", "high=1") + analysis);
    expect(runStartup(fine, analysisOf(fine, "startup"), { settledFromOrbit: false }).warnings.filter((w) => w.code === "implausible-operation")).toEqual([]);
  });

  test("OperatingWatch keeps each part's worst value (any sign) and when it was seen; the orbit check reads every state", () => {
    const circuit = build("vsource V1 a gnd 1\nresistor R1 a gnd 1m\n");
    const system = buildSystem(circuit);
    const a = system.nodeIndex.get("a")!;
    const state = (v: number): Float64Array => {
      const x = new Float64Array(system.n);
      x[a] = v;
      return x;
    };
    const rates = new Float64Array(system.n);
    const watch = new OperatingWatch(system);
    for (const [t, v] of [[0, 0.5], [1, -3], [2, 2]] as const) watch.check(t, state(v), rates);
    // R1 carries v / 1 mΩ: the worst is −3 V → −3 kA at t = 1 s.
    expect(watch.warnings("here").find((w) => w.part === "R1")!.diagnostic.message).toBe("resistor R1 carries -3000 A at t = 1 s here, far outside any physical operating point");
    const orbit = implausibleOnOrbit(system, [0, 0.5], [state(0.1), state(IMPLAUSIBLE_CURRENT * 2e-3)]);
    expect(orbit.find((w) => w.part === "R1")!.diagnostic.message).toBe("resistor R1 carries 2000 A at t = 500 ms on the steady orbit, far outside any physical operating point");
    expect(implausibleOnOrbit(system, [0], [state(0.1)]).find((w) => w.part === "R1")).toBeUndefined();
  });

  test("a steady analysis reports a part that reaches kiloamperes on its orbit (and none on an ordinary one)", () => {
    // A 1 kHz sine of 2 kV peak across 1 Ω in parallel with an RC: 0 A at the bias point (the
    // sine starts at 0), a 2 kA peak on the driven orbit (Ohm's law), at a quarter or three
    // quarters of a period of the sources' time.
    const text = (amp: string) => `vsource V1 a gnd wave=sine amp=${amp} freq=1k
resistor R1 a gnd 1
resistor R2 a o 1k
capacitor C1 o gnd 100n
steady probe=o
`;
    const circuit = build(text("2k"));
    const r = runSteady(circuit, analysisOf(circuit, "steady") as SteadyAnalysis);
    expect(r.found).toBe(true);
    const warned = r.warnings.filter((w) => w.code === "implausible-operation");
    expect(warned.map((w) => w.message.split(" ").slice(0, 2).join(" "))).toEqual(["vsource V1", "resistor R1"]);
    expect(warned.map((w) => w.part)).toEqual(["V1", "R1"]);
    const m = /^resistor R1 carries (\S+) A at t = (\S+) (\S?)s on the steady orbit, far outside any physical operating point$/.exec(warned[1]!.message);
    expect(m).not.toBeNull();
    expect(Math.abs(Number(m![1]))).toBeGreaterThan(1990);
    expect(Math.abs(Number(m![1]))).toBeLessThanOrEqual(2000 * (1 + 1e-9));
    const at = Number(m![2]) * ({ "": 1, m: 1e-3, µ: 1e-6 } as Record<string, number>)[m![3]!]!;
    const phase = (at * 1e3) % 1;
    expect(Math.min(Math.abs(phase - 0.25), Math.abs(phase - 0.75))).toBeLessThan(0.02);
    const fine = build(text("2"));
    expect(runSteady(fine, analysisOf(fine, "steady") as SteadyAnalysis).warnings.filter((w) => w.code === "implausible-operation")).toEqual([]);
  });
});

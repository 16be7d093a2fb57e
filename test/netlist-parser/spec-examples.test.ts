import { describe, expect, test } from "vitest";
import { elaborate, loadProgram, checkProgram, type Program } from "@onset/netlist-parser";
import type { Circuit } from "@onset/core";
import { memoryResolver } from "./support/helpers.js";

// Every example of the language's first specification (version 1, restated in docs/language.md),
// completed where it shows only a fragment, must parse and elaborate.

const amplifiers = `# shared op-amp settings
preset quick opamp gbw=10M slew=15V/us rails=(-12, 12)
`;

function build(text: string, files: Record<string, string> = {}): { program: Program; circuit: Circuit } {
  const loaded = loadProgram("main.onset", text, memoryResolver(files));
  expect(loaded.diagnostics).toEqual([]);
  const { circuit, diagnostics } = elaborate(loaded.program);
  expect(diagnostics).toEqual([]);
  expect(circuit).toBeDefined();
  return { program: loaded.program, circuit: circuit! };
}

function part(circuit: Circuit, name: string) {
  const p = circuit.parts.find((x) => x.name === name);
  if (!p) throw new Error(`no part ${name}`);
  return p;
}

describe("spec examples", () => {
  test("the statements example (title, param, include) elaborates with the include followed", () => {
    const { circuit } = build(
      `title "Workshop tuning reference, 440 Hz"
param R = 11k
param C = 33n
include "parts/amplifiers.onset"      # path relative to this file; cycles are an error
resistor Rt a gnd (R)
capacitor Ct a gnd (C)
opamp U1 a b b preset=quick
`,
      { "parts/amplifiers.onset": amplifiers },
    );
    expect(circuit.title).toBe("Workshop tuning reference, 440 Hz");
    expect(part(circuit, "Rt").value).toBe(11e3);
    expect(part(circuit, "Ct").value).toBe(33e-9);
    expect(part(circuit, "U1").options).toMatchObject({ preset: "quick", gbw: 10e6, slew: 15e6, rails: [-12, 12] });
  });

  test("the part examples elaborate with their tolerances", () => {
    const { circuit } = build(`param R = 11k
param C = 33n
resistor  Ra  o   m1   (R)±1%
capacitor Cs  m1  gnd  (2*C)±5%
pot       P1  o   p    gnd  10k  at=0.08
opamp     U1  p   n    o    preset=general
vsource   Vkick k gnd  wave=pulse low=0 high=10m width=10u
`);
    expect(part(circuit, "Ra")).toMatchObject({ kind: "resistor", nodes: ["o", "m1"], value: 11e3 });
    expect(part(circuit, "Cs").value).toBeCloseTo(66e-9, 20);
    expect(part(circuit, "P1")).toMatchObject({ nodes: ["o", "p", "gnd"], value: 10e3, options: { at: 0.08, taper: "linear" } });
    expect(part(circuit, "U1").options).toMatchObject({ preset: "general", gain: 200e3, gbw: 1e6 });
    expect(part(circuit, "Vkick").options).toMatchObject({ wave: "pulse", low: 0, high: 10e-3, width: 10e-6, period: Infinity });
    expect(circuit.tolerances).toEqual([
      { target: "Ra", nominal: 11e3, relative: 0.01, unit: "Ω", span: expect.anything() },
      { target: "Cs", nominal: 2 * 33e-9, relative: 0.05, unit: "F", span: expect.anything() },
    ]);
  });

  test("every wave form elaborates", () => {
    const { circuit } = build(`vsource Vs a gnd wave=sine amp=1 freq=1k offset=0.5 phase=90deg delay=1m
vsource Vp b gnd wave=pulse low=0 high=5 delay=1u rise=10n fall=10n width=0.5m period=1m
vsource Vw c gnd wave=steps points=[0 0, 1m 5, 2m 0]
isource In gnd d wave=noise rms=1u seed=7 corner=50k
resistor Ra a gnd 1k
resistor Rb b gnd 1k
resistor Rc c gnd 1k
resistor Rd d gnd 1k
`);
    // 90 degrees is π/2 rad (mathematics).
    expect(part(circuit, "Vs").options).toMatchObject({ amp: 1, freq: 1e3, offset: 0.5, phase: Math.PI / 2, delay: 1e-3 });
    expect(part(circuit, "Vp").options).toMatchObject({ low: 0, high: 5, delay: 1e-6, rise: 10e-9, fall: 10e-9, width: 0.5e-3, period: 1e-3 });
    expect(part(circuit, "Vw").options.points).toEqual([0, 0, 1e-3, 5, 2e-3, 0]);
    expect(part(circuit, "In").options).toMatchObject({ rms: 1e-6, seed: 7, corner: 50e3 });
  });

  test("every op-amp option elaborates, in SI units", () => {
    const { circuit } = build(`opamp U1 p n o gain=106dB gbw=1M rails=(-12, 12) headroom=1.2 rout=50 slew=0.5V/us vos=1m rin=1M
opamp U2 p n o2 supply=(vee, vcc) preset=fast
resistor Rf o n 10k
resistor Rg n gnd 10k
resistor Rp p gnd 10k
resistor R2 o2 gnd 10k
vsource Vee vee gnd -15
vsource Vcc vcc gnd 15
`);
    // 106 dB = 10^(106/20) as a voltage ratio (definition of the decibel).
    expect(part(circuit, "U1").options.gain).toBeCloseTo(Math.pow(10, 106 / 20), 6);
    expect(part(circuit, "U1").options).toMatchObject({ gbw: 1e6, rails: [-12, 12], headroom: 1.2, rout: 50, slew: 0.5e6, vos: 1e-3, rin: 1e6 });
    expect(part(circuit, "U2").options).toMatchObject({ supply: ["vee", "vcc"], preset: "fast", gbw: 10e6 });
  });

  test("the notch block example flattens into hierarchical names", () => {
    const { circuit } = build(`block notch (in, out, ref)  R=11k C=33n k=0.5
  resistor  Ra in  m1  (R)
  resistor  Rb m1  out (R)
  capacitor Cs m1  ref (2*C)
  capacitor Ca in  m2  (C)
  capacitor Cb m2  out (C)
  resistor  Rs m2  ref (k*R)
end
use N1 notch o n gnd  R=10.7k k=0.46
resistor Ro o gnd 10k
resistor Rn n gnd 10k
`);
    expect(circuit.parts.map((p) => `${p.name} ${p.nodes.join(" ")} ${p.value}`)).toEqual([
      "N1.Ra o N1.m1 10700",
      "N1.Rb N1.m1 n 10700",
      `N1.Cs N1.m1 gnd ${2 * 33e-9}`,
      "N1.Ca o N1.m2 3.3e-8",
      "N1.Cb N1.m2 n 3.3e-8",
      `N1.Rs N1.m2 gnd ${0.46 * 10.7e3}`,
      "Ro o gnd 10000",
      "Rn n gnd 10000",
    ]);
  });

  test("every analysis statement of the table elaborates", () => {
    const { circuit, program } = build(`resistor R1 a ref 1k
resistor R2 ref gnd 1k
pot P1 o a gnd 10k at=0.3
opamp U1 a ref o
vsource Vin in gnd 0
resistor Rin in a 1k
bias
transient until=20m max-step=1u start=rest probes=(a, (o, ref), R1.i)
startup probe=o until=50m max-step=2u kick=noise level=1u seed=3
startup probe=(o, ref)
startup probe=o kick=power-on ramp=2m temperature=60 seeds=20 seed=7
response from=Vin to=o start=10 stop=100k per-decade=20
poles
sweep P1.at from=0.1 to=0.9 steps=9
sweep R1 from=1k to=10k steps=4 log
sweep U1.gbw from=1M to=2M step=0.5M
tolerance runs=200 seed=5 dist=uniform
spec frequency=1k±2% thd<0.5% startup<40m amplitude=3..5 yield>99%
`);
    expect(checkProgram(program).filter((d) => d.severity === "error")).toEqual([]);
    const strip = (x: unknown) => JSON.parse(JSON.stringify(x, (k, v) => (k === "span" || k === "optionSpans" ? undefined : v === Infinity ? "inf" : v)));
    expect(strip(circuit.analyses)).toEqual([
      { kind: "bias" },
      { kind: "transient", until: 20e-3, maxStep: 1e-6, start: "rest", probes: [{ kind: "node", node: "a" }, { kind: "difference", plus: "o", minus: "ref" }, { kind: "current", part: "R1" }] },
      { kind: "startup", probe: { kind: "node", node: "o" }, until: 50e-3, maxStep: 2e-6, kick: "noise", level: 1e-6, seed: 3 },
      { kind: "startup", probe: { kind: "difference", plus: "o", minus: "ref" }, until: "auto", kick: "thermal" },
      { kind: "startup", probe: { kind: "node", node: "o" }, until: "auto", kick: "power-on", seed: 7, temperature: 60, ramp: 2e-3, seeds: 20 },
      { kind: "response", from: "Vin", to: { kind: "node", node: "o" }, start: 10, stop: 100e3, perDecade: 20 },
      { kind: "poles" },
      { kind: "sweep", target: "P1.at", from: 0.1, to: 0.9, steps: 9, log: false },
      { kind: "sweep", target: "R1", from: 1e3, to: 10e3, steps: 4, log: true },
      { kind: "sweep", target: "U1.gbw", from: 1e6, to: 2e6, step: 0.5e6, log: false },
      { kind: "tolerance", runs: 200, seed: 5, dist: "uniform" },
      {
        kind: "spec",
        criteria: [
          { metric: "frequency", test: "within", low: 980, high: 1020, text: "frequency=1k±2%" },
          { metric: "thd", test: "below", limit: 0.005, text: "thd<0.5%" },
          { metric: "startup", test: "below", limit: 0.04, text: "startup<40m" },
          { metric: "amplitude", test: "within", low: 3, high: 5, text: "amplitude=3..5" },
          { metric: "yield", test: "above", limit: 0.99, text: "yield>99%" },
        ],
      },
    ]);
    for (const a of circuit.analyses) expect(a.span?.file).toBe("main.onset");
  });

  test("lamp, thermistor and jfet lines elaborate to SI values (mW/K is a dissipation constant)", () => {
    const { program, circuit } = build(
      "lamp L1 a gnd 50 hot=500 rated=12V tau=80m\nthermistor TH1 a b 4.7k beta=3500 dissipation=0.5mW/K tau=3s\njfet J1 b g gnd idss=8mA pinchoff=-2.5V lambda=0.01\nresistor R1 g gnd 1M\n",
    );
    expect(part(circuit, "L1")).toMatchObject({ value: 50, options: { hot: 500, rated: 12, tau: 0.08 } });
    expect(part(circuit, "TH1")).toMatchObject({ value: 4700, options: { beta: 3500, dissipation: 0.5e-3, tau: 3 } });
    expect(part(circuit, "J1")).toMatchObject({ options: { idss: 8e-3, pinchoff: -2.5, lambda: 0.01, type: "n" } });
    expect(checkProgram(program)).toEqual([]);
  });

  test("temperature= is the ambient of a thermistor or lamp under any kick, so it is not an unused option there", () => {
    const heated = build("thermistor TH1 a gnd 10k beta=3500 dissipation=1m tau=1\nresistor R1 a gnd 1k\nstartup probe=a kick=none temperature=40\n");
    expect(checkProgram(heated.program)).toEqual([]);
    expect(heated.circuit.analyses[0]).toMatchObject({ kind: "startup", temperature: 40 });
  });

  test("tolerances: relative, absolute and on a parameter", () => {
    const { circuit } = build(`param R = 11k±1%
resistor Ra a gnd (R)
resistor Rb a gnd (R)
vsource Vos a gnd 0±2mV
capacitor C1 a gnd 10n+-5%
`);
    expect(circuit.tolerances.map(({ span: _s, ...t }) => t)).toEqual([
      { target: "R", nominal: 11e3, relative: 0.01, unit: "Ω" },
      { target: "Vos", nominal: 0, absolute: 2e-3, unit: "V" },
      { target: "C1", nominal: 10e-9, relative: 0.05, unit: "F" },
    ]);
  });
});

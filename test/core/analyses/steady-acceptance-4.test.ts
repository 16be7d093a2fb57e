// Issue 15, an acceptance pass on circuits of its own (not the examples, not the other steady
// tests' topologies): the steady analysis against closed forms, the odex ODE integrator and the
// settled start-up run; the probe does not change the orbit; no orbit where there is none.
import { describe, expect, test } from "vitest";
import { runSteady, type Circuit, type SteadyResult } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";
import { settled } from "../../support/clipped-oscillators.js";
import { lampAmplitude } from "../../e2e/support/steady-circuits.js";
import { expectSteadyAgreesWithSettled } from "./steady-agreement.js";

const circuitOf = (text: string): Circuit => elaborate(loadProgram("acceptance-4.onset", text).program, {}).circuit!;
const node = (name: string) => ({ kind: "node", node: name }) as const;
const steadyOn = (circuit: Circuit, probe: Parameters<typeof runSteady>[1]["probe"], extra: object = {}): SteadyResult =>
  runSteady(circuit, { kind: "steady", probe, ...extra });
const rel = (a: number, b: number) => Math.abs(a / b - 1);
/** |μ| of the largest non-trivial Floquet multiplier. */
const largest = (r: SteadyResult) => Math.hypot(r.stability!.largest!.re, r.stability!.largest!.im);

/** The same orbit seen from two probes: one approach and one shooting whatever the probe, so the same frequency and multipliers to the last bit. */
function expectSameOrbit(a: SteadyResult, b: SteadyResult): void {
  expect(a.found && b.found).toBe(true);
  expect(b.frequency).toBe(a.frequency);
  expect(b.multipliers).toEqual(a.multipliers);
  expect(b.multipliers.length).toBeGreaterThan(0);
}

/** Four C–R sections (15 nF, 3.3 kΩ) into the virtual ground of an inverting stage of gain 20.6 (18.4 needed), back-to-back diodes through 47 kΩ across its 68 kΩ. */
const CR_LADDER_4 = `capacitor C1 o a   15n
resistor  R1 a gnd 3.3k
capacitor C2 a b   15n
resistor  R2 b gnd 3.3k
capacitor C3 b c   15n
resistor  R3 c gnd 3.3k
capacitor C4 c d   15n
resistor  R4 d n   3.3k
resistor  Rf n o   68k
resistor  Rd n k   47k
diode     D1 k o
diode     D2 o k
opamp     U1 gnd n o preset=general rails=(-10, 10)
`;

/** A three-section R–C ladder (6.8 kΩ, 4.7 nF) read through an ideal buffer into an inverting stage of the gain given, clipping at ±3 V, no amplifier dynamics. */
const rcLadder3 = (rf: string) => `resistor  R1 o a   6.8k
capacitor C1 a gnd 4.7n
resistor  R2 a b   6.8k
capacitor C2 b gnd 4.7n
resistor  R3 b c   6.8k
capacitor C3 c gnd 4.7n
vcvs      E1 x gnd c gnd 1
resistor  Ri x n   1k
resistor  Rf n o   ${rf}
opamp     U1 gnd n o preset=ideal gbw=inf rout=0 rails=(-3, 3)
`;

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
    // one approach, one shooting, whatever the probe: the same orbit to the last bit
    expectSameOrbit(output, temperature);
    expect(temperature.unit).toBe("K");
    // Source: closed form (docs/language.md's lamp law at R_lamp = Rf/2): 509.930 K, 8.8346 V.
    const ambient = 300.15;
    const theta = ambient * (340 / 180) ** (1 / 1.2);
    expect(rel(temperature.offset!, theta)).toBeLessThan(1e-4);
    expect(rel(output.amplitude!, lampAmplitude(680, 180, 800, 6))).toBeLessThan(1e-3);
    // The temperature follows the power, v²: its tones are the even harmonics, with no fundamental
    // to measure distortion against (mathematics: sin² = (1 − cos 2ωt)/2). No THD, and a warning.
    expect(temperature.thd).toBeNull();
    expect(temperature.warnings.map((w) => w.code)).toContain("orbit-without-fundamental");
    expect(temperature.harmonics[1]!.dBc).toBeCloseTo(0, 9);
    expect(output.thd!).toBeLessThan(1e-2);
    expect(output.warnings.map((w) => w.code)).not.toContain("orbit-without-fundamental");
  });

  // A thermistor-held Wien (2.2 kΩ, 47 nF; 6.8 kΩ bead over 2.7 kΩ) beside a 5 V supply node the
  // oscillation never reaches. On that node the approach saw no swing and answered "no periodic
  // orbit: … the oscillation died out"; on the difference (o, p) it ran 487 periods, on the
  // output 64, and their multipliers differed in the seventh digit.
  const thermistor = circuitOf(`vsource   Vb b gnd 5
resistor  Rx b gnd 10k
${wien("2.2k", "47n", "2.2k", "47n")}thermistor TH1 o n 6.8k beta=3950 dissipation=80uW/K tau=0.3
resistor  Rg n gnd 2.7k
opamp     U1 p n o preset=general rails=(-15, 15)
`);
  test("a thermistor-held Wien: a supply node, a difference and the output give one orbit; the supply's figures are its DC level, with no THD", () => {
    const output = steadyOn(thermistor, node("o"));
    const supply = steadyOn(thermistor, node("b"));
    const across = steadyOn(thermistor, { kind: "difference", plus: "o", minus: "p" });
    expectSameOrbit(output, supply);
    expectSameOrbit(output, across);
    expect(output.transient.periods).toBe(supply.transient.periods);
    expect(supply.offset).toBeCloseTo(5, 9);
    expect(supply.amplitude!).toBeLessThan(1e-9);
    expect(Number.isFinite(supply.thd)).toBe(false); // null in JSON (0/0 in the API)
    // Source: closed form, the Wien's output across its arms is 2/3 of the output at f₀ (phase 0): |o − p| ≈ (2/3)|o|
    expect(rel(across.harmonics[0]!.amplitude, (2 / 3) * output.harmonics[0]!.amplitude)).toBeLessThan(2e-3);
  });
});

/** THD over harmonics 2 … 10 of a steady result (the odex references measure ten). */
const thd10 = (r: SteadyResult) => Math.hypot(...r.harmonics.slice(1, 10).map((h) => h.amplitude)) / r.harmonics[0]!.amplitude;

describe("linear oscillators held by an ideal clip: the closed form and the odex ODE integrator", () => {
  // gain 29.29: 1 % over the 29 the ladder needs
  const R = 6.8e3;
  const C = 4.7e-9;
  const ladder = circuitOf(rcLadder3("29.29k"));
  test("R–C ladder: √6/(2πRC) (closed form, the gain the clip leaves is 29) and its state equations under odex; the inner node gives the same orbit", () => {
    const out = steadyOn(ladder, node("o"));
    const inner = steadyOn(ladder, node("b"));
    expectSameOrbit(out, inner);
    // Source: closed form, the ladder's phase crossing ω = √6/(RC) — 12198.0 Hz
    expect(rel(out.frequency!, Math.sqrt(6) / (2 * Math.PI * R * C))).toBeLessThan(5e-5);
    // Source: odex ODE integrator on the ladder's state equations with v_o = clip(−29.29·v_c, ±3 V) — 12197.75 Hz, THD 1.558 %
    const vo = (y: number[]) => Math.max(-3, Math.min(3, -29.29 * y[2]!));
    const reference = settled(
      (y) => [(vo(y) - 2 * y[0]! + y[1]!) / (R * C), (y[0]! - 2 * y[1]! + y[2]!) / (R * C), (y[1]! - y[2]!) / (R * C)],
      [0.1, 0, 0],
      vo,
      0.06,
      20,
    );
    expect(rel(out.frequency!, reference.frequency)).toBeLessThan(1e-5);
    // the model's clip has a 1 mV knee: the peak sits 6 mV under the rail, the harmonics move by a few parts in 1000
    expect(rel(out.amplitude!, 3)).toBeLessThan(3e-3);
    expect(rel(thd10(out), reference.thd)).toBeLessThan(1e-2);
    expect(out.stability!.verdict).toBe("stable");
    expect(largest(out)).toBeLessThan(1);
  });

  test("an LC tank (33 mH with 2.5 Ω, 4.7 nF) current-fed by an ideal clipping stage: 1/(2π√LC) (closed form); the coil's current gives the same orbit", () => {
    const tank = circuitOf(`inductor  L1 t gnd 33m series=2.5
capacitor C1 t gnd 4.7n
opamp     U1 t n o preset=ideal gbw=inf rout=0 rails=(-1.5, 1.5)
resistor  Rf o n 3.3k
resistor  Rg n gnd 1k
resistor  Rfb o t 470k
`);
    const v = steadyOn(tank, node("t"));
    const i = steadyOn(tank, { kind: "current", part: "L1" });
    expectSameOrbit(v, i);
    // Source: closed form, ω² = 1/(LC) − (r/L)² for a coil with series r (12779.6 Hz); the clip's
    // harmonics, cut by the tank's Q of about 100, move it by parts in 1e6 (Groszkowski 1933)
    const w2 = 1 / (33e-3 * 4.7e-9) - (2.5 / 33e-3) ** 2;
    expect(rel(v.frequency!, Math.sqrt(w2) / (2 * Math.PI))).toBeLessThan(5e-5);
    // the coil's current at the fundamental is v/(jωL) (closed form; its 2.5 Ω is 1e-3 of ωL)
    expect(rel(i.harmonics[0]!.amplitude, v.harmonics[0]!.amplitude / (2 * Math.PI * v.frequency! * 33e-3))).toBeLessThan(2e-3);
    expect(v.stability!.verdict).toBe("stable");
  });
});

describe("nonlinear oscillators against the settled start-up run (frequency 0.05 %, amplitude 0.5 %, THD 2 %)", () => {
  // Unequal Wien arms (threshold gain 1 + R1/R2 + C2/C1, about 2; gain 1 + 8.2k/6.8k = 2.21),
  // back-to-back diodes with 8.2 kΩ across the whole feedback resistor.
  const unequalWien = (arms: string, preset: string) => `${arms}resistor  Rf o n   8.2k
resistor  Rg n gnd 6.8k
resistor  Rd o k   8.2k
diode     D1 k n
diode     D2 n k
opamp     U1 p n o preset=${preset} rails=(-9, 9)
startup probe=o until=auto
`;
  const circuits: Record<string, string> = {
    "unequal Wien, 18.7 Hz": unequalWien(wien("120k", "100n", "180k", "33n"), "general"),
    "unequal Wien, 872 Hz": unequalWien(wien("12k", "22n", "18k", "6.8n"), "general"),
    "unequal Wien, 38.6 kHz (gbw 10 MHz)": unequalWien(wien("1.5k", "3.3n", "2.7k", "1.2n"), "fast"),
    // four C–R sections into the virtual ground of an inverting stage of gain 20.6 (18.4 needed)
    "C–R ladder, four sections, diode limiter, 2.65 kHz": `${CR_LADDER_4}startup probe=o until=auto
`,
    // a twin-T (15 kΩ, 10 nF, shunt 0.42·R) straight into the inverting input, positive feedback
    // 1.5k/40.5k softened by diodes: 1.076 kHz, clipping at the rails
    "twin-T in the negative feedback, 1.08 kHz": `resistor  Ra o  m1  15k
resistor  Rb m1 n   15k
capacitor Cs m1 gnd 20n
capacitor Ca o  m2  10n
capacitor Cb m2 n   10n
resistor  Rs m2 gnd 6.3k
resistor  Rp1 o p   39k
resistor  Rp2 p gnd 1.5k
resistor  Rq  p q   220
diode     D1  q gnd
diode     D2  gnd q
opamp     U1  p n o preset=precision rails=(-12, 12)
startup probe=o until=auto
`,
    // a 1 mH (1.2 Ω) ∥ 100 nF tank fed from a non-inverting stage of gain 4.2 through 15 kΩ, held by diodes through 100 Ω
    "LC tank with a diode limiter, 15.9 kHz": `inductor  L1 t gnd 1m series=1.2
capacitor C1 t gnd 100n
resistor  Rt t gnd 22k
opamp     U1 t n o preset=general rails=(-12, 12)
resistor  Rf o n 15k
resistor  Rg n gnd 4.7k
resistor  Rfb o t 15k
resistor  Rl t l 100
diode     D1 l gnd
diode     D2 gnd l
startup probe=t until=auto
`,
  };
  test.each(Object.keys(circuits))("%s", (name) => {
    // Source: the start-up run from thermal noise to settled (its own step control).
    expectSteadyAgreesWithSettled(circuitOf(circuits[name]!));
  });

  test("a quadrature oscillator (two integrators, 10 kΩ, 6.8 nF, and an inverter; diode-damped): the settled start-up run; both outputs and a capacitor's current give one orbit", () => {
    const quadrature = circuitOf(`resistor  R1 o3 n1  10k
capacitor C1 n1 o1  6.8n
opamp     U1 gnd n1 o1 preset=general rails=(-12, 12)
vccs      G1 n1 gnd o1 gnd 2u
resistor  Rl n1 k   33k
diode     D1 k  o1
diode     D2 o1 k
resistor  R2 o1 n2  10k
capacitor C2 n2 o2  6.8n
opamp     U2 gnd n2 o2 preset=general rails=(-12, 12)
resistor  R3 o2 n3  10k
resistor  R4 n3 o3  10k
opamp     U3 gnd n3 o3 preset=general rails=(-12, 12)
startup probe=o1 until=auto
`);
    expectSteadyAgreesWithSettled(quadrature);
    const [sine, cosine, current] = [steadyOn(quadrature, node("o1")), steadyOn(quadrature, node("o2")), steadyOn(quadrature, { kind: "current", part: "C2" })];
    expectSameOrbit(sine, cosine);
    expectSameOrbit(sine, current);
    // Source: closed form — the second integrator's capacitor carries C·dv/dt: |i| = ωC·|v_o2| at the fundamental
    expect(rel(current.harmonics[0]!.amplitude, 2 * Math.PI * sine.frequency! * 6.8e-9 * cosine.harmonics[0]!.amplitude)).toBeLessThan(1e-3);
    // near 1/(2πRC) = 2340.5 Hz (closed form), pulled 0.25 % by the amplifiers' 1 MHz gain-bandwidth
    expect(rel(sine.frequency!, 1 / (2 * Math.PI * 10e3 * 6.8e-9))).toBeLessThan(5e-3);
    // the trivial multiplier, given apart: 1 for the exact orbit (a shift along it)
    expect(Math.abs(Math.hypot(sine.trivialMultiplier!.re, sine.trivialMultiplier!.im) - 1)).toBeLessThan(1e-5);
  });
});

describe("runSteady checks its arguments at the door (README: an OnsetError with code bad-argument, never a TypeError from inside)", () => {
  // What the API took before: a missing probe was a TypeError; cycles 0, −3 or NaN and from "bias"
  // answered "no periodic orbit … Newton did not converge at t = 0 s" for a circuit that
  // oscillates; maxStep −1 ran 141 periods before "no periodic orbit"; a startup analysis ran as a steady one.
  const wienDiodes = circuitOf(`${wien("3.3k", "47n", "3.3k", "47n")}resistor  Rf o n   22k
resistor  Rg n gnd 10k
diode     D1 o n
diode     D2 n o
opamp     U1 p n o preset=general rails=(-15, 15)
`);
  const probe = node("o");
  test.each([
    ["no probe", { kind: "steady" }, /^runSteady: analysis\.probe is required/],
    ["a probe that is not one", { kind: "steady", probe: "o" }, /^runSteady: analysis\.probe must be a probe/],
    ["cycles 0", { kind: "steady", probe, cycles: 0 }, /^runSteady: analysis\.cycles must be a whole number from 1 to 100000, got 0/],
    ["cycles 2.5", { kind: "steady", probe, cycles: 2.5 }, /^runSteady: analysis\.cycles must be a whole number/],
    ["cycles NaN", { kind: "steady", probe, cycles: NaN }, /^runSteady: analysis\.cycles must be a whole number/],
    ["from bias", { kind: "steady", probe, from: "bias" }, /^runSteady: analysis\.from must be one of "startup", "poles", got "bias"/],
    ["maxStep −1", { kind: "steady", probe, maxStep: -1 }, /^runSteady: analysis\.maxStep must be a finite number above 0/],
    ["harmonics 1", { kind: "steady", probe, harmonics: 1 }, /^runSteady: analysis\.harmonics must be a whole number from 2 to 1000/],
    ["a startup analysis", { kind: "startup", probe, until: "auto" }, /^runSteady: analysis must be a steady analysis/],
  ])("%s", (_, analysis, message) => {
    let error: unknown;
    try {
      runSteady(wienDiodes, analysis as never);
    } catch (e) {
      error = e;
    }
    expect(error).toMatchObject({ diagnostic: { code: "bad-argument" } });
    expect((error as Error).message).toMatch(message);
  });
  test("no circuit: bad-argument too", () => {
    expect(() => runSteady(null as never, { kind: "steady", probe })).toThrow(/^runSteady: circuit must be an object/);
  });
});

describe("no orbit where there is none, with the poles' verdict", () => {
  test.each([
    ["the buffered R–C ladder at gain 27 (29 needed)", rcLadder3("27k"), /^no periodic orbit: the circuit does not oscillate — the poles' dominant pair at 11\.86 kHz decays at 1031 \/s \(left half-plane\)/],
    ["an RC filter on a DC source", `vsource   V1 in gnd 5
resistor  R1 in o  10k
capacitor C1 o gnd 1u
`, /^no periodic orbit: the circuit does not oscillate — the poles at the bias point are all real and none grows/],
    ["a resistive divider", `vsource   V1 in gnd 9
resistor  R1 in o  10k
resistor  R2 o gnd 4.7k
`, /^no periodic orbit: the circuit does not oscillate/],
  ])("%s", (_, text, explanation) => {
    const r = steadyOn(circuitOf(text), node("o"));
    expect(r).toMatchObject({ found: false, frequency: null, amplitude: null, thd: null, multipliers: [], stability: null });
    expect(r.explanation).toMatch(explanation);
  });
});

describe("driven circuits: the drive's period, closed forms and the odex ODE integrator", () => {
  test("a 3.3 kHz sine (2.5 V, 30°, offset 0.4 V) into a two-pole RC: |H(jω)| and the offset (closed form), THD at the numerical floor, multipliers e^(pT) of its poles (closed form)", () => {
    const rc = circuitOf(`vsource   V1 in gnd wave=sine amp=2.5 freq=3.3k phase=30deg offset=0.4
resistor  R1 in a  4.7k
capacitor C1 a gnd 6.8n
resistor  R2 a o  10k
capacitor C2 o gnd 2.2n
`);
    const r = steadyOn(rc, node("o"));
    expect(r).toMatchObject({ found: true, kind: "driven", from: "driven" });
    expect(r.period).toBe(1 / 3300);
    const [t1, t2, t12] = [4.7e3 * 6.8e-9, 10e3 * 2.2e-9, 4.7e3 * 2.2e-9];
    const w = 2 * Math.PI * 3300;
    // Source: closed form, H(s) = 1/(1 + s(τ₁ + τ₂ + τ₁₂) + s²τ₁τ₂)
    const H = 1 / Math.hypot(1 - w * w * t1 * t2, w * (t1 + t2 + t12));
    expect(rel(r.amplitude!, 2.5 * H)).toBeLessThan(1e-5);
    expect(Math.abs(r.offset! - 0.4)).toBeLessThan(1e-7);
    // a linear circuit adds no harmonics: what is left is the integrator's floor, far below −120 dBc
    expect(r.thd!).toBeLessThan(1e-6);
    // Source: closed form, the poles p of 1 + s(τ₁ + τ₂ + τ₁₂) + s²τ₁τ₂ give the multipliers e^(pT)
    const b = t1 + t2 + t12;
    const d = Math.sqrt(b * b - 4 * t1 * t2);
    const slow = Math.exp(((-b + d) / (2 * t1 * t2)) * r.period!);
    expect(rel(largest(r), slow)).toBeLessThan(1e-2);
    expect(r.stability!.verdict).toBe("stable");
    // a driven orbit has no trivial multiplier
    expect(r.trivialMultiplier).toBeNull();
  });

  test("a 5 kHz, 3 V sine through 2.2 kΩ into back-to-back diodes (series 0) and 1 nF: amplitude and THD of its state equation under odex", () => {
    const clipper = circuitOf(`vsource   V1 in gnd wave=sine amp=3 freq=5k
resistor  R1 in o  2.2k
diode     D1 o gnd series=0
diode     D2 gnd o series=0
capacitor C1 o gnd 1n
`);
    const r = steadyOn(clipper, node("o"));
    expect(r).toMatchObject({ found: true, kind: "driven", frequency: 5000 });
    // Source: odex ODE integrator on C·dv/dt = (v_in − v)/R − 2·Is·sinh(v/(n·V_T)), Is 2.5 nA, n 1.8,
    // V_T = kT/q at 300.15 K (the diode defaults, docs/language.md) — 0.604510 V, THD (2–10) 31.624 %
    const nVt = 1.8 * ((1.380649e-23 * 300.15) / 1.602176634e-19);
    const reference = settled(
      (y) => [((3 * Math.sin(2 * Math.PI * 5e3 * y[1]!) - y[0]!) / 2.2e3 - 2 * 2.5e-9 * Math.sinh(y[0]! / nVt)) / 1e-9, 1],
      [0, 0],
      (y) => y[0]!,
      24 / 5e3,
      10,
    );
    expect(rel(r.harmonics[0]!.amplitude, reference.harmonics[0]!)).toBeLessThan(1e-5);
    expect(rel(thd10(r), reference.thd)).toBeLessThan(1e-4);
  });
});

describe("from=poles and cycles=", () => {
  test("a four-section C–R ladder: from the poles' 2562 Hz (3.3 % off the orbit) and after only 2 periods of transient, the same orbit", () => {
    const ladder = circuitOf(CR_LADDER_4);
    const fromStartup = steadyOn(ladder, node("o"));
    const fromPoles = steadyOn(ladder, node("o"), { from: "poles" });
    const short = steadyOn(ladder, node("o"), { cycles: 2 });
    expect(fromPoles.from).toBe("poles");
    for (const r of [fromPoles, short]) {
      expect(r.found).toBe(true);
      // the orbit's own tolerance: the shooting stops within a hundredth of the step control's accuracy
      expect(rel(r.frequency!, fromStartup.frequency!)).toBeLessThan(1e-6);
      expect(rel(r.amplitude!, fromStartup.amplitude!)).toBeLessThan(1e-5);
      expect(Math.abs(largest(r) - largest(fromStartup))).toBeLessThan(1e-4);
    }
    expect(fromPoles.transient.periods).toBeLessThanOrEqual(4);
    expect(short.transient.periods).toBeLessThanOrEqual(2 * 5);
  });
});

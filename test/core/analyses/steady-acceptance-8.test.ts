// Issue 15, an eighth acceptance pass on circuits of its own, each modelled by hand as an ODE and
// integrated by scipy 1.17 (solve_ivp Radau, rtol 1e-11, atol 1e-14): the periodic orbit by a
// Poincaré map iterated to 1e-12, its figures on 8192 uniform points of one period, the largest
// Floquet multiplier by a central-difference monodromy (and, for the two-state circuits, by
// Liouville's formula exp(∮ div f dt), which agrees to 1e-9). Diodes: Is 1 nA, n 2, series=0,
// kT/q at 300.15 K, the 1e-12 S junction leak included. At the defaults every figure must lie
// within its printed error bar.
import { describe, expect, test } from "vitest";
import { runSteady, type Circuit, type SteadyResult } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";
import { expectFiguresWithinBars } from "../../support/steady-bars.js";

const PAIR = (node: string) => `diode D1 ${node} gnd saturation=1n emission=2 series=0
diode D2 gnd ${node} saturation=1n emission=2 series=0`;

/** A bridge-excitation Wien network around an ideal gain block of 3.3, a diode pair across the shunt arm. */
const WIEN = `vcvs      E1 o gnd p gnd 3.3
resistor  R1 o a 10k
capacitor C1 a p 10n
resistor  R2 p gnd 10k
capacitor C2 p gnd 10n
${PAIR("p")}`;

/** A buffer from node d into three C–R sections (10 nF, 5.1k) ending at node c. */
const BUFFERED_LADDER = `vcvs      E2 o gnd d gnd 1
capacitor C1 o a 10n
resistor  R1 a gnd 5.1k
capacitor C2 a b 10n
resistor  R2 b gnd 5.1k
capacitor C3 b c 10n
resistor  R3 c gnd 5.1k`;

/** A cable-tracer tone: three C–R sections, an inverting gain of 40, a soft diode clip (10k, 1 nF), a buffer. */
const PHASE = `vcvs      E1 e gnd gnd c 40
resistor  Ro e d 10k
capacitor Cd d gnd 1n
${PAIR("d")}
${BUFFERED_LADDER}`;

/** A tuning-reference LC tank (47 mH, 220 nF, 10k) undamped by 150 µS and held by a diode pair. */
const TANK = `inductor  L1 v gnd 47m
capacitor C1 v gnd 220n
resistor  Rl v gnd 10k
vccs      G1 gnd v v gnd 150u
${PAIR("v")}`;

/** A half-wave rectifier (100 Ω, diode, 100 µF, 1k load) on a 10 V, 50 Hz winding. */
const RECTIFIER = `vsource   V1 s gnd wave=sine amp=10 freq=50
resistor  Rs s a 100
diode     D1 a k saturation=1n emission=2 series=0
capacitor Cr k gnd 100u
resistor  RL k gnd 1k`;

const steadyOf = (text: string, options: string): SteadyResult => {
  const circuit: Circuit = elaborate(loadProgram("acceptance-8.onset", `${text}\nsteady ${options}\n`).program, {}).circuit!;
  return runSteady(circuit, circuit.analyses.find((a) => a.kind === "steady")! as Parameters<typeof runSteady>[1]);
};

interface Reference {
  readonly frequency: number;
  readonly amplitude: number;
  readonly rms: number;
  readonly thd: number;
  readonly largest: number;
}

// scipy references (see the head of this file).
const CASES: readonly (readonly [string, string, string, Reference])[] = [
  ["Wien with a diode limiter", WIEN, "probe=o", { frequency: 1758.335849, amplitude: 1.765912200, rms: 1.241495369, thd: 0.0639085940, largest: 0.0014854738 }],
  ["phase-shift ladder with a soft clip", PHASE, "probe=o", { frequency: 1189.766150, amplitude: 0.5135412548, rms: 0.3611443231, thd: 0.0183199137, largest: 0.2849697511 }],
  ["LC tank held by a diode pair", TANK, "probe=v", { frequency: 1564.891339, amplitude: 0.5704145337, rms: 0.4034094873, thd: 0.0061544193, largest: 0.4991728057 }],
  ["driven rectifier", RECTIFIER, "probe=k", { frequency: 50, amplitude: 0.4294594916, rms: 5.807371128, thd: 0.4412180754, largest: 0.4836902630 }],
];

describe("steady figures against scipy, within their printed error bars at the defaults", () => {
  test.each(CASES)("%s", (_name, text, options, reference) => {
    const result = steadyOf(text, options);
    expectFiguresWithinBars(result, reference);
    const bars = result.numericalError!;
    expect(Math.abs(result.thd! - reference.thd)).toBeLessThanOrEqual(bars.thd);
    expect(result.stability!.verdict).toBe("stable");
    // The largest multiplier (listed first) within its printed bar of the reference.
    const largest = result.stability!.largest!;
    expect(result.multipliers[0]).toEqual(largest);
    expect(Math.abs(Math.hypot(largest.re, largest.im) - reference.largest)).toBeLessThanOrEqual(result.multiplierError![0]!);
  });

  test("the driven orbit's period is the drive's (closed form: 1/50 Hz)", () => {
    const result = steadyOf(RECTIFIER, "probe=k");
    expect(result.period).toBe(0.02);
    expect(result.trivialMultiplier).toBeNull();
  });
});

describe("probe independence on the LC tank", () => {
  test("the node, the inductor's current and the transconductor's current give one orbit", () => {
    const [v, inductor, source] = ["probe=v", "probe=L1.i", "probe=G1.i"].map((p) => steadyOf(TANK, p));
    for (const other of [inductor!, source!]) {
      expect(other.frequency).toBe(v!.frequency);
      expect(other.stability!.largest).toEqual(v!.stability!.largest);
    }
    // G1.i = 150 µS × v exactly, so its swing and THD are the node's.
    expect(Math.abs(source!.amplitude! / (150e-6 * v!.amplitude!) - 1)).toBeLessThan(1e-9);
    expect(Math.abs(source!.thd! / v!.thd! - 1)).toBeLessThan(1e-9);
  });
});

describe("an LC tank undamped by a transconductor with nothing to limit it", () => {
  const UNLIMITED = `inductor L1 v gnd 47m
capacitor C1 v gnd 220n
resistor  Rl v gnd 10k
vccs      G1 gnd v v gnd 150u`;
  test("a long wait (cycles=100000) lets the swing overflow: no orbit, because it grew without bound, not 'died out'", () => {
    // Closed form: the pair grows at (150 µS − 100 µS)/(2·220 nF) = 113.6 /s, about e^0.0726 a period, so it never levels off.
    const result = steadyOf(UNLIMITED, "probe=v cycles=100000");
    expect(result.found).toBe(false);
    expect(result.explanation).toMatch(/grew without bound/);
    expect(result.explanation).not.toMatch(/died out/);
  });
});

describe("a C–R ladder whose capacitors all float", () => {
  // Three 10 nF in series with 5.1k shunts, driven by an ideal buffer of a memoryless diode clip
  // after an inverting gain of 31: no capacitor touches ground, so C·(1, 1, …) = 0 and inverse
  // iteration started from all ones found no growing mode ("no periodic orbit searched").
  const LADDER = `vcvs      E1 e gnd gnd c 31
resistor  Ro e d 10k
${PAIR("d")}
${BUFFERED_LADDER}`;
  test("is searched, and oscillates near the ladder's 1/(2π√6·RC) = 1274.0 Hz", () => {
    const result = steadyOf(LADDER, "probe=o");
    expect(result.found, result.explanation).toBe(true);
    // Closed form (first harmonic): the ladder turns −180° at 1/(2π√6·RC); the clip's 0.7 % of harmonics move it by under 0.2 %.
    expect(Math.abs(result.frequency! / (1 / (2 * Math.PI * Math.sqrt(6) * 5.1e3 * 10e-9)) - 1)).toBeLessThan(2e-3);
    expect(result.stability!.verdict).toBe("stable");
    // scipy Radau (rtol 1e-11, the clip's node solved by brentq at every evaluation): 1272.882043 Hz,
    // rms 0.3165006316 V, THD 0.7238368 %, amplitude 0.4484964670 V (max − min of 2048 points, within 5e-7).
    const bars = result.numericalError!;
    expect(Math.abs(result.frequency! - 1272.882043)).toBeLessThanOrEqual(bars.frequency);
    expect(Math.abs(result.rms! - 0.3165006316)).toBeLessThanOrEqual(bars.rms);
    expect(Math.abs(result.thd! - 0.007238368)).toBeLessThanOrEqual(bars.thd);
    expect(Math.abs(result.amplitude! - 0.448496467)).toBeLessThanOrEqual(bars.amplitude + 5e-7);
  });
});

// Issue 15, a ninth acceptance pass on circuits of its own (topologies the other passes did not
// use): a four-section R–C ladder with a soft diode clip, a twin-T in an op-amp loop limited by
// stacked diodes, an unequal-arm Wien held by a lamp, a JFET Colpitts with gate-leak bias, and
// two driven rectifiers (a voltage doubler, a full-wave bridge). References: scipy 1.17, each
// circuit written by hand as state equations (the ladder, Wien, Colpitts and rectifiers; diodes
// Is·(e^(v/nV_T) − 1) + 1e-12·v at 300.15 K, the JFET's square law and its 10 fA gate junctions
// from docs/language.md), the twin-T through test/validation/reference/circuit.py (op-amp
// macromodel, diodes with their 0.5 Ω); the orbit settled by LSODA, then one period at rtol
// 1e-11 (Radau for the twin-T), its figures on 8192 uniform points; the Floquet multipliers
// from the variational equation dΦ/dt = J·Φ over one period (Radau, rtol 1e-11; as
// test/validation/reference/floquet.py). At the defaults every figure, and every listed
// multiplier, must lie within its printed error bar.
import { existsSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, test } from "vitest";
import { runSteady, type Circuit, type SteadyResult } from "@onset/core";
import { buildCircuit, elaborate, loadProgram, loadSource } from "@onset/netlist-parser";
import { COLPITTS, doubler } from "../../support/acceptance-9-circuits.js";
import { expectFiguresWithinBars } from "../../support/steady-bars.js";

const steadyOf = (text: string, options: string): SteadyResult => {
  const circuit: Circuit = elaborate(loadProgram("acceptance-9.onset", `${text}\nsteady ${options}\n`).program, {}).circuit!;
  return runSteady(circuit, circuit.analyses.find((a) => a.kind === "steady")! as Parameters<typeof runSteady>[1]);
};
const magnitude = (m: { re: number; im: number }) => Math.hypot(m.re, m.im);
const rel = (a: number, b: number) => Math.abs(a / b - 1);

const PAIR = `diode     D1 o gnd saturation=5n emission=1.5 series=0
diode     D2 gnd o saturation=5n emission=1.5 series=0`;

/** Four R–C sections (10k, 4.7 nF) behind an inverting gain of K, a soft clip (10k, 1 nF, a diode pair) driving the ladder. */
const ladder = (gain: number) => `vcvs      E1 e gnd gnd d ${gain}
resistor  Ro e o 10k
capacitor Co o gnd 1n
${PAIR}
resistor  R1 o a 10k
capacitor C1 a gnd 4.7n
resistor  R2 a b 10k
capacitor C2 b gnd 4.7n
resistor  R3 b c 10k
capacitor C3 c gnd 4.7n
resistor  R4 c d 10k
capacitor C4 d gnd 4.7n`;
const LADDER = ladder(30);

/** A twin-T (22k, 6.8 nF; 3.3 nF, 12k) from the output to the inverting input; positive feedback 27k/2.2k held by two diodes in series each way through 470 Ω. */
const TWIN_T = `resistor  Ra o  m1  22k
resistor  Rb m1 n   22k
capacitor Cs m1 gnd 6.8n
capacitor Ca o  m2  3.3n
capacitor Cb m2 n   3.3n
resistor  Rs m2 gnd 12k
resistor  Rp1 o p   27k
resistor  Rp2 p gnd 2.2k
resistor  Rz  p z   470
diode     D1  z  z1
diode     D2  z1 gnd
diode     D3  gnd z2
diode     D4  z2 z
opamp     U1  p n o preset=general rails=(-12, 12)`;

/** An unequal-arm Wien (4.7k + 22 nF, 10k ∥ 10 nF) around an ideal amplifier, its gain set by 1k over a lamp (cold 700 Ω, hot 2k at 10 V, 40 ms). */
const WIEN_LAMP = `resistor  R1 o s   4.7k
capacitor C1 s p   22n
resistor  R2 p gnd 10k
capacitor C2 p gnd 10n
resistor  Rf o n   1k
lamp      L1 n gnd 700 hot=2k rated=10 tau=40m
opamp     U1 p n o preset=ideal gbw=inf rout=0 rails=(-30, 30)`;

/** A full-wave bridge on a floating 14 V, 60 Hz winding (1 GΩ to ground), 470 µF and 220 Ω. */
const BRIDGE = `vsource   V1 a b wave=sine amp=14 freq=60
resistor  Rw b gnd 1G
diode     D1 a k saturation=1n emission=2 series=0
diode     D2 b k saturation=1n emission=2 series=0
diode     D3 gnd a saturation=1n emission=2 series=0
diode     D4 gnd b saturation=1n emission=2 series=0
capacitor Cr k gnd 470u
resistor  RL k gnd 220`;

/**
 * A ±3 V square (edges of 0 s, 200 µs high in 500 µs) through 1k and a diode into a peak detector
 * (100 nF, 47k). Its shooting's map failed at the rising edge ("the periodic-orbit map did not
 * converge at step 65 of 106"): the transient's point there was before the jump, the map's after
 * it, and the predictor moved by that 6 V started Newton 4 V past the diode's knee.
 */
const SQUARE_PEAK = `vsource   V1 s gnd wave=pulse low=-3 high=3 width=200u period=500u
resistor  Rs s a 1k
diode     D1 a k saturation=1n emission=2 series=0
capacitor C1 k gnd 100n
resistor  RL k gnd 47k`;

interface Reference {
  readonly frequency: number;
  readonly amplitude: number;
  readonly rms: number;
  /** THD over harmonics 2–30; null where the probe has no fundamental. */
  readonly thd: number | null;
  /** |μ| of the non-trivial Floquet multipliers, largest first (scipy's variational equation). */
  readonly multipliers: readonly number[];
}

// scipy references (see the head of this file); the listed multipliers are those above 1e-10.
const CASES: readonly (readonly [string, string, string, Reference])[] = [
  ["four-section R–C ladder, soft clip", LADDER, "probe=o", { frequency: 3346.372505, amplitude: 0.3387312266, rms: 0.2676696203, thd: 0.1129635042, multipliers: [0.1926596353, 4.503621e-9, 4.163137e-10] }],
  ["twin-T, stacked diodes", TWIN_T, "probe=o", { frequency: 2047.260980, amplitude: 10.45282299, rms: 8.356731564, thd: 0.1068808069, multipliers: [0.001763573184, 0.0001260828533] }],
  ["lamp-held Wien", WIEN_LAMP, "probe=o", { frequency: 1565.527154, amplitude: 11.19130636, rms: 7.912073704, thd: 0.0002066273577, multipliers: [0.9891630454, 0.9891630454] }],
  ["JFET Colpitts", COLPITTS, "probe=d", { frequency: 378206.4746, amplitude: 2.440496546, rms: 12.12110274, thd: 0.0367886338, multipliers: [0.9982716730, 0.9810554407, 0.9810554407, 0.008507668] }],
  ["voltage doubler, 1 kHz", doubler("10k"), "probe=k", { frequency: 1000, amplitude: 0.03226133262, rms: 7.583901140, thd: 0.5961026318, multipliers: [0.9043973901, 0.5238748868] }],
  ["square-wave peak detector, 2 kHz", SQUARE_PEAK, "probe=k", { frequency: 2000, amplitude: 0.07206975857, rms: 2.265618540, thd: 0.2108193578, multipliers: [0.2254510281] }],
  ["full-wave bridge, 60 Hz", BRIDGE, "probe=k", { frequency: 60, amplitude: 0.3892193022, rms: 11.68928411, thd: null, multipliers: [1.053215e-8] }],
];

describe("steady figures and Floquet multipliers against scipy, within their printed bars at the defaults", () => {
  test.each(CASES)("%s", (_name, text, options, reference) => {
    const r = steadyOf(text, options);
    expectFiguresWithinBars(r, reference);
    const bars = r.numericalError!;
    if (reference.thd === null) expect(r.thd).toBeNull();
    else expect(Math.abs(r.thd! - reference.thd)).toBeLessThanOrEqual(bars.thd);
    expect(r.stability!.verdict).toBe("stable");
    // Every listed multiplier within its bar of scipy's (the same count: none missing, none made up).
    expect(r.multipliers.map(magnitude).length).toBe(reference.multipliers.length);
    r.multipliers.forEach((m, k) => expect(Math.abs(magnitude(m) - reference.multipliers[k]!)).toBeLessThanOrEqual(r.multiplierError![k]!));
  });
});

describe("the lamp-held Wien: closed forms and scipy", () => {
  // (scipy, in the table above: three states, the two capacitors and the filament's temperature, the amplifier ideal; mean temperature 431.3366 K.)
  test("the lamp settles where the gain is 1 + R1/R2 + C2/C1, the amplitude its thermal balance; frequency 1/(2π√(R1C1R2C2)) less the ripple's pull", () => {
    const r = steadyOf(WIEN_LAMP, "probe=o");
    expect(r.found, r.explanation).toBe(true);
    // Closed form (docs/language.md's lamp law at R_lamp = Rf/(G − 1), G = 1.92455): 11.18937 V; the
    // filament's 0.17 K ripple at 2f (ωτ ≈ 400) moves it by parts in 1e4.
    const G = 1 + 4.7 / 10 + 10 / 22;
    const ambient = 300.15;
    const lamp = 1000 / (G - 1);
    const rth = ((ambient * (2000 / 700) ** (1 / 1.2) - ambient) * 2000) / 100;
    const theta = ambient * (lamp / 700) ** (1 / 1.2);
    expect(rel(r.amplitude!, G * Math.sqrt((2 * (theta - ambient) * lamp) / rth))).toBeLessThan(5e-4);
    // Closed form: the unequal Wien's zero-phase frequency 1565.164 Hz; the ripple (a quadrature gain modulation) pulls it 2.3e-4 up.
    expect(rel(r.frequency!, 1 / (2 * Math.PI * Math.sqrt(4.7e3 * 22e-9 * 10e3 * 10e-9)))).toBeLessThan(5e-4);
    // The filament's mean temperature is θ at R_lamp (closed form, 431.34 K), through its own probe; its tone is at 2f.
    const temperature = steadyOf(WIEN_LAMP, "probe=L1.temperature");
    expect(temperature.frequency).toBe(r.frequency);
    expect(Math.abs(temperature.offset! - theta)).toBeLessThan(0.2);
    expect(temperature.thd).toBeNull();
  });
});

describe("probe independence, with the closed forms that tie the probes together", () => {
  test("the Colpitts: drain, gate, coil current, the drain–gate difference and the supply give one orbit", () => {
    const [d, ...others] = ["probe=d", "probe=g", "probe=L1.i", "probe=(d,g)", "probe=dd"].map((p) => steadyOf(COLPITTS, p));
    for (const other of others) {
      expect(other!.frequency).toBe(d!.frequency);
      expect(other!.multipliers).toEqual(d!.multipliers);
    }
    // The supply is an ideal 12 V source: its figures are its level, with the floor warning.
    const supply = others[3]!;
    expect(supply.offset).toBeCloseTo(12, 9);
    expect(supply.warnings.map((w) => w.code)).toContain("probe-below-floor");
  });

  test("the lamp Wien: the amplifier's inputs agree (virtual short), and o − p is Rf times the lamp's current (Ohm's law on Rf)", () => {
    const [p, n, across, current] = ["probe=p", "probe=n", "probe=(o,p)", "probe=L1.i"].map((q) => steadyOf(WIEN_LAMP, q));
    expect(rel(n!.amplitude!, p!.amplitude!)).toBeLessThan(1e-6);
    expect(rel(across!.amplitude!, 1e3 * current!.amplitude!)).toBeLessThan(1e-6);
  });

  test("the twin-T: the midpoint of two equal diodes in series swings half the string (symmetry)", () => {
    const [z, z1] = ["probe=z", "probe=z1"].map((q) => steadyOf(TWIN_T, q));
    expect(z1!.frequency).toBe(z!.frequency);
    expect(rel(z1!.amplitude!, z!.amplitude! / 2)).toBeLessThan(1e-4);
  });
});

describe("from= and cycles= do not change the orbit", () => {
  test.each([
    ["ladder", LADDER],
    ["twin-T", TWIN_T],
    ["lamp Wien", WIEN_LAMP],
  ])("%s: from=poles, cycles=7 and cycles=200 agree with the default within the orbit's tolerance", (_name, text) => {
    const base = steadyOf(text, "probe=o");
    for (const options of ["probe=o from=poles", "probe=o cycles=7", "probe=o cycles=200"]) {
      const r = steadyOf(text, options);
      expect(r.found, `${options}: ${r.explanation}`).toBe(true);
      // each shooting stops within 1e-6 of the orbit (a hundredth of accuracy=1e-4): two of them within twice that
      expect(rel(r.frequency!, base.frequency!)).toBeLessThan(2e-6);
      expect(rel(r.amplitude!, base.amplitude!)).toBeLessThan(1e-5);
    }
  });
});

describe("driven rectifiers", () => {
  test("the orbit's period is the drive's (closed form: 1/1 kHz, 1/60 Hz), with no trivial multiplier", () => {
    expect(steadyOf(doubler("10k"), "probe=k")).toMatchObject({ found: true, kind: "driven", period: 1e-3, trivialMultiplier: null });
    expect(steadyOf(BRIDGE, "probe=k")).toMatchObject({ found: true, kind: "driven", period: 1 / 60, trivialMultiplier: null });
  });

  test.each(["10k", "1M", "10M"])("a voltage doubler loaded by %s is found at the default cycles= (its first shooting from 3 periods did not converge: 'no periodic orbit')", (load) => {
    const r = steadyOf(doubler(load), "probe=k");
    expect(r.found, r.explanation).toBe(true);
    expect(r.stability!.verdict).toBe("stable");
    // Closed form bound: the doubled peak, 2·5 V less two diode drops, above the ripple's mean.
    expect(r.offset!).toBeLessThan(10);
    expect(r.offset!).toBeGreaterThan(7);
  });

  test("a retry the step limit would cut short is not started, and the answer counts the periods the transient ran", () => {
    // 12 periods of the 1 MΩ doubler take about 1600 steps; doubling them would pass a 3000-step limit.
    const circuit = elaborate(loadProgram("limited.onset", `${doubler("1M")}\nsteady probe=k cycles=12\n`).program, {}).circuit!;
    const r = runSteady(circuit, circuit.analyses.find((a) => a.kind === "steady")! as Parameters<typeof runSteady>[1], { limits: { maxSteps: 3000 } });
    expect(r.transient.periods).toBe(12);
    if (!r.found) expect(r.explanation).toMatch(/^no periodic orbit with the sources' period 1 ms: /);
  });

  test("the bridge's output has no 60 Hz tone: no THD, and the warning says the probe sees only the winding's harmonics, not that no source has a tone", () => {
    const r = steadyOf(BRIDGE, "probe=k");
    const warning = r.warnings.find((w) => w.code === "orbit-without-fundamental")!;
    expect(warning.message).toMatch(/^the probe k carries no tone at the sources' frequency \(60 Hz\), only at its harmonics/);
    expect(warning.message).not.toMatch(/no source has a tone/);
    // scipy: the 2nd harmonic 292.34 mV, the ripple at twice the winding's frequency (full-wave).
    expect(Math.abs(r.harmonics[1]!.amplitude - 0.2923395)).toBeLessThan(3e-3);
  });
});

describe("two tones through a clipper: no THD against an intermodulation product", () => {
  // 50 Hz and 60 Hz repeat every 100 ms (closed form: their common period, 10 Hz), where neither
  // source has a tone; the clipper's 9th-order product 5·50 − 4·60 = 10 Hz is there (mathematics),
  // and THD against it read 14757 %.
  test("the orbit is the common period's, THD is null, and the warning says no source has a tone there", () => {
    const r = steadyOf(
      `vsource   V1 s m wave=sine amp=2 freq=50
vsource   V2 m gnd wave=sine amp=1 freq=60
resistor  Rs s o 1k
diode     D1 o gnd saturation=1n emission=2 series=0
diode     D2 gnd o saturation=1n emission=2 series=0
capacitor C1 o gnd 100n`,
      "probe=o",
    );
    expect(r).toMatchObject({ found: true, kind: "driven", thd: null });
    expect(r.period).toBeCloseTo(0.1, 12);
    expect(r.warnings.find((w) => w.code === "orbit-without-fundamental")!.message).toMatch(/at which no source has a tone/);
    // the 5th and 6th harmonics of 10 Hz are the two tones: the largest, at 0 dB relative
    expect(Math.max(r.harmonics[4]!.dBc, r.harmonics[5]!.dBc)).toBeCloseTo(0, 9);
  });
});

describe("no orbit where there is none, with the poles' verdict", () => {
  test("the ladder at gain 20 (its pair crosses at 20.37): no orbit, the pair's decay named", () => {
    const r = steadyOf(ladder(20), "probe=o");
    expect(r).toMatchObject({ found: false, frequency: null, amplitude: null, multipliers: [] });
    expect(r.explanation).toMatch(/^no periodic orbit: the circuit does not oscillate — the poles' dominant pair at 3\.17 kHz decays at 98\.20 \/s \(left half-plane\)/);
  });
});

describe("hostile inputs", () => {
  const positioned = (line: string) => {
    try {
      buildCircuit(loadSource("hostile.onset", `${LADDER}\n${line}\n`));
    } catch (error) {
      return (error as { diagnostic: { message: string; hint?: string; span?: { start: number } } }).diagnostic;
    }
    throw new Error(`accepted: ${line}`);
  };
  test.each([
    ["steady", /steady needs probe=/],
    ["steady probe=zz", /unknown node 'zz'/],
    ["steady probe=o cycles=0", /cycles= of steady must be between 1 and 100000, got 0/],
    ["steady probe=o cycles=1e9", /cycles= of steady must be between 1 and 100000/],
    ["steady probe=o from=bias", /from=bias is not a choice for steady/],
    ["steady probe=o accuracy=0", /accuracy= of steady must be between/],
  ])("%s: a positioned error with a hint", (line, message) => {
    const d = positioned(line);
    expect(d.message).toMatch(message);
    expect(d.hint).toBeTruthy();
    // on the analysis' own line, after the circuit
    expect(d.span!.start).toBeGreaterThan(LADDER.length);
  });

  test("a zero-valued capacitor is refused where it is written", () => {
    let error: unknown;
    try {
      buildCircuit(loadSource("zero.onset", LADDER.replace("capacitor C4 d gnd 4.7n", "capacitor C4 d gnd 0")));
    } catch (e) {
      error = e;
    }
    expect((error as Error).message).toMatch(/the value of capacitor C4 must be greater than 0 F/);
  });

  test("a probe on ground: the orbit is the circuit's, the probe's figures are 0 with the floor warning", () => {
    const ground = steadyOf(LADDER, "probe=gnd");
    expect(ground.frequency).toBe(steadyOf(LADDER, "probe=o").frequency);
    expect(ground.amplitude).toBe(0);
    expect(ground.warnings.map((w) => w.code)).toContain("probe-below-floor");
  });
});

describe("a large circuit, shot matrix-free", () => {
  // The ladder with a passive chain of 70 sections (1 MΩ, 10 pF) hung on its clip node: o's
  // impedance (≈ 5 kΩ) is a short to the chain, so its modes are those of a chain grounded at one
  // end and open at the other (closed form): λ_k = (4/RC)·sin²((2k − 1)π/(2(2N + 1))), μ_k = e^(−λ_k·T).
  const N = 70;
  const chain = Array.from({ length: N }, (_, i) => `resistor Rx${i + 1} ${i === 0 ? "o" : `x${i}`} x${i + 1} 1M\ncapacitor Cx${i + 1} x${i + 1} gnd 10p`).join("\n");
  test("its dominant multipliers are the chain's modes, within their bars (and 2e-6 for o's 5 kΩ, not quite a short)", () => {
    const r = steadyOf(`${LADDER}\n${chain}`, "probe=o");
    expect(r.shooting).toBe("matrix-free");
    const T = r.period!;
    const closed = [1, 2, 3].map((k) => Math.exp(-(4 / 1e-5) * Math.sin(((2 * k - 1) * Math.PI) / (2 * (2 * N + 1))) ** 2 * T));
    closed.forEach((mu, k) => expect(Math.abs(magnitude(r.multipliers[k]!) - mu)).toBeLessThanOrEqual(r.multiplierError![k]! + 2e-6));
    // the oscillator is still the ladder's, pulled 5.4e-4 by the chain's load on o (about 2 MΩ at 3.3 kHz against o's 5 kΩ)
    expect(rel(r.frequency!, 3346.372505)).toBeLessThan(1e-3);
  });
});

// Studies run through the built package: Node cannot start a worker from a .ts file.
const repo = resolve(dirname(fileURLToPath(import.meta.url)), "../../..");
const dist = join(repo, "packages", "core", "dist");
describe.runIf(existsSync(join(dist, "worker.js")))("studies with measure=steady on 1 and 2 workers", async () => {
  const core = await import(join(dist, "index.js"));
  const { workerPool } = await import(join(dist, "node.js"));
  const toleranced = LADDER.replace(/ (10k|4\.7n|1n)$/gm, (_m, v: string) => ` ${v}±${v === "10k" ? "1%" : "5%"}`);
  const program = loadProgram("study.onset", `${toleranced}\nsteady probe=o\n`).program;
  const nominal = elaborate(program).circuit!;
  const build = (overrides: Record<string, number>) => elaborate(program, { overrides }).circuit!;

  test("tolerance: the same samples on 1 and 2 workers, every sample settled near the nominal", async () => {
    const study = (pool: unknown) => core.runToleranceStudy(build, nominal.tolerances, { kind: "tolerance", runs: 24, seed: 7, dist: "normal", measure: "steady" }, [], { pool });
    const one = await study(core.inThreadPool);
    expect(JSON.stringify(await study(workerPool(2)))).toBe(JSON.stringify(one));
    for (const s of one) {
      expect(s.metrics.verdict).toBe("settled");
      // within the tolerances' pull of the nominal orbit (1 % resistors, 5 % capacitors: a few %)
      expect(rel(s.metrics.frequency, 3346.372505)).toBeLessThan(0.05);
    }
  });

  test("sweep: the same settings on 1 and 2 workers; a setting is the file's steady analysis run alone", async () => {
    const sweepProgram = loadProgram("sweep.onset", `param K = 30\n${ladder(30).replace("gnd gnd d 30", "gnd gnd d (K)")}\nsteady probe=o\n`).program;
    const sweepBuild = (overrides: Record<string, number>) => elaborate(sweepProgram, { overrides }).circuit!;
    const sweep = { kind: "sweep", target: "K", from: 20, to: 40, steps: 3, log: false, measure: "steady" };
    const one = await core.runSweepInParallel(sweepBuild, sweep, { pool: core.inThreadPool });
    const two = await core.runSweepInParallel(sweepBuild, sweep, { pool: workerPool(2) });
    expect(JSON.stringify(two)).toBe(JSON.stringify(one));
    const at30 = one.points[1].run.results.find((r: { analysis: string }) => r.analysis === "steady");
    expect(at30.frequency).toBe(steadyOf(LADDER, "probe=o").frequency);
    // below the poles' threshold (20.37) no orbit, and the reason given
    const at20 = one.points[0].run.results.find((r: { analysis: string }) => r.analysis === "steady");
    expect(at20.found).toBe(false);
  });
});

// Issue 15, a fifth acceptance pass on circuits of its own (values and scenarios unlike the
// examples' and the other passes'): closed forms, the odex ODE integrator, a cross-check against
// the settled start-up run, probe independence, and no orbit where there is none.
import { createRequire } from "node:module";
import { describe, expect, test } from "vitest";
import { onImaginaryAxis, runPoles, runStartup, runSteady, runSweep, startupAnalysisOf, steadyAnalysisOf, THERMAL_VOLTAGE, type Circuit, type SteadyResult } from "@onset/core";
import { thermistorAmplitude } from "../../e2e/support/steady-circuits.js";
import { elaborate, loadProgram } from "@onset/netlist-parser";
import { expectSteadyAgreesWithSettled } from "./steady-agreement.js";

const { Solver } = createRequire(import.meta.url)("odex") as typeof import("odex");

const circuitOf = (text: string): Circuit => elaborate(loadProgram("acceptance-5.onset", text).program, {}).circuit!;
const steadyOf = (text: string, options = "probe=o"): SteadyResult => {
  const circuit = circuitOf(`${text}\nsteady ${options}\n`);
  return runSteady(circuit, circuit.analyses.find((a) => a.kind === "steady")! as Parameters<typeof runSteady>[1]);
};
const rel = (a: number, b: number) => Math.abs(a / b - 1);

/** A Wien bridge (equal R, C) with back-to-back diodes across part of its feedback resistor. */
const wien = (r: string, c: string, amplifier: string) => `resistor  R1 o s   ${r}
capacitor C1 s p   ${c}
resistor  R2 p gnd ${r}
capacitor C2 p gnd ${c}
resistor  Rg n gnd 4.7k
resistor  Rf1 n f 6.8k
resistor  Rf2 f o 3.3k
diode     D1 f o
diode     D2 o f
opamp     U1 p n o ${amplifier}`;

/** Two inverting integrators (20 kΩ, 10 nF: ω = 1/RC) and an inverter; 1 MΩ from the loop's end into the second integrator undamps it, diodes through 22 kΩ across its capacitor limit the swing. */
const QUADRATURE = `resistor  R1 o n1 20k
capacitor C1 n1 b 10n
opamp     U1 gnd n1 b preset=general rails=(-12, 12)
resistor  R2 b n2 20k
capacitor C2 n2 c 10n
opamp     U2 gnd n2 c preset=general rails=(-12, 12)
resistor  R3 c n3 10k
resistor  R4 n3 o 10k
opamp     U3 gnd n3 o preset=general rails=(-12, 12)
resistor  Rd o n2 1M
resistor  Rx c m 22k
diode     D1 m n2
diode     D2 n2 m`;

describe("closed forms", () => {
  test("a lossless LC tank: poles ±j/√(LC) (closed form), on the imaginary axis; steady answers no orbit and names the axis, not the left half-plane", () => {
    const text = "inductor L1 v gnd 1m\ncapacitor C1 v gnd 100n\nvccs G1 gnd v v gnd 0";
    const poles = runPoles(circuitOf(text), { kind: "poles" });
    expect(rel(poles.dominant!.imag, 1 / Math.sqrt(1e-3 * 100e-9))).toBeLessThan(1e-9);
    expect(onImaginaryAxis(poles.dominant!)).toBe(true);
    expect(poles.starts).toBe(false);
    const r = steadyOf(text, "probe=v");
    expect(r.found).toBe(false);
    expect(r.frequency).toBeNull();
    expect(r.explanation).toContain("imaginary axis");
    expect(r.explanation).not.toContain("left half-plane");
  });

  test("an R–C low-pass ladder behind a gain of −29.4 held by an ideal clip runs at the ladder's phase crossover √6/(2πRC) (closed form; a memoryless clip adds no phase) within 1e-4", () => {
    const r = steadyOf(`resistor R1 o a 12k
capacitor C1 a gnd 3.3n
resistor R2 a b 12k
capacitor C2 b gnd 3.3n
resistor R3 b c 12k
capacitor C3 c gnd 3.3n
vcvs E1 x gnd c gnd -29.4
opamp U1 x o o preset=ideal gbw=inf rout=0 rails=(-1.5, 1.5)`);
    expect(r.found).toBe(true);
    expect(r.stability!.verdict).toBe("stable");
    expect(rel(r.frequency!, Math.sqrt(6) / (2 * Math.PI * 12e3 * 3.3e-9))).toBeLessThan(1e-4);
    expect(r.numericalError!.frequency / r.frequency!).toBeLessThan(1e-4);
  });

  test("two tones (400 Hz, 0.5 V at 500 Hz) through an RC: the common period 10 ms, zero offset and rms √Σ|H(jω)|²a²/2 (closed form) within 1e-5; no THD without a fundamental", () => {
    const r = steadyOf(`vsource V1 a gnd wave=sine amp=1 freq=400
vsource V2 in a wave=sine amp=0.5 freq=500
resistor R1 in o 3.3k
capacitor C1 o gnd 47n`);
    expect(r.kind).toBe("driven");
    expect(r.period).toBeCloseTo(0.01, 15);
    const gain = (f: number) => 1 / Math.hypot(1, 2 * Math.PI * f * 3.3e3 * 47e-9);
    expect(rel(r.rms!, Math.sqrt((gain(400) ** 2 + (0.5 * gain(500)) ** 2) / 2))).toBeLessThan(1e-5);
    expect(Math.abs(r.offset!)).toBeLessThan(1e-9);
    expect(r.thd).toBeNull();
    expect(r.warnings.map((w) => w.code)).toContain("orbit-without-fundamental");
  });
});

/**
 * A 9 V sine rectifier's orbit from its state equation C·v′ = i_D(v_in − v) − v/R_L (the diode
 * solved for its series resistance), each period integrated by odex from t = 0 (the sine's
 * phase), the fixed point v(T) = v(0) found by the secant method: no project code.
 */
function rectifierReference(freq: number, c: number, rl: number): { amplitude: number; offset: number; rms: number } {
  const is = 2.5e-9, nvt = 1.8 * THERMAL_VOLTAGE, rs = 0.5, T = 1 / freq;
  const diode = (vd: number) => {
    let lo = Math.min(-50, vd - 1);
    let hi = Math.min(vd, 2) + 1e-9;
    const g = (vj: number) => vj + rs * (is * Math.expm1(vj / nvt) + 1e-12 * vj) - vd;
    for (let i = 0; i < 100; i++) (g(0.5 * (lo + hi)) > 0 ? (hi = 0.5 * (lo + hi)) : (lo = 0.5 * (lo + hi)));
    const vj = 0.5 * (lo + hi);
    return is * Math.expm1(vj / nvt) + 1e-12 * vj;
  };
  const period = (v0: number, samples = 0): { end: number; v: number[] } => {
    const solver = new Solver(1);
    solver.relativeTolerance = 1e-12;
    solver.absoluteTolerance = 1e-13;
    solver.maxSteps = 1e7;
    solver.denseOutput = true;
    const v: number[] = [];
    const end = solver.solve((t, y) => [(diode(9 * Math.sin(2 * Math.PI * freq * t) - y[0]!) - y[0]! / rl) / c], 0, [v0], T, (_k, _a, x, y, dense) => {
      while (v.length < samples && (v.length * T) / samples <= x) v.push(dense ? dense(0, (v.length * T) / samples) : y[0]!);
    }).y[0]!;
    return { end, v };
  };
  let [a, b] = [7, 8.5];
  let [ga, gb] = [period(a).end - a, period(b).end - b];
  for (let i = 0; i < 60 && Math.abs(b - a) > 1e-12; i++) {
    const next = b - (gb * (b - a)) / (gb - ga);
    [a, ga] = [b, gb];
    b = next;
    gb = period(b).end - b;
  }
  const n = 400_000;
  const { v } = period(b, n);
  let max = -Infinity, min = Infinity, sum = 0, squares = 0;
  for (const x of v) (max = Math.max(max, x)), (min = Math.min(min, x)), (sum += x), (squares += x * x);
  return { amplitude: (max - min) / 2, offset: sum / n, rms: Math.sqrt(squares / n) };
}

describe("a driven diode circuit against the odex ODE integrator", () => {
  const RECTIFIER = "vsource V1 in gnd wave=sine amp=9 freq=60\ndiode D1 in o\ncapacitor C1 o gnd 47u\nresistor RL o gnd 1.5k";
  test("a 60 Hz half-wave rectifier into 47 µF ∥ 1.5 kΩ (odex reference): the drive's period; offset and rms within 1e-6, amplitude within 0.05 % at the defaults and 1e-5 at accuracy=1e-6", () => {
    const ref = rectifierReference(60, 47e-6, 1.5e3);
    const r = steadyOf(RECTIFIER);
    expect(r.kind).toBe("driven");
    expect(r.frequency).toBe(60);
    expect(r.stability!.verdict).toBe("stable");
    expect(rel(r.offset!, ref.offset)).toBeLessThan(1e-6);
    expect(rel(r.rms!, ref.rms)).toBeLessThan(1e-6);
    expect(rel(r.amplitude!, ref.amplitude)).toBeLessThan(5e-4);
    const fine = steadyOf(RECTIFIER, "probe=o accuracy=1e-6");
    expect(rel(fine.amplitude!, ref.amplitude)).toBeLessThan(1e-5);
  }, 60_000);

  test("a lightly loaded 400 Hz rectifier (220 µF, 10 kΩ: a 4 mV ripple on 8.2 V) is found at accuracy=1e-8 too (it was 'no orbit': the period started in the conduction pulse, where the map bends within a few thermal voltages); rms and offset within 1e-8 of the odex reference", () => {
    const RECTIFIER = "vsource V1 in gnd wave=sine amp=9 freq=400\ndiode D1 in o\ncapacitor C1 o gnd 220u\nresistor RL o gnd 10k";
    const ref = rectifierReference(400, 220e-6, 10e3);
    const tight = steadyOf(RECTIFIER, "probe=o accuracy=1e-8");
    expect(tight.found).toBe(true);
    expect(rel(tight.rms!, ref.rms)).toBeLessThan(1e-8);
    expect(rel(tight.offset!, ref.offset)).toBeLessThan(1e-8);
    expect(rel(tight.amplitude!, ref.amplitude)).toBeLessThan(1e-4);
    const usual = steadyOf(RECTIFIER);
    expect(rel(usual.rms!, ref.rms)).toBeLessThan(1e-6);
    expect(usual.iterations![0]).toBeLessThan(10);
  }, 60_000);
});

describe("cross-check against the settled start-up run (frequency 0.05 %, amplitude 0.5 %, THD 2 %)", () => {
  test.each([
    ["a diode Wien at 9.9 Hz", wien("16k", "1u", "preset=general rails=(-12, 12)")],
    ["a diode Wien at 99 kHz", wien("1.6k", "1n", "gbw=200M slew=200V/us rails=(-10, 10)")],
    ["a diode-damped quadrature oscillator", QUADRATURE],
    ["an LC tank undamped by a VCCS, held by diodes through 2.2 kΩ", "inductor L1 o gnd 3.3m series=0.8\ncapacitor C1 o gnd 68n\nresistor Rl o gnd 12k\nvccs G1 gnd o o gnd 150u\ndiode D1 o k\nresistor Rk k gnd 2.2k\ndiode D2 k2 o\nresistor Rk2 k2 gnd 2.2k"],
    ["a lamp Wien at 5.9 kHz, τ = 8 ms", "resistor R1 o s 2.7k\ncapacitor C1 s p 10n\nresistor R2 p gnd 2.7k\ncapacitor C2 p gnd 10n\nresistor Rf o n 330\nlamp L1 n gnd 110 hot=500 rated=6 tau=8m\nopamp U1 p n o preset=fast rails=(-12, 12)"],
  ])("%s", (_name, text) => {
    expectSteadyAgreesWithSettled(circuitOf(`${text}\nstartup probe=o until=auto\n`));
  }, 60_000);
});

describe("sources that change once: the steady state is of the circuit as they leave it", () => {
  const POWERED_WIEN = (supply: string) => `${wien("15.8k", "10n", "preset=general supply=(vn, vp)")}
vsource Vn vn gnd -12
vsource Vp vp gnd ${supply}`;

  test.each([
    ["a pulse switching it on at 1 ms", "wave=pulse low=0 high=12 delay=1m rise=100u"],
    ["steps to 12 V at 1 ms", "wave=steps points=[0 0, 1m 12]"],
  ])("a Wien whose supply is %s oscillates as on a 12 V supply (it was answered 'does not oscillate' from its unpowered bias point); cross-check: the start-up run", (_name, supply) => {
    const onDc = steadyOf(POWERED_WIEN("12"));
    const switched = steadyOf(POWERED_WIEN(supply));
    expect(switched.found).toBe(true);
    expect(switched.frequency).toBe(onDc.frequency);
    expect(switched.amplitude).toBe(onDc.amplitude);
    const circuit = circuitOf(`${POWERED_WIEN(supply)}\nstartup probe=o until=auto\n`);
    expect(rel(switched.frequency!, runStartup(circuit, startupAnalysisOf(circuit)!).frequency!)).toBeLessThan(5e-4);
  }, 60_000);

  test("a sine that starts 200 ms late drives the rectifier onto the same orbit (it was answered 'converged to the rest point': the shooting ran before the sine started)", () => {
    const RECTIFIER = (delay: string) => `vsource V1 in gnd wave=sine amp=9 freq=60${delay}\ndiode D1 in o\ncapacitor C1 o gnd 47u\nresistor RL o gnd 1.5k`;
    const prompt = steadyOf(RECTIFIER(""));
    const late = steadyOf(RECTIFIER(" delay=200m"));
    expect(late.found).toBe(true);
    expect(rel(late.amplitude!, prompt.amplitude!)).toBeLessThan(1e-6);
    expect(rel(late.rms!, prompt.rms!)).toBeLessThan(1e-6);
  }, 60_000);
});

describe("an unstable orbit named", () => {
  test("a JFET gain-control Wien whose 10 nF detector over-corrects: steady says unstable, a multiplier below −1 (a flip); cross-check: the start-up run settles at half that frequency, on the doubled period", () => {
    const text = `resistor R1 o s 3.3k
capacitor C1 s p 10n
resistor R2 p gnd 3.3k
capacitor C2 p gnd 10n
resistor Rf o n 12k
resistor Rs n d 5.1k
jfet J1 d g gnd idss=5m pinchoff=-1.8
resistor Ra d g 330k
resistor Rc c g 330k
diode D1 c o
capacitor Cf c gnd 10n
resistor Rb c gnd 680k
opamp U1 p n o preset=general rails=(-12, 12)`;
    const r = steadyOf(text);
    expect(r.found).toBe(true);
    expect(r.stability!.verdict).toBe("unstable");
    expect(r.stability!.largest!.re).toBeLessThan(-1);
    const circuit = circuitOf(`${text}\nstartup probe=o until=auto\n`);
    const run = runStartup(circuit, startupAnalysisOf(circuit)!);
    expect(rel(run.frequency!, r.frequency! / 2)).toBeLessThan(1e-3);
  }, 60_000);

  test("two diode Wiens (2.15 kHz and 1.57 kHz) joined by 1 MΩ: the orbit found with the slower one at rest (probed there) is unstable, its multipliers e^(λT) of that one's growing pair (mathematics: a linear subsystem at rest has the Floquet multipliers of its poles) within 1e-3", () => {
    // The same Wien with every part and node named with a trailing b.
    const second = wien("7.3k", "10n", "preset=general rails=(-12, 12)")
      .replace(/^(\w+\s+)(\w+)/gm, "$1$2b")
      .replace(/\b(o|s|p|n|f)\b/g, "$1b");
    const text = `${wien("10k", "10n", "preset=general rails=(-12, 12)")}\n${second}\nresistor Rc o ob 1M`;
    const poles = runPoles(circuitOf(text), { kind: "poles" }).poles.filter((q) => q.imag > 0).sort((a, b) => b.real - a.real);
    const r = steadyOf(text);
    expect(r.found).toBe(true);
    expect(r.stability!.verdict).toBe("unstable");
    // The slower Wien's pair: the one whose frequency is not the orbit's.
    const rest = poles.find((q) => rel(q.imag / (2 * Math.PI), r.frequency!) > 0.1)!;
    const growth = Math.exp(rest.real * r.period!);
    const turn = rest.imag * r.period!;
    const mu = r.multipliers.find((m) => m.im > 0)!;
    expect(Math.abs(mu.re - growth * Math.cos(turn))).toBeLessThan(1e-3 * growth);
    // (a conjugate pair: the listed one with a positive imaginary part is either's)
    expect(Math.abs(mu.im - Math.abs(growth * Math.sin(turn)))).toBeLessThan(1e-3 * growth);
  }, 60_000);
});

describe("the ambient of self-heated parts", () => {
  const BEAD_WIEN = "resistor R1 o s 10.6k\ncapacitor C1 s p 100n\nresistor R2 p gnd 10.6k\ncapacitor C2 p gnd 100n\nthermistor TH1 o n 22k beta=3900 dissipation=70uW/K tau=1.5\nresistor Rg n gnd 6.8k\nopamp U1 p n o preset=general rails=(-15, 15)";

  test("a thermistor Wien (22 kΩ bead, B 3900 K, 70 µW/K over 6.8 kΩ): steady temperature=33 settles at the bead's thermal balance at a 33 °C ambient (closed form) within 1e-3, apart from the 27 °C one", () => {
    const warm = steadyOf(BEAD_WIEN, "probe=o temperature=33");
    expect(rel(warm.amplitude!, thermistorAmplitude(6.8e3, 22e3, 3900, 70e-6, 33))).toBeLessThan(1e-3);
    const room = steadyOf(BEAD_WIEN);
    expect(rel(room.amplitude!, thermistorAmplitude(6.8e3, 22e3, 3900, 70e-6, 27))).toBeLessThan(1e-3);
    expect(rel(warm.amplitude!, room.amplitude!)).toBeGreaterThan(0.1);
  }, 60_000);

  test("a sweep with measure=steady over a file whose only analysis is 'startup temperature=33' measures at 33 °C (it measured at 27 °C, where the start-up run is not)", () => {
    const circuit = circuitOf(`${BEAD_WIEN}\nstartup probe=o temperature=33\n`);
    const analysis = steadyAnalysisOf(circuit)!;
    expect(analysis.temperature).toBe(33);
    expect(rel(runSteady(circuit, analysis).amplitude!, thermistorAmplitude(6.8e3, 22e3, 3900, 70e-6, 33))).toBeLessThan(1e-3);
  }, 60_000);

  test("that sweep's start threshold is bisected on the poles at 33 °C: Rg = R_bead(33 °C)/2 (closed form: the Wien needs a gain of 3) within 1e-3 (at 27 °C it lies at 10.1 kΩ, outside the sweep)", () => {
    const program = loadProgram("acceptance-5.onset", `${BEAD_WIEN}\nstartup probe=o temperature=33\nsweep Rg from=7k to=9k steps=3 measure=steady\n`).program;
    const build = (overrides: Record<string, number>) => elaborate(program, { overrides }).circuit!;
    const sweep = build({}).analyses.find((a) => a.kind === "sweep")! as Parameters<typeof runSweep>[1];
    const threshold = runSweep(build, sweep).threshold!;
    const bead = 22e3 * Math.exp(3900 * (1 / (33 + 273.15) - 1 / 298.15));
    expect(rel(threshold.value, bead / 2)).toBeLessThan(1e-3);
  }, 60_000);
});

describe("probe independence", () => {
  test("the quadrature oscillator: every probe (an output, its sum with another, an inner node, an op-amp's pole, a branch current, a diode's junction) gives one frequency and one set of multipliers, to the last bit; from=poles the same orbit", () => {
    const base = steadyOf(QUADRATURE, "probe=o");
    expect(base.found).toBe(true);
    expect(rel(base.frequency!, 1 / (2 * Math.PI * 20e3 * 10e-9))).toBeLessThan(0.01);
    for (const probe of ["b", "(o, c)", "n2", "U2.pole", "R1.i", "D1.junction"]) {
      const r = steadyOf(QUADRATURE, `probe=${probe}`);
      expect(r.frequency).toBe(base.frequency);
      expect(r.multipliers).toEqual(base.multipliers);
    }
    const poles = steadyOf(QUADRATURE, "probe=D1.junction from=poles");
    expect(rel(poles.frequency!, base.frequency!)).toBeLessThan(1e-9);
    expect(Math.abs(poles.stability!.largest!.re - base.stability!.largest!.re)).toBeLessThan(1e-4);
  }, 60_000);
});

describe("no fabricated orbits", () => {
  test.each([
    ["tones at 1 kHz and 1414.2136 Hz (no common period within 64)", "vsource V1 a gnd wave=sine amp=1 freq=1k\nvsource V2 in a wave=sine amp=0.5 freq=1414.2136\nresistor R1 in o 3.3k\ncapacitor C1 o gnd 47n"],
    ["a 1 kHz Wien oscillating on its own, driven at 50 Hz (quasi-periodic)", "vsource V1 i gnd wave=sine amp=0.1 freq=50\nresistor R1 o s 15.8k\ncapacitor C1 s p 10n\nresistor R2 p i 15.8k\ncapacitor C2 p i 10n\nresistor Rg n gnd 10k\nresistor Rf1 n f 15k\nresistor Rf2 f o 6.8k\ndiode D1 f o\ndiode D2 o f\nopamp U1 p n o preset=general rails=(-12, 12)"],
    ["an LC tank undamped by a VCCS with nothing to limit it", "inductor L1 o gnd 1m\ncapacitor C1 o gnd 100n\nresistor Rl o gnd 10k\nvccs G1 gnd o o gnd 150u"],
  ])("%s: found false, no figures", (_name, text) => {
    const r = steadyOf(text);
    expect(r.found).toBe(false);
    expect(r.frequency).toBeNull();
    expect(r.amplitude).toBeNull();
    expect(r.explanation).toMatch(/^no periodic orbit/);
  }, 60_000);

  test("a self-oscillating Wien driven off its frequency: the answer says the circuit oscillates by itself (it said only 'converged to the rest point' or 'did not converge')", () => {
    const r = steadyOf(`${wien("15.8k", "10n", "preset=general supply=(vn, vp)")}\nvsource Vn vn gnd -12\nvsource Vp vp gnd wave=sine offset=12 amp=0.2 freq=100`);
    expect(r.found).toBe(false);
    expect(r.explanation).toContain("oscillates by itself");
  }, 60_000);
});

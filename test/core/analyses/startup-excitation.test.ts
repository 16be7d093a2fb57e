// Issue 12: the start-up run's excitation is physical (thermal noise everywhere, or power-on),
// reproducible and independent of the probe; every outcome is classified.
import { describe, expect, test } from "vitest";
import { runCircuit, runStartup, runSweep, type PartSpec, type StartupAnalysis, type StartupResult } from "@onset/core";
import { NoiseBank, type NoiseGenerator } from "@onset/core/engine";
import { circuit, crLadder, part, wienNetwork } from "../../support/circuits.js";

const node = (n: string) => ({ kind: "node", node: n }) as const;
const run = (parts: PartSpec[], probe: string, extra: Partial<StartupAnalysis> = {}) =>
  runStartup(circuit(parts), { kind: "startup", probe: node(probe), until: "auto", ...extra });

/** A 1.6 kHz Wien bridge around a general-purpose op-amp, gain set by Rf/Rg, limited by two diodes across part of Rf. */
const wien = (): PartSpec[] => [
  ...wienNetwork({ R1: 10e3, R2: 10e3, C1: 10e-9, C2: 10e-9 }),
  part("resistor", "Rg", ["n", "gnd"], 10e3),
  part("resistor", "Rf1", ["n", "f"], 15e3),
  part("resistor", "Rf2", ["f", "o"], 6.8e3),
  part("diode", "D1", ["f", "o"]),
  part("diode", "D2", ["o", "f"]),
  part("opamp", "U1", ["p", "n", "o"], undefined, { rails: [-12, 12] }),
];

/** A 650 Hz C–R ladder into an inverting stage of gain 35, limited by diodes across part of Rf. */
const ladder = (): PartSpec[] => [
  ...crLadder(10e3, 10e-9),
  part("resistor", "R3", ["c", "n"], 10e3),
  part("resistor", "Rf1", ["n", "f"], 270e3),
  part("resistor", "Rf2", ["f", "o"], 82e3),
  part("diode", "D1", ["f", "o"]),
  part("diode", "D2", ["o", "f"]),
  part("opamp", "U1", ["gnd", "n", "o"], undefined, { rails: [-12, 12] }),
];

describe("thermal excitation (kick=thermal, the default)", () => {
  test.each([
    ["Wien bridge", wien, ["o", "p", "s", "n", "f"]],
    ["C–R ladder", ladder, ["o", "a", "b", "c"]],
  ] as const)("%s: the start-up time is the same within 10 % whichever node is probed", (_name, parts, probes) => {
    const times = probes.map((p) => {
      const r = run(parts(), p);
      expect(r.verdict).toBe("settled");
      return r.startupTime!;
    });
    const low = Math.min(...times);
    const high = Math.max(...times);
    expect(high / low - 1).toBeLessThan(0.1);
  });

  test("the probe changes nothing in the run: the same steps at the same times, bit for bit", () => {
    const a = runStartup(circuit(wien()), { kind: "startup", probe: node("o"), until: 20e-3 });
    const b = runStartup(circuit(wien()), { kind: "startup", probe: node("p"), until: 20e-3 });
    expect(b.run.solver).toEqual(a.run.solver);
    expect(b.waveform.time).toEqual(a.waveform.time);
  });

  test("reproducible bit for bit from the seed; another seed gives another start-up, a third of a time constant or more away", () => {
    const first = run(wien(), "o");
    const again = run(wien(), "o");
    expect(again.waveform.values).toEqual(first.waveform.values);
    const other = run(wien(), "o", { seed: 2 });
    expect(other.startupTime).not.toBe(first.startupTime);
  });

  test("a generator's noise depends on its name and the seed alone, not on the others or their order", () => {
    const g = (name: string, to: number): NoiseGenerator => ({ name, density: 1e-20, from: -1, to, gain: 1 });
    const alone = new NoiseBank([g("R1", 0)], { seed: 3, corner: 1e4 });
    const among = new NoiseBank([g("R7", 1), g("P1.end1", 2), g("R1", 0)], { seed: 3, corner: 1e4 });
    for (const t of [1e-5, 3.3e-4, 2e-3, 0.5]) {
      const u1 = new Float64Array(3);
      const u2 = new Float64Array(3);
      alone.addSource(t, 1, u1);
      among.addSource(t, 1, u2);
      expect(u2[0]).toBe(u1[0]);
    }
  });

  test("the report states the excitation and the level it leaves at the probe", () => {
    const r = run(wien(), "o");
    const e = r.run.excitation;
    expect(e.kind).toBe("thermal");
    expect(e.temperature).toBe(27);
    // 5 resistors, 2 diode series resistances and the op-amp's input noise
    expect(e.sources).toBe(8);
    expect(e.duration).toBeNull();
    expect(e.noiseAtProbe!).toBeGreaterThan(1e-7);
    expect(e.noiseAtProbe!).toBeLessThan(1e-3);
    expect(e.firstCycleRms!).toBeGreaterThan(0);
  });

  test("hotter resistors: the noise at the probe scales as √T (4kT/R), and the oscillation starts sooner", () => {
    // a noiseless amplifier, so all the noise is thermal
    const parts = wien().map((p) => (p.name === "U1" ? { ...p, options: { ...p.options, noise: 0 } } : p));
    const cold = run(parts, "o", { temperature: -40 });
    const hot = run(parts, "o", { temperature: 125 });
    expect(hot.run.excitation.noiseAtProbe! / cold.run.excitation.noiseAtProbe!).toBeCloseTo(Math.sqrt((125 + 273.15) / (-40 + 273.15)), 6);
    expect(hot.startupTime!).toBeLessThan(cold.startupTime!);
  });
});

describe("seeds=N: the start-up time as a distribution", () => {
  test("each seed's start-up time is that seed's own run, and min, median and max are theirs", () => {
    const c = circuit(wien(), [{ kind: "startup", probe: node("o"), until: "auto", seeds: 3, seed: 5 }]);
    const r = runCircuit(c).results[0] as StartupResult;
    const spread = r.startupTimeSpread!;
    expect(spread.seeds).toEqual([5, 6, 7]);
    spread.seeds.forEach((seed, k) => expect(spread.times[k]).toBe(run(wien(), "o", { seed }).startupTime));
    const sorted = [...(spread.times as number[])].sort((a, b) => a - b);
    expect([spread.min, spread.median, spread.max]).toEqual(sorted);
  });
});

describe("power-on (kick=power-on)", () => {
  test("a DC source ramped over T into R–C: v = V·(t − τ(1 − e^(−t/τ)))/T during the ramp (mathematics), within 1e-4 V", () => {
    const V = 5;
    const T = 2e-3;
    const tau = 1e3 * 1e-6;
    const r = runStartup(circuit([part("vsource", "V1", ["i", "gnd"], V), part("resistor", "R1", ["i", "x"], 1e3), part("capacitor", "C1", ["x", "gnd"], 1e-6)]), {
      kind: "startup",
      probe: node("x"),
      until: 4e-3,
      kick: "power-on",
      ramp: T,
      maxStep: 10e-6,
    });
    // the run starts from the unpowered circuit
    expect(r.waveform.values[0]).toBe(0);
    const { time, values } = r.waveform;
    for (let k = 0; k < time.length; k++) {
      const t = time[k]!;
      if (t > T) break;
      expect(Math.abs(values[k]! - (V * (t - tau * (1 - Math.exp(-t / tau)))) / T)).toBeLessThan(1e-4);
    }
  });

  test("an op-amp with fixed rails=(-10, 10) follows its supply up: an overdriven comparator's output is 10 V·t/T while it ramps", () => {
    const T = 1e-3;
    const r = runStartup(
      circuit([part("vsource", "V1", ["i", "gnd"], 1), part("opamp", "U1", ["i", "gnd", "o"], undefined, { rails: [-10, 10], headroom: 0, rout: 0, knee: 1e-4, slew: Infinity }), part("resistor", "RL", ["o", "gnd"], 1e3)]),
      { kind: "startup", probe: node("o"), until: 2e-3, kick: "power-on", ramp: T, maxStep: 10e-6 },
    );
    const { time, values } = r.waveform;
    for (const t of [0.25e-3, 0.5e-3, 0.9e-3, 1.5e-3]) {
      const k = time.findIndex((x) => x >= t);
      expect(values[k]).toBeCloseTo(10 * Math.min(time[k]! / T, 1), 2);
    }
  });
  test("a single-supply Wien whose mid-rail reference charges slowly: the DC settles first, and start-up is the oscillation's, not the DC ramp's", () => {
    const parts: PartSpec[] = [
      part("vsource", "Vcc", ["vcc", "gnd"], 12),
      part("resistor", "Rb1", ["vcc", "mid"], 10e3),
      part("resistor", "Rb2", ["mid", "gnd"], 10e3),
      part("capacitor", "Cb", ["mid", "gnd"], 10e-6),
      part("resistor", "R1", ["o", "s"], 10e3),
      part("capacitor", "C1", ["s", "p"], 10e-9),
      part("resistor", "R2", ["p", "mid"], 10e3),
      part("capacitor", "C2", ["p", "mid"], 10e-9),
      part("resistor", "Rf1", ["o", "f"], 6.8e3),
      part("resistor", "Rf2", ["f", "n"], 15e3),
      part("diode", "D1", ["f", "o"]),
      part("diode", "D2", ["o", "f"]),
      part("resistor", "Rg", ["n", "x"], 10e3),
      part("capacitor", "Cg", ["x", "mid"], 10e-6),
      part("opamp", "U1", ["p", "n", "o"], undefined, { supply: ["gnd", "vcc"] }),
    ];
    const r = run(parts, "o", { kick: "power-on" });
    expect(r.verdict).toBe("settled");
    // the reference's 50 ms time constant has run out: the offset is the half supply
    expect(r.offset!).toBeCloseTo(6, 1);
    // the envelope (half the swing over one period around a time) reaches 90 % of the settled
    // amplitude at the reported start-up time, not at the end of the 1 ms ramp
    const { time, values } = r.waveform;
    const halfSwing = (at: number) => {
      let high = -Infinity;
      let low = Infinity;
      for (let k = 0; k < time.length; k++) {
        if (time[k]! < at - 0.5 / r.frequency! || time[k]! > at + 0.5 / r.frequency!) continue;
        high = Math.max(high, values[k]!);
        low = Math.min(low, values[k]!);
      }
      return (high - low) / 2;
    };
    expect(r.startupTime!).toBeGreaterThan(10e-3);
    expect(halfSwing(r.startupTime! - 2 / r.frequency!)).toBeLessThan(0.9 * r.amplitude!);
    expect(halfSwing(r.startupTime! + 1 / r.frequency!)).toBeGreaterThan(0.88 * r.amplitude!);
  });
});

describe("every outcome classified", () => {
  test("an astable multivibrator is a relaxation oscillation at 1/(2RC·ln((1 + β)/(1 − β))) (textbook closed form) within 1 %, duty cycle 50 %", () => {
    // comparator with hysteresis: divider β = R2/(R1 + R2) to the + input, R–C to the − input
    const beta = 1 / 3;
    const R = 10e3;
    const C = 100e-9;
    const r = run(
      [
        part("resistor", "R", ["o", "n"], R),
        part("capacitor", "C", ["n", "gnd"], C),
        part("resistor", "R1", ["o", "p"], 20e3),
        part("resistor", "R2", ["p", "gnd"], 10e3),
        part("opamp", "U1", ["p", "n", "o"], undefined, { gain: 1e6, gbw: 1e9, slew: Infinity, rails: [-10, 10], headroom: 0, rout: 0, knee: 1e-4 }),
      ],
      "o",
    );
    expect(r.verdict).toBe("relaxation");
    expect(r.explanation).toMatch(/^relaxation oscillation: /);
    const f = 1 / (2 * R * C * Math.log((1 + beta) / (1 - beta)));
    expect(Math.abs(r.frequency! / f - 1)).toBeLessThan(0.01);
    expect(Math.abs(r.dutyCycle! - 0.5)).toBeLessThan(0.01);
  });

  /**
   * The case: a twin-T (R = 11.3 kΩ, C = 33 nF, k = 0.45) from the output to the inverting
   * input of a slow op-amp (gbw 1 MHz, slew 0.5 V/µs, headroom 1.7 V on ±9 V supplies), a 10 kΩ
   * pot from the output to gnd feeding the non-inverting input.
   */
  const twinT = (at: number): PartSpec[] => [
    part("vsource", "Vcc", ["vcc", "gnd"], 9),
    part("vsource", "Vee", ["vee", "gnd"], -9),
    part("resistor", "Ra", ["o", "m1"], 11.3e3),
    part("resistor", "Rb", ["m1", "n"], 11.3e3),
    part("capacitor", "Cs", ["m1", "gnd"], 66e-9),
    part("capacitor", "Ca", ["o", "m2"], 33e-9),
    part("capacitor", "Cb", ["m2", "n"], 33e-9),
    part("resistor", "Rs", ["m2", "gnd"], 0.45 * 11.3e3),
    part("pot", "P1", ["o", "p", "gnd"], 10e3, { at }),
    part("opamp", "U1", ["p", "n", "o"], undefined, { gbw: 1e6, slew: 0.5e6, supply: ["vee", "vcc"], headroom: 1.7 }),
  ];

  test("the twin-T with a slow op-amp and real poles (+1.8e5 and +21 /s) swings rail to rail: relaxation, not silent", () => {
    const r = run(twinT(0.03), "o");
    expect(r.run.predicted.starts).toBe(false);
    expect(r.run.predicted.realGrowth).toBe(true);
    expect(r.verdict).toBe("relaxation");
    expect(r.explanation).toContain("growing real pole");
    // rail to rail: 2·(9 − 1.7) V, less the drop across the 75 Ω output resistance
    expect(Math.abs(r.peakToPeak! / 14.6 - 1)).toBeLessThan(0.015);
    expect(r.dutyCycle!).toBeCloseTo(0.5, 2);
  });

  test("a sweep of the pot counts the relaxation oscillation as oscillating: no false start threshold", () => {
    const build = (o: Readonly<Record<string, number>>) => circuit(twinT(o["P1.at"]!), [{ kind: "startup", probe: node("o"), until: "auto" }]);
    const sweep = runSweep(build, { kind: "sweep", target: "P1.at", from: 0.03, to: 0.99, steps: 3, log: false });
    expect(sweep.points.map((p) => (p.run.results[0] as StartupResult).verdict)).toEqual(["relaxation", "relaxation", "settled"]);
    expect(sweep.threshold).toBeNull();
  });

  test("with the wiper at the output the twin-T latches: the output stuck at a limit is 'latched'", () => {
    const r = run(twinT(0), "o");
    expect(r.verdict).toBe("latched");
    expect(r.explanation).toMatch(/^latched: U1's output is stuck at its (upper|lower) limit/);
  });

  test("a second, faster-growing loop elsewhere: the probe's oscillation is far from the predicted pair, so parasitic", () => {
    // A 1.6 kHz Wien bridge probed at its output, and a 16 kHz one (a tenth the capacitance,
    // more gain) that grows faster and so is the rightmost pair.
    const fast: PartSpec[] = [
      part("resistor", "S1", ["o2", "s2"], 10e3),
      part("capacitor", "K1", ["s2", "p2"], 1e-9),
      part("resistor", "S2", ["p2", "gnd"], 10e3),
      part("capacitor", "K2", ["p2", "gnd"], 1e-9),
      part("resistor", "Sg", ["n2", "gnd"], 10e3),
      part("resistor", "Sf", ["n2", "o2"], 25e3),
      part("opamp", "U2", ["p2", "n2", "o2"], undefined, { rails: [-12, 12], gbw: 100e6, slew: 100e6 }),
    ];
    const r = run([...wien(), ...fast], "o");
    expect(r.run.predicted.frequency!).toBeGreaterThan(10e3);
    expect(r.verdict).toBe("parasitic");
    expect(r.explanation).toMatch(/^parasitic oscillation: .* far from the .* the bias point's poles predict/);
  });

  test("kick=none on a circuit whose poles say it starts: silent, with the reason", () => {
    const r = run(wien(), "o", { kick: "none" });
    expect(r.verdict).toBe("silent");
    expect(r.explanation).toContain("with kick=none nothing disturbs the bias point");
  });

  test("an op-amp without rails= or supply= is reported as limiting at ±15 V", () => {
    const parts = wien().map((p) => (p.name === "U1" ? { ...p, options: {} } : p));
    const r = run(parts, "o");
    expect(r.warnings.map((w) => w.code)).toEqual(["default-rails"]);
    expect(r.warnings[0]!.message).toBe("opamp U1 has neither rails= nor supply=: it limits at the default rails (-15, 15) V less its headroom");
    expect(run(wien(), "o").warnings).toEqual([]);
  });
});

describe("a driven signal whose own excitation noise keeps its envelope moving", () => {
  // 1 mV at 2 kHz into 1 MΩ and 100 pF: about 0.62 mV at the probe, with the resistor's thermal
  // noise about 6 µV rms there (√(kT/C) ≈ 6.4 µV, mathematics: the equipartition of an RC), 1 %
  // of the swing — ten times what a settled envelope may move per cycle.
  const parts = [
    part("vsource", "V1", ["in", "gnd"], undefined, { wave: "sine", amp: 1e-3, freq: 2e3 }),
    part("resistor", "R1", ["in", "o"], 1e6),
    part("capacitor", "C1", ["o", "gnd"], 100e-12),
  ];
  test("the bound's hint names the noise's share of the amplitude and what to run instead, not a slow loop", () => {
    const r = run(parts, "o", { settleWithin: 0.1 });
    expect(r.verdict).toBe("unsettled");
    const bound = r.warnings.find((w) => w.code === "not-settled-within")!;
    expect(bound.hint).toMatch(/^the excitation's noise at the probe \(6\.\d+ µV rms\) is 1 % of the amplitude.*kick=none.*steady analysis/);
  });
});

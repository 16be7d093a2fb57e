// A driven circuit's start-up run is sized from its sources' period, not from a frequency assumed
// when the bias point has no ringing (acceptance pass 7: a 50 Hz rectifier stopped after 60 ms,
// three of its cycles, and was called silent).
import { describe, expect, test } from "vitest";
import { runStartup, type Circuit, type StartupAnalysis } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";
import { sizingFrequency, stepPeriod } from "../../../packages/core/src/analyses/run-sizing.js";

const circuitOf = (text: string): Circuit => elaborate(loadProgram("run-sizing.onset", text).program, {}).circuit!;
const startupOf = (text: string) => {
  const circuit = circuitOf(text);
  return runStartup(circuit, circuit.analyses.find((a) => a.kind === "startup") as StartupAnalysis);
};

const RECTIFIER = `vsource V1 a gnd wave=sine amp=12 freq=50
diode D1 a o
capacitor C1 o gnd 100u
resistor RL o gnd 1k
startup probe=o until=auto
`;

describe("sizingFrequency", () => {
  const growing = { real: 100, imag: 2 * Math.PI * 1e3 };
  const decaying = { real: -100, imag: 2 * Math.PI * 5e3 };
  test("a growing pair sizes the run, sources or not", () => {
    expect(sizingFrequency(growing, [50])).toBeCloseTo(1e3, 9);
  });
  test("without a growing pair, the sources' common frequency (600 Hz and 900 Hz: 300 Hz, mathematics)", () => {
    expect(sizingFrequency(null, [600, 900])).toBeCloseTo(300, 9);
    expect(sizingFrequency(decaying, [50])).toBeCloseTo(50, 9);
  });
  test("sources without a common period: the lowest; no sources: the pair's, else none", () => {
    expect(sizingFrequency(null, [1000, Math.PI * 1000])).toBe(1000);
    expect(sizingFrequency(decaying, [])).toBeCloseTo(5e3, 9);
    expect(sizingFrequency(null, [])).toBeNull();
  });
  test("the step period is the fastest source's when shorter", () => {
    expect(stepPeriod(1 / 300, [600, 900])).toBeCloseTo(1 / 900, 15);
    expect(stepPeriod(1e-3, [])).toBe(1e-3);
  });
});

describe("a half-wave rectifier (12 V, 50 Hz; diode; 100 µF ∥ 1 kΩ), until=auto", () => {
  test("settles, driven at 50 Hz, at the ripple scipy integrates (916.836 mV peak)", () => {
    const r = startupOf(RECTIFIER);
    expect(r.verdict, r.explanation).toBe("settled");
    expect(r.explanation).toContain("driven by a 50 Hz source");
    expect(Math.abs(r.frequency! / 50 - 1)).toBeLessThan(1e-6);
    // scipy solve_ivp (Radau, rtol 1e-10) of C·dv/dt = Id(12 sin(2π·50t) − v) − v/R with the diode's
    // default law (2.5 nA, n = 1.8, 0.5 Ω, 27 °C), half the peak-to-peak over t = 2.98…3 s: 0.9168359 V.
    const scipy = 0.9168359;
    expect(Math.abs(r.amplitude! - scipy)).toBeLessThanOrEqual(Math.max(r.numericalError?.amplitude ?? 0, 1e-4 * scipy));
    expect(Math.abs(r.amplitude! / scipy - 1)).toBeLessThan(0.01);
    // 100 steps per period of the 50 Hz source (not of an assumed 1 kHz)
    expect(r.run.maxStep).toBeCloseTo(1 / 50 / 100, 12);
    expect(r.run.until).toBeGreaterThan(1);
  });

  test("two sources, 600 Hz and 900 Hz: max-step is 1/100 of the faster's period", () => {
    const r = startupOf(`vsource V1 a gnd wave=sine amp=1 freq=600
vsource V2 b gnd wave=sine amp=0.5 freq=900
resistor R1 a o 10k
resistor R2 b o 10k
capacitor C1 o gnd 22n
startup probe=o until=20m
`);
    expect(r.run.maxStep).toBeCloseTo(1 / 900 / 100, 12);
  });
});

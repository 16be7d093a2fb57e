// Two sources, 600 Hz and 900 Hz, through 10 kΩ each into 22 nF (acceptance pass 7): the waveform
// repeats at their common period, 300 Hz, where it has no tone. Start-up called it a parasitic
// oscillation with a THD of 7 × 10⁸ %.
import { describe, expect, test } from "vitest";
import { runStartup, runSteady, type Circuit, type StartupAnalysis, type SteadyAnalysis } from "@onset/core";
import { noHarmonicInBand } from "../../../packages/core/src/analyses/thd-none.js";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const TWO_TONES = `vsource V1 a gnd wave=sine amp=1 freq=600
vsource V2 b gnd wave=sine amp=0.5 freq=900
resistor R1 a o 10k
resistor R2 b o 10k
capacitor C1 o gnd 22n
startup probe=o until=auto
`;

const circuitOf = (text: string): Circuit => elaborate(loadProgram("two-tones.onset", text).program, {}).circuit!;

describe("a two-tone drive through the start-up analysis", () => {
  const circuit = circuitOf(TWO_TONES);
  const r = runStartup(circuit, circuit.analyses.find((a) => a.kind === "startup") as StartupAnalysis);

  test("is a driven waveform at the sources' common period, 300 Hz", () => {
    expect(r.verdict, r.explanation).toBe("settled");
    expect(r.explanation).toContain("the sources' common period");
    expect(Math.abs(r.frequency! / 300 - 1)).toBeLessThan(1e-6);
  });

  test("has no THD, with the note the steady analysis gives, and its tones at the closed form", () => {
    expect(r.thd).toBeNull();
    expect(r.thdPlusNoise).toBeNull();
    expect(r.warnings.map((w) => w.code)).toContain("orbit-without-fundamental");
    // Closed form: Thevenin (V1 + V2)/2 behind 5 kΩ into 22 nF, |H| = 1/√(1 + (2πf·5k·22n)²).
    const tone = (amp: number, f: number) => amp / 2 / Math.hypot(1, 2 * Math.PI * f * 5e3 * 22e-9);
    expect(Math.abs(r.harmonics[1]!.amplitude / tone(1, 600) - 1)).toBeLessThan(1e-4);
    expect(Math.abs(r.harmonics[2]!.amplitude / tone(0.5, 900) - 1)).toBeLessThan(1e-4);
    expect(r.harmonics[1]!.dBc).toBe(0);
    expect(r.harmonics[0]!.amplitude).toBeLessThan(1e-6 * r.harmonics[1]!.amplitude);
  });
});

// A diode-limited Wien at 1.31 kHz measured with bandwidth=10 (acceptance pass 7): no harmonic
// lies below 10 Hz, yet THD counted the 2nd ("THD (2–2) 0.000013 %").
const WIEN = `opamp    U1 p n o preset=general rails=(-12, 12)
resistor  Rs o  x 12k
capacitor Cs x  p 10n
resistor  Rp p gnd 12k
capacitor Cp p gnd 10n
resistor  Rg n gnd 10k
resistor  Rf1 o m 15k
resistor  Rf2 m n 6.8k
diode D1 o m
diode D2 m o
`;

describe("bandwidth= below the 2nd harmonic", () => {
  test("noHarmonicInBand: the 2nd harmonic of f lies at 2f (mathematics)", () => {
    expect(noHarmonicInBand(10, 1313)).toBe(true);
    expect(noHarmonicInBand(2625, 1313)).toBe(true);
    expect(noHarmonicInBand(2626, 1313)).toBe(false);
    expect(noHarmonicInBand(undefined, 1313)).toBe(false);
  });

  test.each(["steady", "startup"])("%s: THD none, with a note naming bandwidth=; above 2f it is measured", (kind) => {
    const run = (bandwidth: string) => {
      const circuit = circuitOf(`${WIEN}${kind} probe=o bandwidth=${bandwidth}\n`);
      const analysis = circuit.analyses.find((a) => a.kind === kind)!;
      return kind === "steady" ? runSteady(circuit, analysis as SteadyAnalysis) : runStartup(circuit, analysis as StartupAnalysis);
    };
    const narrow = run("10");
    expect(narrow.frequency!).toBeGreaterThan(1e3);
    expect(narrow.thd).toBeNull();
    const note = narrow.warnings.find((w) => w.code === "no-harmonic-in-band")!;
    expect(note.message).toContain("bandwidth=10 Hz");
    const wide = run("3k");
    expect(wide.thd).not.toBeNull();
    expect(wide.warnings.map((w) => w.code)).not.toContain("no-harmonic-in-band");
  });
});

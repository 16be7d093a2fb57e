// Two sources, 600 Hz and 900 Hz, through 10 kΩ each into 22 nF (acceptance pass 7): the waveform
// repeats at their common period, 300 Hz, where it has no tone. Start-up called it a parasitic
// oscillation with a THD of 7 × 10⁸ %.
import { describe, expect, test } from "vitest";
import { runStartup, type Circuit, type StartupAnalysis } from "@onset/core";
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

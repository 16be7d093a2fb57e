// A driven waveform measured by the start-up analysis, as a user runs it (issue 12, item 2):
// the noise floor is only what the tool itself injects, so a signal present from t = 0 is
// measured like any settled waveform.
import { describe, expect, test } from "vitest";
import { runStartup, type PartSpec, type StartupKick } from "@onset/core";
import { circuit, part } from "../../support/circuits.js";

const node = (n: string) => ({ kind: "node", node: n }) as const;
const startup = (parts: PartSpec[], kick: StartupKick) => runStartup(circuit(parts), { kind: "startup", probe: node("x"), until: 20e-3, kick });

/** √(Σ_{h=2..10} b_h²)/b_1 of a Fourier series given its amplitudes b_h (mathematics). */
function truncatedThd(b: (h: number) => number): number {
  let sum = 0;
  for (let h = 2; h <= 10; h++) sum += b(h) ** 2;
  return Math.sqrt(sum) / Math.abs(b(1));
}

describe("driven waveforms through the start-up analysis", () => {
  test.each<StartupKick>(["none", "thermal", "noise", "power-on"])("a 2.5 V, 1.2 kHz sine source across a resistor, kick=%s: settled, 1.2 kHz, 2.5 V, no distortion", (kick) => {
    const r = startup([part("vsource", "V1", ["x", "gnd"], undefined, { wave: "sine", amp: 2.5, freq: 1200 }), part("resistor", "R1", ["x", "gnd"], 1e3)], kick);
    expect(r.verdict).toBe("settled");
    expect(r.explanation).toContain("driven by a 1.2 kHz source");
    expect(Math.abs(r.frequency! / 1200 - 1)).toBeLessThan(1e-6);
    // the thermal noise of 1 kΩ across an ideal source is zero; a noise kick leaves nA·1 kΩ = µV
    expect(Math.abs(r.amplitude! / 2.5 - 1)).toBeLessThan(1e-4);
    expect(r.thd!).toBeLessThan(1e-5);
  });

  test("a ±1 V square wave (pulse source) into an RC load, kick=none: THD to the 10th harmonic = 0.428795 (Fourier series 4/(πn), odd n) within 1 %", () => {
    const f = 1e3;
    const r = startup(
      [
        part("vsource", "V1", ["x", "gnd"], undefined, { wave: "pulse", low: -1, high: 1, width: 0.5 / f, period: 1 / f, delay: 0.25 / f }),
        part("resistor", "R1", ["x", "gnd"], 1e3),
      ],
      "none",
    );
    const expected = truncatedThd((n) => (n % 2 === 1 ? 4 / (Math.PI * n) : 0));
    expect(r.verdict).toBe("settled");
    expect(r.dutyCycle).toBeNull();
    expect(Math.abs(r.thd! / expected - 1)).toBeLessThan(0.01);
  });

  test("a triangle (pulse with width=0, rise + fall = period), kick=thermal: THD to the 10th = 0.120477 (Fourier series 8/(π²n²), odd n) within 0.5 %", () => {
    const f = 1e3;
    const r = startup(
      [
        part("vsource", "V1", ["x", "gnd"], undefined, { wave: "pulse", low: -1, high: 1, rise: 0.5 / f, fall: 0.5 / f, width: 0, period: 1 / f }),
        part("resistor", "R1", ["x", "gnd"], 1e3),
      ],
      "thermal",
    );
    const expected = truncatedThd((n) => (n % 2 === 1 ? 8 / (Math.PI * Math.PI * n * n) : 0));
    expect(expected).toBeCloseTo(0.120477, 6);
    expect(r.verdict).toBe("settled");
    expect(Math.abs(r.frequency! / f - 1)).toBeLessThan(1e-6);
    expect(Math.abs(r.amplitude! - 1)).toBeLessThan(1e-6);
    expect(Math.abs(r.thd! / expected - 1)).toBeLessThan(0.005);
  });
});

// Waveforms driven through the engine by its own sources, measured by the start-up metrics.
import { describe, expect, test } from "vitest";
import { measureStartup, opampPresets, runTransient, type PartSpec } from "@onset/core";
import { circuit, part } from "../../support/circuits.js";
import { fourParameterFit } from "../../support/sine-fit.js";

const f = 1e3;
const cycles = 20;

function record(parts: PartSpec[], probe = "o") {
  const r = runTransient(
    circuit(parts),
    { kind: "transient", until: cycles / f, maxStep: 1 / (f * 200), start: "bias", probes: [{ kind: "node", node: probe }] },
    { tolerances: { lteRelative: 1e-6 } },
  );
  return { t: r.time, v: r.signals[0]!.values };
}

/** √(Σ_{h=2..10} b_h²)/b_1 of a Fourier series given its amplitudes b_h (mathematics). */
function truncatedThd(b: (h: number) => number): number {
  let sum = 0;
  for (let h = 2; h <= 10; h++) sum += b(h) ** 2;
  return Math.sqrt(sum) / Math.abs(b(1));
}

describe("THD of driven waveforms against their Fourier series (docs/references.md §4)", () => {
  test("square wave from a pulse source: odd harmonics 4/(πn), THD to the 10th = 0.428795", () => {
    const { t, v } = record([
      part("vsource", "V1", ["o", "gnd"], undefined, { wave: "pulse", low: -1, high: 1, width: 0.5 / f, period: 1 / f, delay: 0.25 / f }),
      part("resistor", "R1", ["o", "gnd"], 1e3),
    ]);
    const expected = truncatedThd((n) => (n % 2 === 1 ? 4 / (Math.PI * n) : 0));
    expect(expected).toBeCloseTo(0.428795, 6);
    // Told that a 1 kHz source drives it, the square wave is a settled (driven) waveform; alone its
    // shape would make it a relaxation oscillation.
    const m = measureStartup(t, v, { drives: [f] });
    expect(m.verdict).toBe("settled");
    expect(measureStartup(t, v).verdict).toBe("relaxation");
    // edges are steps the solver lands on; resampling smooths them over one sample (≈ 0.3 %)
    expect(Math.abs(m.thd! / expected - 1)).toBeLessThan(0.01);
  });

  test("triangle wave from a steps source: odd harmonics 8/(π²n²), THD to the 10th = 0.120477 (docs/references.md §4 give 0.121142 to the 40th)", () => {
    const points: number[] = [];
    for (let k = 0; k <= 2 * cycles; k++) points.push(k / (2 * f), k % 2 === 0 ? -1 : 1);
    const { t, v } = record([part("vsource", "V1", ["o", "gnd"], undefined, { wave: "steps", points }), part("resistor", "R1", ["o", "gnd"], 1e3)]);
    const expected = truncatedThd((n) => (n % 2 === 1 ? 8 / (Math.PI * Math.PI * n * n) : 0));
    expect(expected).toBeCloseTo(0.120477, 6);
    expect(Math.abs(measureStartup(t, v).thd! / expected - 1)).toBeLessThan(0.005);
  });

  test.each([0.9, 0.7, 0.5])("sine hard-clipped at c = %d by an ideal op-amp follower: the docs/references.md §4 closed form truncated to 10 harmonics", (c) => {
    const { t, v } = record([
      part("vsource", "V1", ["i", "gnd"], undefined, { wave: "sine", amp: 1, freq: f }),
      part("opamp", "U1", ["i", "o", "o"], undefined, { ...opampPresets.ideal, rails: [-c, c], headroom: 0, knee: 1e-5 }),
    ]);
    const theta = Math.asin(c);
    const b = (n: number) =>
      n === 1
        ? (2 / Math.PI) * (theta + c * Math.cos(theta))
        : n % 2 === 0
          ? 0
          : (4 / Math.PI) * (Math.sin((n - 1) * theta) / (2 * (n - 1)) - Math.sin((n + 1) * theta) / (2 * (n + 1)) + (c * Math.cos(n * theta)) / n);
    // docs/references.md §4 for c = 0.9, 0.7, 0.5: all-harmonic THD_F 0.042199, 0.137588, 0.232938
    const expected = truncatedThd(b);
    expect(Math.abs(measureStartup(t, v).thd! / expected - 1)).toBeLessThan(0.02);
  });
});

describe("a driven sine against an independent IEEE 1057 four-parameter fit (docs/references.md §5)", () => {
  test("a 1 kHz sine through an RC low-pass: frequency and amplitude agree to 1e-5", () => {
    const { t, v } = record([
      part("vsource", "V1", ["i", "gnd"], undefined, { wave: "sine", amp: 2, freq: f, offset: 0.3 }),
      part("resistor", "R1", ["i", "o"], 1e3),
      part("capacitor", "C1", ["o", "gnd"], 100e-9),
    ]);
    const m = measureStartup(t, v);
    // the fit over the same last 10 cycles the metrics measure (the RC transient has died away)
    const from = t.findIndex((x) => x >= (cycles - 10) / f);
    const fit = fourParameterFit(t.slice(from), v.slice(from), 990, true);
    expect(Math.abs(m.frequency! / fit.frequency - 1)).toBeLessThan(1e-5);
    expect(Math.abs(m.amplitude! / fit.amplitude - 1)).toBeLessThan(1e-5);
    // and both against the circuit: |H| = 1/√(1 + (ωRC)²) (mathematics)
    const w = 2 * Math.PI * f * 1e3 * 100e-9;
    expect(Math.abs(fit.amplitude / (2 / Math.sqrt(1 + w * w)) - 1)).toBeLessThan(1e-4);
    expect(Math.abs(fit.frequency / f - 1)).toBeLessThan(1e-6);
  });
});

// Issue 15: a driven circuit's orbit has the sources' common period. Two tones whose frequencies
// are in a ratio of small whole numbers (1 kHz and 1.5 kHz) repeat together every 2 ms; the orbit
// then has no tone at its own fundamental (500 Hz), so there is no THD to give.
import { describe, expect, test } from "vitest";
import { runSteady } from "@onset/core";
import { fundamentalAbsent, relativeToLargest } from "../../../packages/core/src/steady/absent-fundamental.js";
import { circuit, part } from "../../support/circuits.js";

const R = 1e3;
const C = 100e-9;
/** |H(jω)| of the RC low-pass (closed form). */
const gain = (f: number) => 1 / Math.hypot(1, 2 * Math.PI * f * R * C);

function twoTones(f1: number, f2: number) {
  return circuit([
    part("vsource", "V1", ["in", "mid"], undefined, { wave: "sine", amp: 1, freq: f1 }),
    part("vsource", "V2", ["mid", "gnd"], undefined, { wave: "sine", amp: 0.5, freq: f2 }),
    part("resistor", "R1", ["in", "o"], R),
    part("capacitor", "C1", ["o", "gnd"], C),
  ]);
}

describe("steady with two driving tones (closed form: the RC low-pass's gain at each tone)", () => {
  test("1 kHz and 1.5 kHz share a 2 ms period: each tone's harmonic has the low-pass's amplitude, and no THD is given", () => {
    const r = runSteady(twoTones(1e3, 1.5e3), { kind: "steady", probe: { kind: "node", node: "o" } });
    expect(r.found).toBe(true);
    expect(r.kind).toBe("driven");
    expect(r.period).toBeCloseTo(2e-3, 12);
    const [first, second, third] = r.harmonics;
    expect(Math.abs(second!.amplitude / gain(1e3) - 1)).toBeLessThan(1e-4);
    expect(Math.abs(third!.amplitude / (0.5 * gain(1.5e3)) - 1)).toBeLessThan(1e-4);
    expect(first!.amplitude).toBeLessThan(1e-9);
    expect(r.thd).toBeNull();
    expect(second!.dBc).toBe(0);
    expect(third!.dBc).toBeCloseTo(20 * Math.log10((0.5 * gain(1.5e3)) / gain(1e3)), 3);
    expect(r.warnings.map((w) => w.code)).toContain("orbit-without-fundamental");
  });

  test("1 kHz and 3 kHz: the lowest tone's period, THD measured against it", () => {
    const r = runSteady(twoTones(1e3, 3e3), { kind: "steady", probe: { kind: "node", node: "o" } });
    expect(r.period).toBeCloseTo(1e-3, 12);
    // THD = the 3rd harmonic over the fundamental (its definition), each through the low-pass.
    expect(Math.abs(r.thd! / ((0.5 * gain(3e3)) / gain(1e3)) - 1)).toBeLessThan(1e-4);
    expect(r.warnings.map((w) => w.code)).not.toContain("orbit-without-fundamental");
  });

  test("tones with no common period within 64 of the lowest's: no orbit, and why", () => {
    const r = runSteady(twoTones(1e3, 1e3 * Math.SQRT2), { kind: "steady", probe: { kind: "node", node: "o" } });
    expect(r.found).toBe(false);
    expect(r.explanation).toMatch(/no common period within 64 periods of the lowest/);
  });
});

describe("fundamentalAbsent and relativeToLargest (mathematics: dB of amplitude ratios)", () => {
  const list = (amplitudes: number[]) => amplitudes.map((amplitude, k) => ({ order: k + 1, frequency: 500 * (k + 1), amplitude, dBc: 0 }));
  test("a fundamental 60 dB or more below the largest harmonic is absent; one above is not", () => {
    expect(fundamentalAbsent(list([1e-7, 0.2, 0.1]))).toBe(true);
    expect(fundamentalAbsent(list([1e-4, 0.2, 0.1]))).toBe(true);
    expect(fundamentalAbsent(list([1e-3, 0.2, 0.1]))).toBe(false);
    expect(fundamentalAbsent(list([0, 0, 0]))).toBe(false);
  });
  test("levels relative to the largest harmonic", () => {
    const levels = relativeToLargest(list([1e-12, 1, 0.1])).map((h) => h.dBc);
    expect(levels[1]).toBe(0);
    expect(levels[2]).toBeCloseTo(-20, 12);
    expect(levels[0]).toBeCloseTo(-240, 9);
  });
});

describe("steady with a noise source (mathematics: a random signal has no period)", () => {
  const noisy = (stop?: number) =>
    circuit([
      part("isource", "In", ["gnd", "o"], undefined, { wave: "noise", rms: 1e-6, seed: 7, corner: 50e3, ...(stop === undefined ? {} : { stop }) }),
      part("vsource", "V1", ["in", "gnd"], undefined, { wave: "sine", amp: 1, freq: 1e3 }),
      part("resistor", "R1", ["in", "o"], R),
      part("capacitor", "C1", ["o", "gnd"], C),
    ]);
  test("a noise source that never stops: no orbit, at once, and why", () => {
    const r = runSteady(noisy(), { kind: "steady", probe: { kind: "node", node: "o" } });
    expect(r.found).toBe(false);
    expect(r.explanation).toMatch(/^no periodic orbit: In is a noise source that never stops/);
    expect(r.transient.periods).toBe(0);
  });
});

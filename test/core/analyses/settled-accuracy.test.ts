import { describe, expect, test } from "vitest";
import { measureStartup, opampPresets, runStartup, runTransient, type PartSpec } from "@onset/core";
import { circuit, part, wienNetwork } from "../../support/circuits.js";

const node = (n: string) => ({ kind: "node", node: n }) as const;

/** Equal-RC Wien bridge (R = 1 k, C = 100 nF) at gain A around `amplifier`, clipping at ±10 V. */
function wien(A: number, amplifier: Record<string, unknown>): PartSpec[] {
  return [
    ...wienNetwork({ R1: 1e3, R2: 1e3, C1: 100e-9, C2: 100e-9 }),
    part("resistor", "Rf", ["o", "n"], (A - 1) * 1e3),
    part("resistor", "Rg", ["n", "gnd"], 1e3),
    part("opamp", "U1", ["p", "n", "o"], undefined, { rails: [-10, 10], ...amplifier }),
  ];
}

describe("settled figures from the periodic orbit, with error bars (docs/references.md §2.4: ideal clip(A·v₊, ±10 V), DOP853/Radau at rtol 1e-10)", () => {
  test.each([
    [3.1, 1580.7013, 10.73461, 0.051234],
    [3.3, 1541.4769, 11.3473, 0.115782],
  ])("A = %d at default settings: frequency %d Hz and fundamental %d V within their error bars; THD (every harmonic) within 0.05 %", (A, f, fundamental, thd) => {
    const r = runStartup(circuit(wien(A, { ...opampPresets.ideal, knee: 1e-4 })), { kind: "startup", probe: node("o"), until: "auto", harmonics: 100 });
    expect(r.verdict).toBe("settled");
    expect(r.settled.from).toBe("orbit");
    const e = r.numericalError!;
    // The reference has 8 significant digits: its own rounding is added to the bar.
    expect(Math.abs(r.frequency! - f)).toBeLessThanOrEqual(e.frequency + 1e-4);
    expect(e.frequency / f).toBeLessThan(2e-4);
    expect(Math.abs(r.harmonics[0]!.amplitude / fundamental - 1)).toBeLessThan(1e-4);
    expect(Math.abs(r.thd! / thd - 1)).toBeLessThan(5e-4);
    expect(r.thdOrders).toEqual([2, 100]);
  });

  test("a run that does not settle keeps its own figures and no error bar", () => {
    const r = runStartup(circuit(wien(3.1, { ...opampPresets.ideal, knee: 1e-4 })), { kind: "startup", probe: node("o"), until: 5e-3 });
    expect(r.verdict).not.toBe("settled");
    expect(r.numericalError).toBeNull();
    expect(r.settled.from).toBe("run");
  });
});

describe("the stepper's formulas are second order on every state, the op-amp's pole included", () => {
  test("the settled amplitude of a GBW-limited Wien bridge at fixed steps: halving the step quarters the error (mathematics: a second-order method)", () => {
    // 1 MHz GBW at 1.6 kHz with gain 3: the amplifier's phase lag sets the amplitude, so a
    // first-order pole row would show a first-order amplitude error.
    // Started from rest with 0.1 V on C2, at fixed steps (an LTE tolerance nothing reaches).
    const parts = wien(3.05, { gain: 200e3, gbw: 1e6, slew: Infinity, knee: 1e-2 }).map((p) => (p.name === "C2" ? { ...p, options: { initial: 0.1 } } : p));
    parts.push(part("diode", "D1", ["n", "o"]), part("diode", "D2", ["o", "n"]));
    const amplitudeAt = (h: number) => {
      const r = runTransient(
        circuit(parts),
        { kind: "transient", until: 0.08, maxStep: h, start: "rest", probes: [node("o")] },
        { tolerances: { lteRelative: 1e9, lteVoltage: 1e9, lteCurrent: 1e9 } },
      );
      return measureStartup(r.time, r.signals[0]!.values).amplitude!;
    };
    const T = 1 / 1591.5;
    const [a1, a2, a3] = [amplitudeAt(T / 50), amplitudeAt(T / 100), amplitudeAt(T / 200)];
    const ratio = (a1 - a2) / (a2 - a3);
    expect(ratio).toBeGreaterThan(3);
    expect(ratio).toBeLessThan(5.5);
  });

  test("a stiff clamped pole does not ring: at steps a thousand times its closed-loop time constant the pole node moves smoothly", () => {
    // A near-ideal follower clipping a sine: the closed-loop pole is at about 1 GHz, the steps are microseconds.
    const r = runTransient(
      circuit([
        part("vsource", "V1", ["i", "gnd"], undefined, { wave: "sine", amp: 12, freq: 1e3 }),
        part("opamp", "U1", ["i", "o", "o"], undefined, { ...opampPresets.ideal, rails: [-10, 10] }),
        part("resistor", "RL", ["o", "gnd"], 1e3),
      ]),
      { kind: "transient", until: 3e-3, maxStep: 5e-6, start: "bias", probes: [{ kind: "state", part: "U1", state: "pole" }] },
    );
    const x = r.signals[0]!.values;
    // Sign-alternating step-to-step differences (a trapezoidal pole rings as (−1)ⁿ) would show as
    // many reversals of the second difference's sign with a size far above the tolerance.
    let ringing = 0;
    for (let k = 3; k < x.length; k++) {
      const d1 = x[k]! - x[k - 1]!;
      const d0 = x[k - 1]! - x[k - 2]!;
      const dm = x[k - 2]! - x[k - 3]!;
      if (d1 * d0 < 0 && d0 * dm < 0 && Math.abs(d0) > 1e-3) ringing++;
    }
    expect(ringing).toBe(0);
    expect(Math.max(...x)).toBeLessThan(10.01);
  });
});

describe("THD+N counts everything in the band but the fundamental", () => {
  test("a 1 kHz sine plus 0.01 % at 2.5 kHz (no harmonic): THD ≈ 0, THD+N = 1e-4 (mathematics: orthogonal sines over whole periods)", () => {
    const r = runStartup(
      circuit([
        part("vsource", "V1", ["m", "gnd"], undefined, { wave: "sine", amp: 1, freq: 1e3 }),
        part("vsource", "V2", ["o", "m"], undefined, { wave: "sine", amp: 1e-4, freq: 2.5e3 }),
        part("resistor", "R1", ["o", "gnd"], 1e3),
      ]),
      { kind: "startup", probe: node("o"), until: 20e-3, kick: "none", harmonics: 10 },
    );
    expect(r.verdict).toBe("settled");
    expect(r.thd!).toBeLessThan(1e-6);
    expect(Math.abs(r.thdPlusNoise! / 1e-4 - 1)).toBeLessThan(1e-2);
  });
});

describe("THD+N beside the orbit's THD", () => {
  test("the orbit's THD plus the run's noise in power: never below THD (mathematics: power of orthogonal components adds)", () => {
    const r = runStartup(circuit(wien(3.1, { ...opampPresets.ideal, knee: 1e-4 })), { kind: "startup", probe: node("o"), until: "auto" });
    expect(r.settled.from).toBe("orbit");
    expect(r.thdPlusNoise!).toBeGreaterThanOrEqual(r.thd!);
    // thermal noise at the µV level of a 10 V swing adds far less than the harmonics
    expect(r.thdPlusNoise! / r.thd! - 1).toBeLessThan(1e-3);
  });
});

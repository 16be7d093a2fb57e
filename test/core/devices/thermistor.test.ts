import { describe, expect, test } from "vitest";
import { runBias, runTransient } from "@onset/core";
import { DEFAULT_AMBIENT, REFERENCE_TEMPERATURE } from "@onset/core/engine";
import { circuit, part, sampleAt } from "../../support/circuits.js";

// A small bead NTC: 10 kΩ at 25 °C, B = 3500 K, 1 mW/K, 2 s (values of our own).
const NTC = { r25: 10e3, beta: 3500, dissipation: 1e-3, tau: 2 };
const ntc = (options: Record<string, number> = {}) => part("thermistor", "TH1", ["a", "gnd"], NTC.r25, { beta: NTC.beta, dissipation: NTC.dissipation, tau: NTC.tau, ...options });
/** The B-parameter law R = R25·exp(B·(1/θ − 1/298.15 K)) (the thermistor's defining equation). */
const law = (kelvin: number, beta = NTC.beta) => NTC.r25 * Math.exp(beta * (1 / kelvin - 1 / REFERENCE_TEMPERATURE));
const temperature = { kind: "state", part: "TH1", state: "temperature" } as const;

describe("thermistor", () => {
  test("R(θ) follows the B-parameter law: unheated at the 27 °C ambient, R = R25·exp(B·(1/300.15 − 1/298.15))", () => {
    const bias = runBias(circuit([part("isource", "I1", ["gnd", "a"], 1e-7), ntc()]), { kind: "bias" });
    const v = bias.nodes.find((n) => n.node === "a")!.voltage;
    expect(v / 1e-7 / law(DEFAULT_AMBIENT)).toBeCloseTo(1, 6);
  });

  test("self-heated at a steady current, θ − θ_amb = P/D and R = R(θ) (dissipation constant D, B-parameter law)", () => {
    const i = 2e-3;
    const r = runTransient(circuit([part("isource", "I1", ["gnd", "a"], i), ntc()]), { kind: "transient", until: 1e-3, start: "bias", probes: [{ kind: "node", node: "a" }, temperature] });
    const v = r.signals[0]!.values[0]!;
    const theta = r.signals[1]!.values[0]!;
    expect(r.signals[1]!.unit).toBe("K");
    expect(theta - DEFAULT_AMBIENT).toBeGreaterThan(5);
    expect((theta - DEFAULT_AMBIENT) / ((v * i) / NTC.dissipation)).toBeCloseTo(1, 6);
    expect(v / i / law(theta)).toBeCloseTo(1, 6);
  });

  test("a step of power reaches 63 % of its temperature rise in tau (first-order network R_th = 1/D, C_th = tau·D; datasheet definition of tau)", () => {
    // With B = 1 mK the resistance stays within 1e-7 of R25·e^(…) over the rise, so a current
    // step is a power step.
    const i = 2e-3;
    const r = runTransient(
      circuit([part("isource", "I1", ["gnd", "a"], undefined, { wave: "pulse", low: 0, high: i, delay: 0.1 }), ntc({ beta: 1e-3 })]),
      { kind: "transient", until: 0.1 + 5 * NTC.tau, maxStep: 0.01, start: "bias", probes: [temperature] },
      // The step control judges a temperature against its running peak (~320 K); a tighter
      // setting makes the 20 K rise exact to 1e-5.
      { tolerances: { lteRelative: 1e-7 } },
    );
    const rise = (i * i * law(DEFAULT_AMBIENT, 1e-3)) / NTC.dissipation;
    const at = (t: number) => sampleAt(r.time, r.signals[0]!.values, t) - DEFAULT_AMBIENT;
    expect(at(0.1 + NTC.tau) / rise).toBeCloseTo(1 - Math.exp(-1), 4);
    expect(at(0.1 + 5 * NTC.tau) / rise).toBeCloseTo(1 - Math.exp(-5), 4);
  });

  test("the ambient is the start-up analysis's temperature=", async () => {
    const { runStartup } = await import("@onset/core");
    const parts = [part("isource", "I1", ["gnd", "a"], undefined, { wave: "sine", amp: 1e-7, freq: 1e3 }), ntc()];
    const probe = { kind: "node", node: "a" } as const;
    const at25 = runStartup(circuit(parts), { kind: "startup", probe, until: 5e-3, kick: "none", temperature: 25 });
    // unheated at 25 °C the thermistor is R25: the driven amplitude is R25 · 100 nA
    expect(at25.amplitude! / (NTC.r25 * 1e-7)).toBeCloseTo(1, 3);
  });

  test("beta must be positive: a positioned error with a hint", () => {
    const p = { ...ntc({ beta: 0 }), span: { file: "t.onset", start: 3, end: 9 } };
    try {
      runBias(circuit([part("isource", "I1", ["gnd", "a"], 1e-6), p]), { kind: "bias" });
      expect.unreachable();
    } catch (e) {
      const d = (e as { diagnostic: { message: string; hint: string; span: unknown } }).diagnostic;
      expect(d.message).toBe("thermistor TH1: B constant must be positive and finite, got 0 K");
      expect(d.hint).toBe("write a B constant greater than 0 K");
      expect(d.span).toEqual({ file: "t.onset", start: 3, end: 9 });
    }
  });
});

describe("thermistor in the poles analysis", () => {
  test("linearised at its bias temperature: on a fixed voltage the thermal pole is −(D − P·B/θ²)/C_th (heat balance differentiated, docs/references.md §12.2)", async () => {
    const { runPoles } = await import("@onset/core");
    for (const volts of [0, 3, 6]) {
      const parts = [part("vsource", "V1", ["a", "gnd"], volts), ntc()];
      const r = runPoles(circuit(parts), { kind: "poles" });
      const theta = runTransient(circuit(parts), { kind: "transient", until: 1e-6, start: "bias", probes: [temperature] }).signals[0]!.values[0]!;
      const power = (volts * volts) / law(theta);
      const expected = -(NTC.dissipation - (power * NTC.beta) / (theta * theta)) / (NTC.tau * NTC.dissipation);
      expect(r.poles.length).toBe(1);
      expect(r.poles[0]!.real / expected).toBeCloseTo(1, 9);
    }
  });
});

import { describe, expect, test } from "vitest";
import { runStartup, type PartSpec } from "@onset/core";
import { DEFAULT_AMBIENT, lampNetwork, REFERENCE_TEMPERATURE, TUNGSTEN_EXPONENT } from "@onset/core/engine";
import { circuit, part, wienNetwork } from "../../support/circuits.js";

// Closed form of the settled amplitude (docs/references.md §2.1 for the Wien bridge): the loop
// settles where the gain network gives exactly 3 (equal R and C), which fixes the stabiliser's
// mean resistance; its law gives the temperature, the thermal network the dissipated power, and
// P = V²/R the r.m.s. voltage across it. With the temperature ripple small (tau ≫ period) the
// waveform is a sine, so the peak is √2 times the r.m.s.

const R = 15.9e3;
const C = 10e-9;
// An op-amp with a gain-bandwidth far above f0, so the gain network needs 3 to within 1e-5.
const amplifier = part("opamp", "U1", ["p", "n", "o"], undefined, { gain: 1e7, gbw: 1e9, slew: Infinity, rout: 1e-3, rin: Infinity, headroom: 0, knee: 1e-3, noise: 20e-9, rails: [-15, 15] });
const probe = { kind: "node", node: "o" } as const;

function settledAmplitude(parts: PartSpec[], until: number): number {
  const r = runStartup(circuit([...wienNetwork({ R1: R, R2: R, C1: C, C2: C }), amplifier, ...parts]), { kind: "startup", probe, until });
  expect(r.verdict).toBe("settled");
  return r.amplitude!;
}

describe("amplitude-stabilised Wien bridges against the closed form", () => {
  test("lamp as the lower leg: R_lamp = Rf/2 → θ = θ_amb·(R/COLD)^(1/1.2) → P = (θ − θ_amb)/R_th → peak = 3·√(2·P·R)", () => {
    const lamp = { cold: 100, hot: 1000, rated: 12, tau: 0.04 };
    const rf = 293;
    const rLamp = rf / 2;
    const theta = DEFAULT_AMBIENT * Math.pow(rLamp / lamp.cold, 1 / TUNGSTEN_EXPONENT);
    const power = (theta - DEFAULT_AMBIENT) / lampNetwork(lamp, DEFAULT_AMBIENT).resistance;
    const expected = 3 * Math.sqrt(2 * power * rLamp);
    const got = settledAmplitude([part("resistor", "Rf", ["o", "n"], rf), part("lamp", "L1", ["n", "gnd"], lamp.cold, { hot: lamp.hot, rated: lamp.rated, tau: lamp.tau })], 1.2);
    // the issue asks for 2 %; measured 0.02 %
    expect(Math.abs(got / expected - 1)).toBeLessThan(0.005);
  });

  test("NTC thermistor as the upper leg: R_th = 2·Rg → 1/θ = 1/298.15 + ln(R/R25)/B → P = D·(θ − θ_amb) → peak = (3/2)·√(2·P·R)", () => {
    const ntc = { r25: 10e3, beta: 3500, dissipation: 40e-6, tau: 0.05 };
    // cold (9.25 kΩ at 27 °C) the gain is 3.8: below 4, where the Wien poles would turn real
    const rg = 3.3e3;
    const rNtc = 2 * rg;
    const theta = 1 / (1 / REFERENCE_TEMPERATURE + Math.log(rNtc / ntc.r25) / ntc.beta);
    const power = ntc.dissipation * (theta - DEFAULT_AMBIENT);
    // the thermistor carries 2/3 of the output voltage
    const expected = 1.5 * Math.sqrt(2 * power * rNtc);
    const got = settledAmplitude([part("thermistor", "TH1", ["o", "n"], ntc.r25, { beta: ntc.beta, dissipation: ntc.dissipation, tau: ntc.tau }), part("resistor", "Rg", ["n", "gnd"], rg)], 1.5);
    // the issue asks for 2 %; measured 0.02 %
    expect(Math.abs(got / expected - 1)).toBeLessThan(0.005);
  });
});

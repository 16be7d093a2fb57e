// largestStateDrift: the change of each charged state's mean from one period to the next, over its
// largest magnitude. Checked against closed forms on an RC discharge and a lossless LC tank.
import { describe, expect, test } from "vitest";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { buildSystem } from "../../../packages/core/src/solver/system.js";
import { DEFAULT_TOLERANCES } from "../../../packages/core/src/solver/tolerances.js";
import { TransientStepper } from "../../../packages/core/src/analyses/stepper.js";
import { largestStateDrift } from "../../../packages/core/src/analyses/state-drift.js";

const systemOf = (text: string) => buildSystem(buildCircuit(loadSource("state-drift.onset", text)).circuit);
const startOf = (system: ReturnType<typeof systemOf>, maxStep: number) => new TransientStepper(system, { start: "rest", maxStep, tolerances: DEFAULT_TOLERANCES }).snapshot();

describe("largestStateDrift(quiet, snapshot, period, maxStep, tolerances)", () => {
  test("a capacitor discharging (τ = 100 ms) over periods of 1 ms: (τ/T)·(1 − e^(−T/τ))² (closed form: the means of V₀e^(−t/τ) over [0, T] and [T, 2T], over V₀) within 1e-3", () => {
    const system = systemOf("capacitor C1 a gnd 1u initial=1\nresistor R1 a gnd 100k");
    const T = 1e-3;
    const tau = 0.1;
    const drift = largestStateDrift(system, startOf(system, T / 100), T, T / 100, DEFAULT_TOLERANCES);
    expect(drift.label).toBe("a");
    expect(Math.abs(drift.share / ((tau / T) * (1 - Math.exp(-T / tau)) ** 2) - 1)).toBeLessThan(1e-3);
  });

  test("a lossless LC tank over its own period 2π√(LC) (closed form): every state repeats, the share far below the settled tolerance 1e-3", () => {
    const system = systemOf("capacitor C1 a gnd 1u initial=1\ninductor L1 a gnd 1m");
    const T = 2 * Math.PI * Math.sqrt(1e-3 * 1e-6);
    const drift = largestStateDrift(system, startOf(system, T / 100), T, T / 100, DEFAULT_TOLERANCES);
    expect(drift.share).toBeLessThan(1e-5);
  });

  test("the tank over a period 1e-4 off its own (a measured period's error is smaller): the means move by about 1e-4 (a steep state's end by 6e-4 of its swing)", () => {
    const system = systemOf("capacitor C1 a gnd 1u initial=1\ninductor L1 a gnd 1m");
    const T = 1.0001 * 2 * Math.PI * Math.sqrt(1e-3 * 1e-6);
    // closed form: the means of cos over [0, 1.0001·2π] and the next such span differ by at most 2·sin(2π·1e-4)/2π ≈ 2e-4
    const drift = largestStateDrift(system, startOf(system, T / 100), T, T / 100, DEFAULT_TOLERANCES);
    expect(drift.share).toBeLessThan(2e-4);
  });
});

import { describe, expect, test } from "vitest";
import { buildSystem, TransientStepper, type StepperSnapshot } from "@onset/core/engine";
import { circuit, part, wienNetwork } from "../../support/circuits.js";

// A diode-limited Wien oscillator kicked by a noise current, beside a pulse-driven RC: nonlinear
// devices, a stiff op-amp pole, breakpoints and a running factorisation all carry across a snapshot.
const oscillator = circuit([
  ...wienNetwork({ R1: 10e3, R2: 10e3, C1: 10e-9, C2: 10e-9 }),
  part("resistor", "Rg", ["n", "gnd"], 10e3),
  part("resistor", "Rf", ["n", "o"], 22e3),
  part("diode", "D1", ["n", "o"]),
  part("diode", "D2", ["o", "n"]),
  part("opamp", "U1", ["p", "n", "o"], undefined, { rails: [-12, 12] }),
  part("isource", "K", ["gnd", "p"], undefined, { wave: "noise", rms: 1e-6, seed: 3, corner: 20e3, stop: 2e-3 }),
  part("vsource", "V1", ["in", "gnd"], undefined, { wave: "pulse", low: 0, high: 1, rise: 1e-6, fall: 1e-6, width: 0.3e-3, period: 0.7e-3 }),
  part("resistor", "R9", ["in", "q"], 1e3),
  part("capacitor", "C9", ["q", "gnd"], 47e-9),
]);
const until = 12e-3;
const settings = { start: "bias" as const, maxStep: 2e-6 };

function record(stepper: TransientStepper, take?: { at: number; into: (s: StepperSnapshot) => void }) {
  const points: number[][] = [];
  stepper.observe((t, x, dxdt) => {
    points.push([t, ...x, ...dxdt]);
    if (take && points.length === take.at) take.into(stepper.snapshot());
  });
  stepper.advance(until);
  return points;
}

describe("TransientStepper snapshots", () => {
  test("a run resumed from a snapshot equals the run in one piece, bit for bit", () => {
    let snapshot: StepperSnapshot | undefined;
    const whole = record(new TransientStepper(buildSystem(oscillator), settings), { at: 5000, into: (s) => (snapshot = s) });
    expect(snapshot).toBeDefined();
    const resumed = record(new TransientStepper(buildSystem(oscillator), { ...settings, start: snapshot! }));
    // The resumed run reports the snapshot's point first, then every later step.
    const tail = whole.slice(4999);
    expect(resumed.length).toBe(tail.length);
    expect(resumed.length).toBeGreaterThan(1000);
    for (let k = 0; k < tail.length; k++) {
      for (let j = 0; j < tail[k]!.length; j++) {
        if (!Object.is(resumed[k]![j], tail[k]![j])) throw new Error(`point ${k}, value ${j}: ${resumed[k]![j]} ≠ ${tail[k]![j]}`);
      }
    }
  });

  test("a run can start from any given state: from the resumed run's state it follows the original closely", () => {
    let snapshot: StepperSnapshot | undefined;
    const whole = record(new TransientStepper(buildSystem(oscillator), settings), { at: 5000, into: (s) => (snapshot = s) });
    const fromState = new TransientStepper(buildSystem(oscillator), { ...settings, start: { t: snapshot!.t, x: snapshot!.x } });
    expect(fromState.t).toBe(snapshot!.t);
    fromState.advance(until);
    const last = whole[whole.length - 1]!;
    const o = buildSystem(oscillator).nodeIndex.get("o")!;
    // A fresh start (first-order first step, no history) differs from the original only by the
    // integration error, far below the 10 V scale of the oscillation.
    expect(Math.abs(fromState.x[o]! - last[1 + o]!)).toBeLessThan(0.05);
  });

  test("a start state of the wrong length is refused", () => {
    expect(() => new TransientStepper(buildSystem(oscillator), { ...settings, start: { t: 0, x: new Float64Array(3) } })).toThrow(
      "the start state has 3 unknowns; the circuit has",
    );
  });
});

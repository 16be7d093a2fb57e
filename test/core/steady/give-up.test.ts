// A shooting told to give up without headway (`giveUpAfter`) gives up only then: from a start near
// the orbit it converges as without the option; one with no headway by then stops at that period
// with a typed error, not after all its periods.
import { describe, expect, test } from "vitest";
import { isOnsetError } from "@onset/core";
import { buildSystem, recordPeriod, shootOrbit, TransientStepper } from "@onset/core/engine";
import { circuit, part } from "../../support/circuits.js";
import { clippedWien, settledPeriod } from "./support.js";

describe("shootOrbit's giveUpAfter", () => {
  const { system, guess, fractions, trajectory } = settledPeriod(clippedWien(3.1), "p", 1 / 1580.7, 0.04);

  /** The error a shooting stops with, and the periods it integrated. */
  const stopped = (start: typeof guess, predictor: typeof trajectory | undefined, giveUpAfter: number) => {
    let periods = 0;
    try {
      shootOrbit(system, start, fractions, predictor, { autonomous: true, giveUpAfter, check: () => periods++ });
    } catch (error) {
      return { code: isOnsetError(error) ? error.diagnostic.code : String(error), periods };
    }
    return { code: "converged", periods };
  };

  test("near the orbit it converges to the same orbit in the same periods as without it", () => {
    const plain = shootOrbit(system, guess, fractions, trajectory, { autonomous: true });
    const patient = shootOrbit(system, guess, fractions, trajectory, { autonomous: true, giveUpAfter: 2 });
    expect(patient.iterations).toBe(plain.iterations);
    expect(patient.start.period).toBe(plain.start.period);
  });

  test("it stops at that period with a typed error: after one period no step has been tried, so there is no headway yet", () => {
    expect(stopped(guess, trajectory, 1)).toEqual({ code: "orbit-not-converged", periods: 1 });
  });

  test("a first step that would move the period by more than a fifth gives up at once (the start is out of Newton's reach)", () => {
    // The settled state with the period guessed at a third of the orbit's: Newton's first step
    // triples it. Without the option the damped iteration still finds its way back, in many periods.
    const far = { ...guess, period: guess.period / 3 };
    const found = shootOrbit(system, far, fractions, undefined, { autonomous: true });
    expect(Math.abs(found.start.period / guess.period - 1)).toBeLessThan(1e-3);
    expect(stopped(far, undefined, 5)).toEqual({ code: "orbit-not-converged", periods: 1 });
  });

  test("a first step that would move an unknown by more than its peak over the period gives up at once (out of the range it visited)", () => {
    // A driven RC low-pass (no period to move): its recorded period, then the capacitor started 3 V
    // above a swing of about 1 V. Newton's first step moves it back by about 3 V, beyond its 1 V peak.
    const rc = circuit([
      part("vsource", "V1", ["in", "gnd"], undefined, { wave: "sine", amp: 2, freq: 1e3 }),
      part("resistor", "R1", ["in", "o"], 1e3),
      part("capacitor", "C1", ["o", "gnd"], 1e-6),
    ]);
    const driven = buildSystem(rc);
    const stepper = new TransientStepper(driven, { start: "bias", maxStep: 1e-5 });
    stepper.advance(2e-3);
    const recorded = recordPeriod(driven, stepper.snapshot(), 1e-3, 1e-5);
    const x = Float64Array.from(recorded.guess.x);
    x[driven.nodeIndex.get("o")!] += 3;
    let periods = 0;
    let code = "converged";
    try {
      shootOrbit(driven, { ...recorded.guess, x }, recorded.fractions, recorded.trajectory, { autonomous: false, giveUpAfter: 5, check: () => periods++ });
    } catch (error) {
      code = isOnsetError(error) ? error.diagnostic.code : String(error);
    }
    expect({ code, periods }).toEqual({ code: "orbit-not-converged", periods: 1 });
    // Without the option the trust region walks back to the orbit found from the recorded start.
    const o = driven.nodeIndex.get("o")!;
    const far = shootOrbit(driven, { ...recorded.guess, x }, recorded.fractions, recorded.trajectory, { autonomous: false });
    const near = shootOrbit(driven, recorded.guess, recorded.fractions, recorded.trajectory, { autonomous: false });
    expect(Math.abs(far.start.x[o]! - near.start.x[o]!)).toBeLessThan(1e-6);
  });
});

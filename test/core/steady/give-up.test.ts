// A shooting told to give up without headway (`giveUpAfter`) gives up only then: from a start near
// the orbit it converges as without the option; one with no headway by then stops at that period
// with a typed error, not after all its periods.
import { describe, expect, test } from "vitest";
import { isOnsetError } from "@onset/core";
import { shootOrbit } from "@onset/core/engine";
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
});

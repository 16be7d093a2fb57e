// A matrix singular at a Newton iterate far out on a trial step is a failed step (cut shorter),
// not the end of the run. The slow-loop Wien of test/support/agc-wien.ts (ideal amplifiers, so
// nothing bounds the first overshoot but the loop) drives its detector's junction that far: with
// a 1 µF or 4.7 µF loop filter the steady analysis' transient ended "the circuit equations are
// singular at unknown 'dx'".
import { describe, expect, test } from "vitest";
import { runSteady } from "@onset/core";
import { circuit } from "../../support/circuits.js";
import { agcWienParts } from "../../support/agc-wien.js";

const steadyWith = (filter: number) => runSteady(circuit(agcWienParts(filter)), { kind: "steady", probe: { kind: "node", node: "o" } });
const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe("a singular matrix at a trial iterate cuts the step", () => {
  test("the slow-loop Wien with a 1 µF filter finds the orbit of the 0.25 µF one (mathematics: in the steady state the filter capacitor carries no mean current, so it sets the loop's speed, not its balance)", () => {
    const fast = steadyWith(0.25e-6);
    const slow = steadyWith(1e-6);
    expect(fast.found && slow.found).toBe(true);
    expect(rel(slow.frequency!, fast.frequency!)).toBeLessThan(1e-5);
    expect(rel(slow.amplitude!, fast.amplitude!)).toBeLessThan(1e-4);
    // the slower filter: a more slowly attracting orbit
    expect(slow.stability!.largest!.re ** 2 + slow.stability!.largest!.im ** 2).toBeGreaterThan(fast.stability!.largest!.re ** 2 + fast.stability!.largest!.im ** 2);
  }, 60_000);
});

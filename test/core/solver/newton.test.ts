// The Newton stopping rule against rounding. At a tiny step the integration coefficient 2/h makes
// a·C·x and the charge history large and nearly equal, so the residual carries a rounding error
// of about ε·a·C·|x|; through a node held by a small conductance that moves the solution by more
// than a tight absolute tolerance, and a smaller step only makes it worse.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, test } from "vitest";
import { buildSystem, TransientStepper } from "@onset/core/engine";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const MAX_STEP = 1 / 440 / 100;

/** The workshop tuning reference as the start-up bench runs it: ideal diode strings, 0.5 V on Ca. */
function twinT() {
  const file = join(import.meta.dirname, "..", "..", "..", "examples", "tuning-reference.onset");
  const overrides = { "D1.series": 0, "D2.series": 0, "D3.series": 0, "D4.series": 0, "N1.Ca.initial": 0.5 };
  return elaborate(loadProgram(file, readFileSync(file, "utf8")).program, { overrides }).circuit!;
}

function outputAt(until: number, tolerances?: { lteRelative: number; lteVoltage: number }) {
  const system = buildSystem(twinT());
  const stepper = new TransientStepper(system, { start: "rest", maxStep: MAX_STEP, tolerances });
  stepper.advance(until);
  return { v: stepper.x[system.nodeIndex.get("o")!]!, stats: stepper.stats };
}

describe("Newton iteration at a tight absolute tolerance", () => {
  test("the twin-T from rest at a 0.1 nV floor steps on (it stopped at t = 0.5 ns, its step below 1.5 fs)", () => {
    // lteVoltage 1e-10 carries a Newton floor of 1e-13 V; the first steps (0.25 ns) could not
    // get the output node's update below about 2e-12 V, all of it rounding.
    const tight = outputAt(50e-6, { lteRelative: 1e-8, lteVoltage: 1e-10 });
    const loose = outputAt(50e-6);
    expect(tight.stats.accepted).toBeGreaterThan(loose.stats.accepted);
    // Both runs are accurate: they agree within the looser one's error (1 µV per step over its
    // 49 steps; 2.4 µV measured).
    expect(Math.abs(tight.v - loose.v)).toBeLessThan(2e-5);
  });
});

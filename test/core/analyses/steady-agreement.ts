// Issue 15's check: the steady analysis finds the orbit the start-up run settles on by itself.
import { expect } from "vitest";
import { runStartup, runSteady, startupAnalysisOf, type Circuit } from "@onset/core";

/**
 * Runs the circuit's own startup statement to settled (the source of the figures) and the steady
 * analysis on its probe: frequency within 0.05 %, amplitude within 0.5 %, THD within 2 % relative,
 * a stable orbit, reached in less simulated time than the start-up took.
 */
export function expectSteadyAgreesWithSettled(circuit: Circuit): void {
  const startup = startupAnalysisOf(circuit)!;
  const settled = runStartup(circuit, startup);
  expect(settled.verdict).toBe("settled");
  const steady = runSteady(circuit, { kind: "steady", probe: startup.probe });
  expect(steady.found).toBe(true);
  expect(steady.stability!.verdict).toBe("stable");
  expect(Math.abs(steady.frequency! / settled.frequency! - 1)).toBeLessThan(5e-4);
  expect(Math.abs(steady.amplitude! / settled.amplitude! - 1)).toBeLessThan(5e-3);
  expect(Math.abs(steady.thd! / settled.thd! - 1)).toBeLessThan(2e-2);
  expect(steady.transient.until).toBeLessThan(settled.run.until);
}

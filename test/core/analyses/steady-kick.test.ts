// The house rule that no result depends on a choice the designer did not make, for the steady
// analysis' kick: the growing mode started at two sizes (one pinning the amplifiers' rails, one
// well inside them; on the JFET loop: 1 overcharges the peak detector at once, 0.1 after 39
// periods, both then start again small, 0.3 does not die out) takes another way to the orbit, and the orbit must be the same within the figures'
// tolerances of issue 15 (frequency 0.05 %, amplitude 0.5 %, THD 2 % relative).
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, test } from "vitest";
import { isOnsetError, runSteady, startupAnalysisOf } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const examples = join(import.meta.dirname, "..", "..", "..", "examples");

function example(name: string) {
  const file = join(examples, `${name}.onset`);
  const circuit = elaborate(loadProgram(file, readFileSync(file, "utf8")).program, {}).circuit!;
  return { circuit, steady: { kind: "steady" as const, probe: startupAnalysisOf(circuit)!.probe } };
}

describe("the steady orbit does not depend on the kick", () => {
  test.each([
    ["audio-test-source", 0.1],
    ["low-frequency-reference", 0.1],
    ["jfet-loop-source", 0.3],
    ["jfet-loop-source", 0.1],
  ] as const)("%s: kick 1 and %s", (name, other) => {
    const { circuit, steady } = example(name);
    const large = runSteady(circuit, steady, { kick: 1 });
    const small = runSteady(circuit, steady, { kick: other });
    expect(large.found && small.found).toBe(true);
    // Another way to the orbit: the transients differ.
    expect(small.transient.periods).not.toBe(large.transient.periods);
    expect(Math.abs(small.frequency! / large.frequency! - 1)).toBeLessThan(5e-4);
    expect(Math.abs(small.amplitude! / large.amplitude! - 1)).toBeLessThan(5e-3);
    expect(Math.abs(small.thd! / large.thd! - 1)).toBeLessThan(2e-2);
  });

  test("a kick that is not a positive number is a bad argument", () => {
    const { circuit, steady } = example("audio-test-source");
    for (const kick of [0, -1, Number.NaN, Number.POSITIVE_INFINITY]) {
      let caught: unknown;
      try {
        runSteady(circuit, steady, { kick });
      } catch (error) {
        caught = error;
      }
      expect(isOnsetError(caught) && caught.diagnostic.code).toBe("bad-argument");
    }
  });
});

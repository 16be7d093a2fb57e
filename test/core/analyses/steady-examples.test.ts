// Issue 15: on each example oscillator the steady analysis finds the orbit the start-up run
// settles on by itself (the file's own startup statement, integrated from its excitation to
// settled): frequency within 0.05 %, amplitude within 0.5 %, THD within 2 % relative.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, test } from "vitest";
import { runSteady } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";
import { expectSteadyAgreesWithSettled } from "./steady-agreement.js";

const examples = join(import.meta.dirname, "..", "..", "..", "examples");

describe("steady against the settled start-up run on the examples", () => {
  // The last three hold their amplitude by a slow loop (lamp, JFET with a peak detector,
  // thermistor): the JFET loop dies out for a while when kicked hard, so its orbit comes from the
  // second, small start — the answer does not depend on the kick.
  test.each(["bridge-excitation", "cable-tracer", "tuning-reference", "audio-test-source", "jfet-loop-source", "low-frequency-reference"])("%s", (name) => {
    const file = join(examples, `${name}.onset`);
    const circuit = elaborate(loadProgram(file, readFileSync(file, "utf8")).program, {}).circuit!;
    // Source: the start-up run, integrated from its excitation until settled; the steady analysis a few tens of periods.
    expectSteadyAgreesWithSettled(circuit);
  });
});

describe("from=poles on a slow loop whose envelope still bounces", () => {
  // Its short batches shoot the envelope's bounce, not the orbit; once they are spent it waits,
  // as from=startup does, for the swing to level off (it answered "no orbit" before).
  test("jfet-loop-source: the orbit from=startup finds, with the same figures", () => {
    const file = join(examples, "jfet-loop-source.onset");
    const circuit = elaborate(loadProgram(file, readFileSync(file, "utf8")).program, {}).circuit!;
    const probe = { kind: "node", node: "o" } as const;
    const poles = runSteady(circuit, { kind: "steady", probe, from: "poles" });
    const startup = runSteady(circuit, { kind: "steady", probe });
    expect(poles.found, poles.explanation).toBe(true);
    // Source: the tolerances for two ways to one orbit (frequency 0.05 %, amplitude 0.5 %).
    expect(Math.abs(poles.frequency! / startup.frequency! - 1)).toBeLessThan(5e-4);
    expect(Math.abs(poles.amplitude! / startup.amplitude! - 1)).toBeLessThan(5e-3);
  });
});

// Issue 15: on each example oscillator the steady analysis finds the orbit the start-up run
// settles on by itself (the file's own startup statement, integrated from its excitation to
// settled): frequency within 0.05 %, amplitude within 0.5 %, THD within 2 % relative.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, test } from "vitest";
import { runStartup, runSteady, startupAnalysisOf } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const examples = join(import.meta.dirname, "..", "..", "..", "examples");

describe("steady against the settled start-up run on the examples", () => {
  // The last three hold their amplitude by a slow loop (lamp, JFET with a peak detector,
  // thermistor): the JFET loop dies out for a while when kicked hard, so its orbit comes from the
  // second, small start — the answer does not depend on the kick.
  test.each(["bridge-excitation", "cable-tracer", "tuning-reference", "audio-test-source", "jfet-loop-source", "low-frequency-reference"])("%s", (name) => {
    const file = join(examples, `${name}.onset`);
    const circuit = elaborate(loadProgram(file, readFileSync(file, "utf8")).program, {}).circuit!;
    const startup = startupAnalysisOf(circuit)!;
    const settled = runStartup(circuit, startup);
    expect(settled.verdict).toBe("settled");
    const steady = runSteady(circuit, { kind: "steady", probe: startup.probe });
    expect(steady.found).toBe(true);
    expect(steady.stability!.verdict).toBe("stable");
    expect(Math.abs(steady.frequency! / settled.frequency! - 1)).toBeLessThan(5e-4);
    expect(Math.abs(steady.amplitude! / settled.amplitude! - 1)).toBeLessThan(5e-3);
    expect(Math.abs(steady.thd! / settled.thd! - 1)).toBeLessThan(2e-2);
    // The settled run took its whole start-up; the steady analysis a few tens of periods.
    expect(steady.transient.until).toBeLessThan(settled.run.until);
  });
});

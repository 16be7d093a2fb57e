// A start-up run under until=auto whose max-step is many periods long: the step control may take
// steps as long as the run while the swing stays below the accuracy floor, and the measurement
// then had 3 points ("measureStartup: need at least 4 samples", unplaced). Now window-too-short at max-step=.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, test } from "vitest";
import { OnsetError, runStartup, type StartupAnalysis } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";
import { thrownBy } from "../../support/thrown.js";

const file = join(import.meta.dirname, "..", "..", "..", "examples", "bridge-excitation.onset");
const text = readFileSync(file, "utf8").replace(/^startup .*$/m, "startup probe=o max-step=1e6");

describe("refuseSparseRecord (through runStartup)", () => {
  test("startup probe=o max-step=1e6 on the 2.5 kHz bridge source is window-too-short, placed at the max-step value", () => {
    const circuit = elaborate(loadProgram(file, text).program, {}).circuit!;
    const analysis = circuit.analyses.find((a) => a.kind === "startup") as StartupAnalysis;
    const error = thrownBy(OnsetError, () => runStartup(circuit, analysis));
    expect(error.diagnostic.code).toBe("window-too-short");
    expect(error.message).toMatch(/^the start-up run kept [0-3] points over .* s with max-step=1000000 s, too few to measure \(it needs 4\)$/);
    expect(error.diagnostic.span).toEqual(analysis.optionSpans!["max-step"]);
    expect(error.diagnostic.hint).toMatch(/^give max-step= at most .* s, or leave it out \(a hundredth of the predicted period\)$/);
  });
});

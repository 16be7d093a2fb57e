// The amplitude's error bar when the two extremes' errors cancel in the half swing, against the
// validation table's independent reference (test/validation/references.json, case wien-diode-2k:
// scipy 1.17 solve_ivp Radau, rtol 1e-11, atol 1e-11 V, see test/validation/references.md).
import { describe, expect, test } from "vitest";
import { readFileSync } from "node:fs";
import { runSteady } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";

const probe = { kind: "node", node: "o" } as const;
// scipy's amplitude of wien-diode-2k (references.json).
const SCIPY_AMPLITUDE = 2.954389242131667;

describe("the amplitude's bar counts each extremum's own error", () => {
  test("a diode Wien at accuracy=1e-3, whose extremes' errors cancel in the swing on both grids: scipy's amplitude lies within the bar", () => {
    const text = readFileSync("test/validation/circuits/wien-diode-2k.onset", "utf8").replace(/^startup .*$/m, "");
    const r = runSteady(buildCircuit(loadSource("wien-diode-2k.onset", text)).circuit!, { kind: "steady", probe, accuracy: 1e-3 });
    expect(r.found).toBe(true);
    expect(Math.abs(r.amplitude! - SCIPY_AMPLITUDE)).toBeLessThanOrEqual(r.numericalError!.amplitude);
    // Not absurdly loose: within a hundredth of the accuracy asked for.
    expect(r.numericalError!.amplitude).toBeLessThan(1e-5 * SCIPY_AMPLITUDE);
  });
});

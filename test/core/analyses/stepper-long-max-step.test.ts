// A max-step far beyond the run: the stepper's scales (where a run counts as ended, the smallest
// step) follow what is left to run, not the max-step. With max-step=1e30 a transient took no step
// and reported its end at t = 0 s.
import { describe, expect, test } from "vitest";
import { runTransient } from "@onset/core";
import { circuit, part } from "../../support/circuits.js";

// 1 V through R = 1 kΩ into C = 1 µF from rest: closed form v(t) = 1 − e^(−t/τ), τ = 1 ms.
const rc = circuit([part("vsource", "V1", ["a", "gnd"], 1), part("resistor", "R1", ["a", "v"], 1e3), part("capacitor", "C1", ["v", "gnd"], 1e-6)]);

describe("runTransient with max-step far beyond until", () => {
  test.each([1, 1e10, 1e30])("max-step=%s runs to until and ends on the closed form within the step control's accuracy", (maxStep) => {
    const r = runTransient(rc, { kind: "transient", until: 5e-3, maxStep, start: "rest", probes: [{ kind: "node", node: "v" }] });
    const time = r.time;
    const v = r.signals[0]!.values;
    expect(time[time.length - 1]).toBe(5e-3);
    expect(time.length).toBeGreaterThan(10);
    expect(Math.abs(v[v.length - 1]! - (1 - Math.exp(-5)))).toBeLessThan(1e-3);
  });
});

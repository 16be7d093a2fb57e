// The transient towards the orbit keeps only what its level criterion and its period measurement
// read: the probe's samples over the last few periods, however many periods it runs.
import { describe, expect, test } from "vitest";
import { buildSystem, OrbitApproach, probeReader, TransientStepper } from "@onset/core/engine";
import { clippedWien } from "./support.js";

describe("OrbitApproach", () => {
  // R = 1 k, C = 100 nF Wien bridge: f = 1/(2πRC) ≈ 1.59 kHz (closed form), a little lower once the clip bites.
  const period = 2 * Math.PI * 1e3 * 100e-9;
  const start = () => {
    const system = buildSystem(clippedWien(3.3));
    const rest = new TransientStepper(system, { start: "bias", maxStep: period / 100 });
    const x = Float64Array.from(rest.x);
    x[system.nodeIndex.get("p")!] += 1;
    const stepper = new TransientStepper(system, { start: { t: 0, x }, maxStep: period / 100 });
    return new OrbitApproach(stepper, probeReader(system, { kind: "node", node: "o" }), period, 1);
  };

  test("its memory does not grow with the periods run: as many samples held after 400 periods as after 20", () => {
    const approach = start();
    const check = () => {};
    approach.advance(20, undefined, check);
    const early = approach.samplesHeld;
    const where = approach.advance(380, undefined, check);
    expect(where.kind).toBe("oscillating");
    expect(approach.periods).toBe(400);
    // Five periods of samples at most (the last four and the one that started them), at about 100 steps each.
    expect(early).toBeLessThan(6 * 100);
    expect(approach.samplesHeld).toBeLessThan(early + 20);
  });

  test("the period it measures from the probe's crossings lies within 10 % of the closed form's 1/(2πRC)", () => {
    const where = start().advance(60, 1e-3, () => {});
    expect(where.kind).toBe("oscillating");
    if (where.kind === "oscillating") expect(Math.abs(where.period / period - 1)).toBeLessThan(0.1);
  });
});

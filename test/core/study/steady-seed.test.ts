// Issue 15: a tolerance study under measure=steady shoots every sample from the nominal's orbit.
// The answer must not depend on where the shooting starts: each seeded sample finds the orbit its
// own transient leads to (mathematics: the periodic orbit is a root of x(T) − x(0) = 0, unique near
// a stable limit cycle), within the orbit tolerance the samples are solved to.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, test } from "vitest";
import { drawSample, RunBudget, runSteady, steadyAnalysisOf, steadySeed } from "@onset/core";
import { predictedStart, seedPredictor } from "@onset/core/engine";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const file = join(import.meta.dirname, "..", "..", "..", "examples", "bridge-excitation.onset");
const program = loadProgram(file, readFileSync(file, "utf8")).program;
const nominal = elaborate(program, {}).circuit!;
const analysis = steadyAnalysisOf(nominal)!;

describe("steadySeed: samples shot from the nominal's orbit", () => {
  const seed = steadySeed(nominal, analysis)!;

  test("the seed is the nominal's autonomous orbit", () => {
    expect(seed).not.toBeNull();
    expect(1 / seed.period).toBeGreaterThan(2300);
    expect(1 / seed.period).toBeLessThan(2600);
    expect(seed.states.length).toBe(seed.fractions.length + 1);
  });

  test.each([0, 1, 2, 3, 4])("sample %d: the same orbit as from its own transient, with no transient", (index) => {
    const circuit = elaborate(program, { overrides: drawSample(nominal.tolerances, 2026, index, "normal") }).circuit!;
    const options = { singleGrid: true, predictStartup: false } as const;
    const own = runSteady(circuit, analysis, options);
    const seeded = runSteady(circuit, analysis, { ...options, seed });
    expect(seeded.found).toBe(true);
    expect(seeded.transient.periods).toBe(0);
    expect(seeded.stability!.verdict).toBe(own.stability!.verdict);
    // (the seeded sample is shot on the nominal's grid, its own run on the grid of its own transient
    // — they may differ by a step — so the two frequencies differ by the two grids' discretisation
    // errors, a small part of the single grid's own, about 5e-5 here)
    expect(Math.abs(seeded.frequency! / own.frequency! - 1)).toBeLessThan(1e-5);
    // (a sample's orbit is solved to 1e-5 of each unknown's peak, so two solutions differ by up to twice that)
    expect(Math.abs(seeded.amplitude! / own.amplitude! - 1)).toBeLessThan(3e-5);
    expect(Math.abs(seeded.thd! / own.thd! - 1)).toBeLessThan(1e-3);
  });

  test("a seed of another circuit (other unknowns) is ignored", () => {
    const other = { ...seed, x: new Float64Array(seed.x.length + 3) };
    const r = runSteady(nominal, analysis, { singleGrid: true, predictStartup: false, seed: other });
    expect(r.found).toBe(true);
    expect(r.transient.periods).toBeGreaterThan(0);
  });

  test("a circuit that does not oscillate gets no orbit from a seed (its poles decide first)", () => {
    const dead = elaborate(program, { overrides: { "P1.at": 0 } }).circuit!;
    const r = runSteady(dead, analysis, { singleGrid: true, seed });
    expect(r.found).toBe(false);
  });
});

describe("a seeded sample's multipliers predicted from its predicted Newton matrix", () => {
  const seed = steadySeed(nominal, analysis)!;
  const build = (overrides: Readonly<Record<string, number>>) => elaborate(program, { overrides }).circuit!;
  const predictor = seedPredictor(build, undefined, nominal.tolerances, seed, { budget: new RunBudget() });
  test.each([0, 1, 2, 3])("sample %d: the exact multipliers' verdict, the largest within 0.15 of theirs, no more periods", (index) => {
    const drawn = drawSample(nominal.tolerances, 2026, index, "normal");
    const circuit = build(drawn);
    const options = { singleGrid: true, predictStartup: false, seed: { ...seed, ...predictedStart(seed, predictor, drawn) } } as const;
    const exact = runSteady(circuit, analysis, options);
    const predicted = runSteady(circuit, analysis, { ...options, predictedMultipliers: true });
    expect(predicted.stability!.verdict).toBe(exact.stability!.verdict);
    // Source: the exact multipliers, the eigenvalues of the map's sensitivities at the sample's orbit.
    const largest = (r: typeof exact) => Math.hypot(r.stability!.largest!.re, r.stability!.largest!.im);
    expect(Math.abs(largest(predicted) - largest(exact))).toBeLessThan(0.15);
    expect(predicted.iterations![0]).toBeLessThanOrEqual(exact.iterations![0]);
    expect(Math.abs(predicted.frequency! / exact.frequency! - 1)).toBeLessThan(1e-5);
  });

  test("a raw seed (no predicted matrix, its contraction unknown) keeps the exact multipliers", () => {
    const circuit = build(drawSample(nominal.tolerances, 2026, 0, "normal"));
    const options = { singleGrid: true, predictStartup: false, seed } as const;
    const exact = runSteady(circuit, analysis, options);
    const predicted = runSteady(circuit, analysis, { ...options, predictedMultipliers: true });
    expect(predicted.multipliers).toEqual(exact.multipliers);
  });
});

// Issue 15: a steady study's samples start their shooting from the nominal's orbit, and with its
// Newton matrix, moved to first order in each drawn value (mathematics: Taylor's theorem; the
// remainder is second order in the move, so the predicted start lies nearer the sample's orbit
// than the nominal's start does).
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, test } from "vitest";
import { drawSample, RunBudget, runSteady, steadyAnalysisOf, steadySeed, type Circuit } from "@onset/core";
import { predictedStart, seedPredictor } from "@onset/core/engine";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const file = join(import.meta.dirname, "..", "..", "..", "examples", "bridge-excitation.onset");
const program = loadProgram(file, readFileSync(file, "utf8")).program;
const build = (overrides: Readonly<Record<string, number>>): Circuit => elaborate(program, { overrides }).circuit!;
const nominal = build({});
const analysis = steadyAnalysisOf(nominal)!;

describe("seedPredictor: the nominal's orbit moved towards each sample", () => {
  const seed = steadySeed(nominal, analysis)!;
  const predictor = seedPredictor(build, undefined, nominal.tolerances, seed, { budget: new RunBudget() });

  test("every toleranced value gets a slope", () => {
    expect(predictor.parts.map((p) => p.target)).toEqual(nominal.tolerances.map((t) => t.target));
  });

  test("the nominal's own values predict the seed itself", () => {
    const at = Object.fromEntries(nominal.tolerances.map((t) => [t.target, t.nominal]));
    const start = predictedStart(seed, predictor, at);
    expect(start.period).toBe(seed.period);
    expect(Array.from(start.x)).toEqual(Array.from(seed.x));
    expect(Array.from(start.matrix)).toEqual(Array.from(predictor.matrix));
    expect(start.contraction).toBe(0);
  });

  test.each([0, 1, 2, 3, 4])("sample %d: the predicted period lies nearer the sample's own than the nominal's, and shooting from it finds the same orbit", (index) => {
    const drawn = drawSample(nominal.tolerances, 2026, index, "normal");
    const circuit = build(drawn);
    const options = { singleGrid: true, predictStartup: false } as const;
    const own = runSteady(circuit, analysis, options);
    const start = predictedStart(seed, predictor, drawn);
    expect(Math.abs(start.period - own.period!)).toBeLessThan(Math.abs(seed.period - own.period!));
    const predicted = runSteady(circuit, analysis, { ...options, seed: { ...seed, ...start } });
    expect(predicted.transient.periods).toBe(0);
    expect(predicted.stability!.verdict).toBe(own.stability!.verdict);
    // (seeded, the sample is shot on the nominal's grid; its own run on the grid of its own
    // transient, which may differ by a step: the frequencies differ by the two grids' discretisation
    // errors, a small part of the single grid's own, as in steady-seed.test.ts)
    expect(Math.abs(predicted.frequency! / own.frequency! - 1)).toBeLessThan(1e-5);
    // (a sample's orbit is solved to 1e-5 of each unknown's peak, so two solutions differ by up to twice that)
    expect(Math.abs(predicted.amplitude! / own.amplitude! - 1)).toBeLessThan(3e-5);
  });

  test("a sample's expected contraction grows as the square of its moves (the matrix's remainder is second order)", () => {
    const drawn = drawSample(nominal.tolerances, 2026, 0, "normal");
    const half = Object.fromEntries(nominal.tolerances.map((t) => [t.target, (t.nominal + drawn[t.target]!) / 2]));
    const full = predictedStart(seed, predictor, drawn).contraction;
    expect(full).toBeGreaterThan(0);
    expect(full).toBeLessThan(1);
    expect(predictedStart(seed, predictor, half).contraction / full).toBeCloseTo(0.25, 10);
  });

  test("the expected contraction adds the parts' own remainders: Σ ρᵢ·(dᵢ/σᵢ)²", () => {
    const [a, b] = predictor.parts;
    const nominals = Object.fromEntries(nominal.tolerances.map((t) => [t.target, t.nominal]));
    const one = predictedStart(seed, predictor, { ...nominals, [a!.target]: a!.nominal + 2 * a!.move }).contraction;
    expect(one).toBeCloseTo(4 * a!.contraction, 12);
    const two = predictedStart(seed, predictor, { ...nominals, [a!.target]: a!.nominal + 2 * a!.move, [b!.target]: b!.nominal - b!.move }).contraction;
    expect(two).toBeCloseTo(4 * a!.contraction + b!.contraction, 12);
  });

  test("a value whose moved circuit has other unknowns gets no slope, and the contraction is then unknown", () => {
    const other = seedPredictor((o) => (Object.keys(o).length > 0 ? { ...nominal, parts: nominal.parts.slice(0, -1) } : nominal), undefined, nominal.tolerances.slice(0, 1), seed, { budget: new RunBudget() });
    expect(other.parts).toEqual([]);
    expect(other.partial).toBe(true);
    expect(predictedStart(seed, other, drawSample(nominal.tolerances, 2026, 0, "normal")).contraction).toBe(Infinity);
  });
});

describe("seedPredictor on a seed shot matrix-free (no Newton matrix)", () => {
  test("no slopes are taken (no circuit is built), and each sample starts at the seed, matrix-free", () => {
    const seed = { ...steadySeed(nominal, analysis)!, matrix: new Float64Array(0) };
    const refuse = (): Circuit => {
      throw new Error("a matrix-free seed needs no moved circuits");
    };
    const predictor = seedPredictor(refuse, undefined, nominal.tolerances, seed, { budget: new RunBudget() });
    expect(predictor.parts).toEqual([]);
    const start = predictedStart(seed, predictor, { [nominal.tolerances[0]!.target]: nominal.tolerances[0]!.nominal * 1.01 });
    expect(start.matrix.length).toBe(0);
    expect(Array.from(start.x)).toEqual(Array.from(seed.x));
  });
});

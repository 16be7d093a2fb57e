import type { Circuit, ToleranceSpec } from "../circuit/circuit.js";
import { isOnsetError } from "../circuit/diagnostic.js";
import { isRunLimitError, type RunBudget } from "../analyses/limits.js";
import { seedStep, type OrbitSeed } from "../analyses/steady.js";
import type { Tolerances } from "../solver/tolerances.js";
import { steadyAnalysisOf } from "./steady-sample.js";

/** Where a sample's shooting starts: the unknowns at the orbit's start, and the period. */
export interface SeedStart {
  readonly x: Float64Array;
  readonly period: number;
}

/** How the nominal's orbit start (x₀, T) moves per unit of each toleranced value, to first order. */
export interface SeedPredictor {
  readonly parts: readonly { readonly target: string; readonly nominal: number; readonly slope: Float64Array }[];
}

/**
 * The slope of the seed's start in each toleranced value: the seed's Newton step towards the
 * nominal with that one value moved by its tolerance's σ (a third of it, the normal draw's; see
 * draw.ts), per unit of the move. Each costs one period of the map, and saves every sample the
 * first period of its shooting (whose chord step it anticipates, with the same matrix). A value
 * whose moved circuit cannot be run (another structure, a map that fails) gets no slope.
 */
export function seedPredictor(
  build: (overrides: Readonly<Record<string, number>>) => Circuit,
  fixed: Readonly<Record<string, number>> | undefined,
  tolerances: readonly ToleranceSpec[],
  seed: OrbitSeed,
  options: { readonly tolerances?: Partial<Tolerances>; readonly budget: RunBudget },
): SeedPredictor {
  const parts: SeedPredictor["parts"][number][] = [];
  for (const t of tolerances) {
    options.budget.check("while predicting the samples' orbits");
    const move = (t.relative !== undefined ? Math.abs(t.nominal) * t.relative : (t.absolute ?? 0)) / 3;
    if (!(move > 0)) continue;
    try {
      const moved = build({ ...fixed, [t.target]: t.nominal + move });
      const analysis = steadyAnalysisOf(moved);
      const step = analysis ? seedStep(seed, moved, analysis, options.tolerances ? { tolerances: options.tolerances } : {}) : null;
      if (step && step.every(Number.isFinite)) parts.push({ target: t.target, nominal: t.nominal, slope: step.map((v) => v / move) });
    } catch (error) {
      if (isRunLimitError(error) || !isOnsetError(error)) throw error;
    }
  }
  return { parts };
}

/** A sample's predicted start: the seed's moved along each slope by the sample's drawn value. */
export function predictedStart(seed: OrbitSeed, predictor: SeedPredictor, drawn: Readonly<Record<string, number>>): SeedStart {
  const n = seed.x.length;
  const x = Float64Array.from(seed.x);
  let period = seed.period;
  for (const { target, nominal, slope } of predictor.parts) {
    const d = (drawn[target] ?? nominal) - nominal;
    if (d === 0) continue;
    for (let i = 0; i < n; i++) x[i] += slope[i]! * d;
    period += slope[n]! * d;
  }
  return period > 0 ? { x, period } : { x: seed.x, period: seed.period };
}

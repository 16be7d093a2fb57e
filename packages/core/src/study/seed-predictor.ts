import { solvedColumns } from "../analyses/poles.js";
import type { Circuit, ToleranceSpec } from "../circuit/circuit.js";
import { isOnsetError } from "../circuit/diagnostic.js";
import { isRunLimitError, type RunBudget } from "../analyses/limits.js";
import { seedPeriod, type OrbitSeed } from "../analyses/steady.js";
import { eigenvalues } from "../solver/eigenvalues.js";
import { LuSolver } from "../solver/lu.js";
import type { Tolerances } from "../solver/tolerances.js";
import { steadyAnalysisOf } from "./steady-sample.js";

/** Where a sample's shooting starts: the unknowns at the orbit's start, the period, and the shooting's Newton matrix there. */
export interface SeedStart {
  readonly x: Float64Array;
  readonly period: number;
  /** (n + 1)², row-major (see `OrbitSeed.matrix`). */
  readonly matrix: Float64Array;
  /** How much a shooting step from `matrix` is expected to shrink the distance to the orbit. */
  readonly contraction: number;
}

/**
 * How the nominal's orbit start (x₀, T) and the shooting's Newton matrix there move per unit of
 * each toleranced value, to first order.
 */
export interface SeedPredictor {
  /** The nominal's Newton matrix at the seed, from the map's sensitivities. */
  readonly matrix: Float64Array;
  readonly parts: readonly SeedPart[];
  /** Whether some toleranced value got no slopes (its moves then go unpredicted, and so does the contraction). */
  readonly partial: boolean;
}

/** One toleranced value's part of the prediction. */
export interface SeedPart {
  readonly target: string;
  readonly nominal: number;
  /** The move the slopes were taken over (σ). */
  readonly move: number;
  /** d(x₀, T)/d value. */
  readonly slope: Float64Array;
  /** d(Newton matrix)/d value. */
  readonly matrixSlope: Float64Array;
  /**
   * The contraction of a shooting step from the predicted matrix for a move of σ: the spectral
   * radius of M⁻¹·E, E the matrix's second-order remainder (M₊ + M₋)/2 − M₀.
   */
  readonly contraction: number;
}

/**
 * The slopes of the seed's start and of the Newton matrix in each toleranced value, by central
 * differences over ± its tolerance's σ (a third of it, the normal draw's; see draw.ts): at each
 * side the start moves by the Newton step −M⁻¹·(r₁ − r₀) (r the residual of one period from the
 * seed's start, M the nominal's matrix there), and the matrix is the moved circuit's at the
 * moved start. Each value costs four periods of the map (two with sensitivities); every sample
 * saves its first period (whose chord step the start anticipates) and shoots with a matrix near
 * its own, so its secant (Broyden) steps contract faster. A value whose moved circuit cannot be
 * run (another structure, a map that fails) gets no slopes.
 */
export function seedPredictor(
  build: (overrides: Readonly<Record<string, number>>) => Circuit,
  fixed: Readonly<Record<string, number>> | undefined,
  tolerances: readonly ToleranceSpec[],
  seed: OrbitSeed,
  options: { readonly tolerances?: Partial<Tolerances>; readonly budget: RunBudget },
): SeedPredictor {
  const none = { matrix: seed.matrix, parts: [], partial: true };
  // A seed shot matrix-free has no Newton matrix to move (its samples shoot matrix-free from it):
  // the slopes would cost dense (n + 1)-column periods, O(n³) a step, on a circuit that large.
  if (seed.matrix.length === 0) return none;
  const nominal = build({ ...fixed });
  const analysis = steadyAnalysisOf(nominal);
  if (!analysis) return none;
  const run = options.tolerances ? { tolerances: options.tolerances } : {};
  const at = seedPeriod(seed, nominal, analysis, { ...run, matrix: true });
  const n = seed.x.length;
  const lu = new LuSolver(n + 1);
  if (!at || !lu.factor(at.matrix!)) return none;
  const parts: SeedPart[] = [];
  let partial = false;
  /** The start and the matrix of the nominal with one value moved: the chord step from the seed, and the matrix there. */
  const movedTo = (target: string, value: number): { readonly step: Float64Array; readonly matrix: Float64Array } | null => {
    const moved = build({ ...fixed, [target]: value });
    const first = seedPeriod(seed, moved, analysis, run);
    if (!first) return null;
    const step = new Float64Array(n + 1);
    lu.solveNegated(
      first.residual.map((r, i) => r - at.residual[i]!),
      step,
    );
    const start = { x: seed.x.map((v, i) => v + step[i]!), period: seed.period + step[n]! };
    const second = seedPeriod(seed, moved, analysis, { ...run, start, matrix: true });
    return second && step.every(Number.isFinite) && second.matrix!.every(Number.isFinite) ? { step, matrix: second.matrix! } : null;
  };
  for (const t of tolerances) {
    options.budget.check("while predicting the samples' orbits");
    const move = (t.relative !== undefined ? Math.abs(t.nominal) * t.relative : (t.absolute ?? 0)) / 3;
    if (!(move > 0)) continue;
    try {
      // Central differences: the one-sided ones are off by half the curvature times the move.
      const up = movedTo(t.target, t.nominal + move);
      const down = movedTo(t.target, t.nominal - move);
      if (!up || !down) {
        partial = true;
        continue;
      }
      const remainder = up.matrix.map((v, k) => (v + down.matrix[k]!) / 2 - at.matrix![k]!);
      parts.push({
        target: t.target,
        nominal: t.nominal,
        move,
        slope: up.step.map((v, i) => (v - down.step[i]!) / (2 * move)),
        matrixSlope: up.matrix.map((v, k) => (v - down.matrix[k]!) / (2 * move)),
        contraction: spectralRadius(lu, remainder, n + 1),
      });
    } catch (error) {
      if (isRunLimitError(error) || !isOnsetError(error)) throw error;
      partial = true;
    }
  }
  return { matrix: at.matrix!, parts, partial };
}

/** A sample's predicted start: the seed's start and the nominal's matrix moved along each slope by the sample's drawn value. */
export function predictedStart(seed: OrbitSeed, predictor: SeedPredictor, drawn: Readonly<Record<string, number>>): SeedStart {
  const n = seed.x.length;
  const x = Float64Array.from(seed.x);
  const matrix = Float64Array.from(predictor.matrix);
  let period = seed.period;
  // The expected contraction: the parts' own second-order remainders, Σ ρᵢ·(dᵢ/σᵢ)², without the
  // cross terms, which the slopes do not see. (Their bound (Σ √ρᵢ·|dᵢ|/σᵢ)² overstated the
  // contraction a step showed some 6 times in the median over the bridge study's samples, and a
  // shooting told a step will not be its last one spends a period more on the multipliers.)
  let expected = 0;
  for (const { target, nominal, move, slope, matrixSlope, contraction } of predictor.parts) {
    const d = (drawn[target] ?? nominal) - nominal;
    if (d === 0) continue;
    for (let i = 0; i < n; i++) x[i] += slope[i]! * d;
    period += slope[n]! * d;
    for (let k = 0; k < matrix.length; k++) matrix[k] += matrixSlope[k]! * d;
    expected += contraction * (d / move) ** 2;
  }
  return period > 0 ? { x, period, matrix, contraction: predictor.partial ? Infinity : expected } : { x: seed.x, period: seed.period, matrix: seed.matrix, contraction: Infinity };
}

/** The spectral radius of A⁻¹·E (A factored in `lu`, E row-major m×m). */
function spectralRadius(lu: LuSolver, e: Float64Array, m: number): number {
  const { re, im } = eigenvalues(solvedColumns(lu, e, m), m);
  return re.reduce((r, v, k) => Math.max(r, Math.hypot(v, im[k]!)), 0);
}

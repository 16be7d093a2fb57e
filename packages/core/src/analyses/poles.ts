import { checkAnalysis, checkCircuit, checkOptions } from "../circuit/arguments.js";
import type { Circuit, PolesAnalysis } from "../circuit/circuit.js";
import { simulationError } from "../circuit/diagnostic.js";
import { eigenvalues } from "../solver/eigenvalues.js";
import { LuSolver } from "../solver/lu.js";
import { NewtonSolver } from "../solver/newton.js";
import { buildSystem } from "../solver/system.js";
import { resolveTolerances } from "../solver/tolerances.js";
import { solveBias } from "./bias.js";
import { linearize, type SmallSignal } from "./linearize.js";
import type { RunOptions } from "./transient.js";
import { budgetOf } from "./limits.js";

/** A natural frequency s = real + j·imag of the linearised circuit (rad/s). */
export interface Pole {
  /** rad/s */
  readonly real: number;
  /** rad/s */
  readonly imag: number;
}

/** What `runPoles` returns: every finite pole and the dominant complex pair's frequency and growth rate. */
export interface PolesResult {
  readonly analysis: "poles";
  /** Every finite natural frequency, rightmost first. */
  readonly poles: readonly Pole[];
  /** The dominant complex pair (rightmost with imag > 0), or null when every pole is real. */
  readonly dominant: Pole | null;
  /** |imag|/2π of the dominant pair (Hz), or null. */
  readonly frequency: number | null;
  /** Real part of the dominant pair (1/s): the envelope grows as e^(growthRate·t). */
  readonly growthRate: number | null;
  /** True when the dominant pair lies in the right half-plane. */
  readonly starts: boolean;
}

/** Eigenvalues μ smaller than this fraction of the largest belong to algebraic unknowns (s = ∞). */
const INFINITE_POLE = 1e-12;

/** A⁻¹·B (row-major n×n), A factored in `lu`, B row-major n×n: solved column by column. */
export function solvedColumns(lu: LuSolver, b: Float64Array, n: number, check?: () => void): Float64Array {
  const a = new Float64Array(n * n);
  const column = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    if (check && (j & 15) === 0) check();
    for (let i = 0; i < n; i++) column[i] = b[i * n + j]!;
    lu.solve(column, column);
    for (let i = 0; i < n; i++) a[i * n + j] = column[i]!;
  }
  return a;
}

/**
 * Natural frequencies of the pencil G + s·C with C singular. With G nonsingular (it is the
 * bias point's Jacobian), G·v = −s·C·v becomes the standard problem (G⁻¹C)·v = μ·v with
 * s = −1/μ; the algebraic unknowns give μ = 0 (poles at infinity) and are dropped. When G is
 * singular the pencil is shifted, (G + σC)⁻¹C·v = μ·v with s = σ − 1/μ. `check` (a run's
 * limits) is called along the O(n³) passes, which take seconds at a thousand unknowns.
 */
export function pencilPoles(ss: SmallSignal, check?: () => void): Pole[] {
  const { n, G, C } = ss;
  if (n === 0) return [];
  const lu = new LuSolver(n);
  let shift = 0;
  const shifted = Float64Array.from(G);
  if (!lu.factor(shifted)) {
    let scaleG = 0;
    let scaleC = 0;
    for (let i = 0; i < n * n; i++) {
      scaleG = Math.max(scaleG, Math.abs(G[i]!));
      scaleC = Math.max(scaleC, Math.abs(C[i]!));
    }
    shift = scaleC > 0 ? (scaleG / scaleC) * 0.7071 : 1;
    for (let i = 0; i < n * n; i++) shifted[i] = G[i]! + shift * C[i]!;
    if (!lu.factor(shifted)) throw simulationError("singular-pencil", "the linearised circuit is singular at every frequency tried");
  }
  const { re, im } = eigenvalues(solvedColumns(lu, C, n, check), n, check);
  let largest = 0;
  for (let k = 0; k < n; k++) largest = Math.max(largest, Math.hypot(re[k]!, im[k]!));
  const poles: Pole[] = [];
  for (let k = 0; k < n; k++) {
    const mr = re[k]!;
    const mi = im[k]!;
    const mag2 = mr * mr + mi * mi;
    if (!(Math.sqrt(mag2) > INFINITE_POLE * largest)) continue;
    // s = shift − 1/μ, with 1/μ = conj(μ)/|μ|²
    poles.push({ real: shift - mr / mag2, imag: mi / mag2 });
  }
  return poles.sort((p, q) => q.real - p.real || q.imag - p.imag);
}

/** The rightmost pole with a positive imaginary part. */
export function dominantPair(poles: readonly Pole[]): Pole | null {
  let best: Pole | null = null;
  for (const p of poles) if (p.imag > 0 && (!best || p.real > best.real)) best = p;
  return best;
}

/** A pair's real part within this share of its imaginary part is on the axis (rounding). */
const MARGINAL = 1e-9;

/**
 * True when the pair lies in the right half-plane by more than rounding: a pair on the axis to
 * within 1e-9 of its frequency (the Barkhausen boundary itself) is marginal and does not start.
 */
export function startsFrom(pole: Pole): boolean {
  return pole.real > MARGINAL * Math.abs(pole.imag);
}

/**
 * True when the pair lies on the imaginary axis to within 1e-9 of its frequency (a lossless tank,
 * a loss cancelled exactly): it neither starts nor decays, so "it decays" would misreport it.
 */
export function onImaginaryAxis(pole: Pole): boolean {
  return Math.abs(pole.real) <= MARGINAL * Math.abs(pole.imag);
}

/** Runs a `poles` analysis: bias point, linearisation, natural frequencies. */
export function runPoles(circuit: Circuit, analysis: PolesAnalysis, options: RunOptions = {}): PolesResult {
  checkCircuit("runPoles", circuit);
  checkAnalysis("runPoles", analysis, "poles");
  checkOptions("runPoles", options);
  return polesAt(circuit, options);
}

/**
 * The poles at the bias point with lamps and thermistors at `ambient` (K; default 27 °C): a
 * steady analysis' own, at its `temperature=`, for a steady sweep's start threshold.
 */
export function polesAt(circuit: Circuit, options: RunOptions = {}, ambient?: number): PolesResult {
  const budget = budgetOf(options);
  budget.check("before the bias point");
  const system = buildSystem(circuit, options.extraParts, ambient === undefined ? {} : { ambient });
  const solver = new NewtonSolver(system, resolveTolerances(options.tolerances));
  const bias = solveBias(system, solver, solver.tolerances);
  budget.check("after the bias point");
  budget.refuseDense(system.n, "the poles");
  const poles = pencilPoles(linearize(system, bias.x), () => budget.check("during the poles"));
  const dominant = dominantPair(poles);
  return {
    analysis: "poles",
    poles,
    dominant,
    frequency: dominant ? dominant.imag / (2 * Math.PI) : null,
    growthRate: dominant ? dominant.real : null,
    starts: dominant ? startsFrom(dominant) : false,
  };
}

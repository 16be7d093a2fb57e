import { isOnsetError, simulationError } from "../circuit/diagnostic.js";
import type { MnaSystem } from "../solver/system.js";
import { gmres, type KrylovModel } from "./gmres.js";
import type { PeriodStart } from "./periodic-map.js";
import { Headway, periodGone, periodResidual, refuseFarFirstStep, shootingSetup, type Multiplier, type PeriodicOrbit, type ShootingJacobian, type ShootingOptions } from "./shooting.js";
import { MULTIPLIER_PRODUCTS, ritzMultipliers } from "./ritz-multipliers.js";
import { TangentPeriod } from "./tangent-period.js";
import { nextRadius, trustStep } from "./trust-region.js";

/**
 * From this many unknowns on, shooting is matrix-free by default. Measured on the ladder-network
 * oscillator (`pnpm bench matrix-free`; both grids' shooting, processor time): the dense path costs
 * 0.73× the matrix-free one at 51 unknowns, 1.8× at 71, 1.9× at 111 and 5.2× at 311 (its periods
 * with n + 1 sensitivity columns cost O(n³) per step, a tangent pass about half a plain period).
 */
export const MATRIX_FREE_FROM = 60;
/** Largest number of tangent passes one Newton step's GMRES makes (its restarts included). @defaultValue 60 */
export const KRYLOV_PRODUCTS = 60;
/** GMRES keeps this many Krylov vectors (of n + 1 doubles each) before it restarts: with the default bound on products, never. */
const KRYLOV_RESTART = 60;
/**
 * The inexact Newton's forcing term: GMRES stops at this share of the residual's (scaled) norm, a
 * fixed η (Eisenstat & Walker 1996, §2) small enough that Newton's convergence stays all but
 * quadratic over the few iterations shooting takes…
 */
const FORCING = 1e-3;
/** …or at this scaled residual, a hundredth of a tolerance, below which nothing more is to be had. */
const KRYLOV_FLOOR = 1e-2;
/** As `shootOrbit`: the first trust radius (a fifth of each unknown's peak, or of T, over `relative`)… */
const FIRST_RADIUS = 0.2;
/** …a trial step whose map fails cuts it to this share of the step… */
const POOR_RADIUS = 0.25;
/** …and a trial step is kept when it achieves more than this share of the predicted reduction. */
const ACCEPT_RATIO = 1e-4;

/** Whether {@link shootOrbit} goes matrix-free: as forced, else for a given Jacobian without a matrix, else from `MATRIX_FREE_FROM` unknowns on. */
export function matrixFreeFor(n: number, options: ShootingOptions): boolean {
  if (options.jacobian !== undefined && options.jacobian.matrix.length === 0) return true;
  return options.matrixFree ?? n >= MATRIX_FREE_FROM;
}

/**
 * Shooting by Newton–Krylov (Telichevesky, Kundert & White 1995; docs/references.md §9): the
 * same equations as `shootOrbit` — x_N − x₀ = 0 and, for an autonomous circuit, the phase
 * condition with T an unknown — but the bordered Newton system [[S_x − I, ∂x_N/∂T], [eⱼ, 0]]
 * is never formed: GMRES solves it (`gmres.ts`), in the unknowns scaled by their tolerances,
 * with one tangent pass of the period (`TangentPeriod`, about the cost of a plain period) per
 * product. Every accepted point gets its own tangent (no chord, no Broyden: the passes are the
 * Jacobian). The step is held within a trust radius, grown or shrunk by how well its linear model
 * predicted the residual as in `shootOrbit`; there is no Jᵀ for a dogleg over the whole space, so
 * the dogleg is taken within the Krylov subspace, where GMRES's small model is at hand (see
 * `subspaceDogleg`), and after a GMRES restart Newton's step is scaled back to the radius. The Floquet multipliers are the Ritz values of S_x from
 * an Arnoldi run at the converged orbit: its dominant ones only (those of largest magnitude, the
 * trivial ≈ 1 included), not all n, as far as the run converged on them (see `ritzMultipliers`).
 */
export function shootMatrixFree(system: MnaSystem, guess: PeriodStart, fractions: Float64Array, predictor: readonly Float64Array[] | undefined, options: ShootingOptions): PeriodicOrbit & { readonly jacobian: ShootingJacobian } {
  const { relative, map, n, floor, peak, unknowns, phase, scale } = shootingSetup(system, guess, predictor, options);
  const { autonomous } = options;
  const maxProducts = options.krylovProducts ?? KRYLOV_PRODUCTS;
  const maxIterations = options.maxIterations ?? 25;
  const x0 = Float64Array.from(guess.x);
  let T = guess.period;
  const from = new Float64Array(unknowns);
  /** Newton's step from `from`, scaled, and the norms of the scaled residual there and of GMRES's residual. */
  let newton = new Float64Array(unknowns);
  let fromNorm = 0;
  let modelNorm = 0;
  let radius = FIRST_RADIUS / relative;
  let length = 0;
  let newtonLength = 0;
  let predicted = 0;
  let cut = false;
  let trial = false;
  let states: readonly Float64Array[] | undefined = predictor;
  const headway = new Headway(options.giveUpAfter);
  const residual = new Float64Array(n);
  let krylov: KrylovModel | undefined;
  let tangent: TangentPeriod | undefined;
  const step = new Float64Array(unknowns);
  const stepWithin = () => {
    cut = newtonLength > radius;
    if (cut && krylov && !krylov.restarted) {
      ({ length, predicted } = subspaceDogleg(krylov, radius, step));
    } else {
      // (After a restart the model is not the subspace's alone: Newton's step scaled back, its
      // model residual (1 − λ)·r̃ + λ·ρ̃ with r̃·ρ̃ = ‖ρ̃‖², ρ̃ being orthogonal to J̃p̃.)
      const share = Math.min(1, radius / Math.max(newtonLength, Number.MIN_VALUE));
      length = share * newtonLength;
      predicted = (1 - share) ** 2 * fromNorm ** 2 + share * (2 - share) * modelNorm ** 2;
      for (let i = 0; i < unknowns; i++) step[i] = share * newton[i]!;
    }
    for (let i = 0; i < n; i++) x0[i] = from[i]! + step[i]! * scale[i]!;
    if (autonomous) T = from[n]! + step[n]! * scale[n]!;
    if (!(T > 0)) throw periodGone();
  };
  for (let iteration = 1; iteration <= maxIterations; iteration++) {
    options.check?.();
    let end: Float64Array;
    try {
      end = map.run({ t0: guess.t0, x: x0, period: T }, fractions, states, false).x;
    } catch (error) {
      if (!trial || !isOnsetError(error)) throw error;
      radius = POOR_RADIUS * length;
      stepWithin();
      continue;
    }
    states = map.states;
    const { mismatch, square } = periodResidual(end, x0, scale, residual);
    headway.record(iteration, mismatch, cut);
    if (trial) {
      const ratio = (fromNorm ** 2 - square) / Math.max(fromNorm ** 2 - predicted, Number.MIN_VALUE);
      radius = nextRadius(radius, length, ratio);
      if (!(ratio > ACCEPT_RATIO)) {
        stepWithin();
        continue;
      }
    }
    from.set(x0.subarray(0, n));
    if (autonomous) from[n] = T;
    fromNorm = Math.sqrt(square);
    tangent = new TangentPeriod(system, { start: { t0: guess.t0, x: x0, period: T }, fractions, states: map.states, middles: map.middlePoints }, tangent);
    const solved = gmres(borderedProduct(tangent, scale, phase, options.check), Float64Array.from({ length: unknowns }, (_, i) => (i < n ? -residual[i]! / scale[i]! : 0)), {
      tolerance: Math.max(FORCING * fromNorm, KRYLOV_FLOOR),
      restart: KRYLOV_RESTART,
      maxProducts,
    });
    newton = Float64Array.from(solved.x);
    modelNorm = solved.residual;
    krylov = solved.model;
    let size = 0;
    for (let i = 0; i < n; i++) size = Math.max(size, Math.abs(newton[i]!));
    if (autonomous) size = Math.max(size, Math.abs(newton[n]! * scale[n]!) / (relative * T));
    if (size <= 1 && mismatch <= 1) {
      const start = { t0: guess.t0, x: Float64Array.from(x0, (v, i) => v + newton[i]! * scale[i]!), period: autonomous ? T + newton[n]! * scale[n]! : T };
      const multipliers = options.multipliers ? ritzMultipliers(tangent, scale, MULTIPLIER_PRODUCTS, options.check) : [];
      return { start, fractions, states: map.states, iterations: iteration, mismatch, multipliers, jacobian: { matrix: new Float64Array(0), phase } };
    }
    if (iteration === 1 && options.giveUpAfter !== undefined) refuseFarFirstStep((i) => newton[i]! * scale[i]!, n, autonomous, T, peak, floor);
    let squareStep = 0;
    for (let i = 0; i < unknowns; i++) squareStep += newton[i]! ** 2;
    newtonLength = Math.sqrt(squareStep);
    trial = true;
    stepWithin();
  }
  throw simulationError("orbit-not-converged", `shooting did not converge in ${maxIterations} periods`, {
    hint: "the oscillation may not be periodic (it still drifts, or it is quasi-periodic); run the start-up longer",
  });
}

/**
 * Powell's dogleg within the Krylov subspace (Brown & Saad 1990, "Hybrid Krylov methods for
 * nonlinear systems of equations", §3): the subspace's orthonormal basis keeps lengths, and its
 * model ‖Ry − g‖² + g_k² is a square one in y, for `trustStep`. Far from the orbit the Jacobian
 * is nearly singular and Newton's step, even scaled back, is a poor descent direction; the
 * dogleg's first leg (the model's steepest descent) is a sure one. `step` gets V·y.
 */
function subspaceDogleg(krylov: KrylovModel, radius: number, step: Float64Array): { readonly length: number; readonly predicted: number } {
  const k = krylov.basis.length;
  const g = krylov.rotated;
  const residual = Float64Array.from({ length: k }, (_, i) => -g[i]!);
  const newton = new Float64Array(k);
  for (let i = k - 1; i >= 0; i--) {
    let sum = g[i]!;
    for (let j = i + 1; j < k; j++) sum -= krylov.triangular[i * k + j]! * newton[j]!;
    const pivot = krylov.triangular[i * k + i]!;
    newton[i] = pivot !== 0 ? sum / pivot : 0;
  }
  const y = new Float64Array(k);
  const { length, predicted } = trustStep(krylov.triangular, residual, new Float64Array(k).fill(1), newton, radius, y);
  step.fill(0);
  krylov.basis.forEach((v, i) => {
    for (let c = 0; c < step.length; c++) step[c] += y[i]! * v[c]!;
  });
  return { length, predicted: predicted + g[k]! ** 2 };
}

/**
 * The scaled bordered Jacobian's product J̃·p̃: with v = D·p̃ (and τ its last entry, scaled, for an
 * autonomous shooting), [(S·[v; τ] − v)/D; v_phase/D_phase] (the phase row scaled as its unknown).
 */
function borderedProduct(tangent: TangentPeriod, scale: Float64Array, phase: number, check: (() => void) | undefined): (p: Float64Array, out: Float64Array) => void {
  const n = tangent.n;
  const v = new Float64Array(n);
  const end = new Float64Array(n);
  return (p, out) => {
    check?.();
    for (let i = 0; i < n; i++) v[i] = p[i]! * scale[i]!;
    tangent.apply(v, p.length > n ? p[n]! * scale[n]! : 0, end);
    for (let i = 0; i < n; i++) out[i] = (end[i]! - v[i]!) / scale[i]!;
    if (p.length > n) out[n] = p[phase]!;
  };
}

/** A converged orbit's dominant Floquet multipliers on its own grid, as `shootMatrixFree` gives them (Ritz values at the orbit's start). */
export function orbitRitzMultipliers(system: MnaSystem, orbit: PeriodicOrbit, options: ShootingOptions): Multiplier[] {
  const { map, scale } = shootingSetup(system, orbit.start, orbit.states, options);
  map.run(orbit.start, orbit.fractions, orbit.states, false);
  const tangent = new TangentPeriod(system, { start: orbit.start, fractions: orbit.fractions, states: map.states, middles: map.middlePoints });
  return ritzMultipliers(tangent, scale, MULTIPLIER_PRODUCTS, options.check);
}

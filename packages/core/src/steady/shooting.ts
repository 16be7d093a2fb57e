import { isOnsetError, simulationError, type OnsetError } from "../circuit/diagnostic.js";
import { eigenvalues } from "../solver/eigenvalues.js";
import { LuSolver } from "../solver/lu.js";
import { QUANTITIES } from "../solver/quantities.js";
import type { MnaSystem } from "../solver/system.js";
import { absoluteTolerances, resolveTolerances, type Tolerances } from "../solver/tolerances.js";
import { matrixFreeFor, orbitRitzMultipliers, shootMatrixFree } from "./matrix-free-shooting.js";
import { PeriodicMap, type MapSensitivity, type PeriodStart } from "./periodic-map.js";
import { nonTrivialMultipliers } from "./stability.js";
import type { MapRun } from "./tangent-period.js";
import { IterationCap, LONGEST_SHOOTING } from "./iteration-cap.js";
import { trustStep, nextRadius } from "./trust-region.js";

/** A Floquet multiplier of the orbit (an eigenvalue of the monodromy matrix). */
export interface Multiplier {
  readonly re: number;
  readonly im: number;
}

/** A periodic steady state of the discretised circuit, found by shooting. */
export interface PeriodicOrbit {
  readonly start: PeriodStart;
  /** The grid: step k is fractions[k]·T. */
  readonly fractions: Float64Array;
  /** The unknowns at the N + 1 grid points, times t₀ + T·(Σ fractions up to k). */
  readonly states: readonly Float64Array[];
  /** Newton iterations of the shooting (periods integrated). */
  readonly iterations: number;
  /** Largest remaining mismatch x_N − x₀, in units of the unknowns' tolerances. */
  readonly mismatch: number;
  /** Floquet multipliers, largest magnitude first (the trivial one, ≈ 1 for an autonomous orbit, included); empty unless asked for. */
  readonly multipliers: readonly Multiplier[];
  /** The monodromy matrix dx_N/dx₀ (n × n, row-major) whose eigenvalues `multipliers` are, when a dense shooting's sensitivities gave them. */
  readonly monodromy?: Float64Array;
  /** A dense shooting's last period of the map (its states are `states`), from which tangent passes along it start (see `TangentPeriod`). */
  readonly lastPeriod?: MapRun;
}

/**
 * The factored Newton matrix of a shooting, kept between iterations (a chord iteration) and
 * handed from one grid to the next finer one, whose map barely differs.
 */
export interface ShootingJacobian {
  /** The matrix, (n + 1)² or n² row-major, unfactored (Broyden's update corrects it); empty from a matrix-free shooting (a shooting given it goes matrix-free too). */
  readonly matrix: Float64Array;
  readonly phase: number;
  /** Its factorisation, when at hand (else it is factored on first use). */
  readonly lu?: LuSolver;
  /** How much a step from it is expected to shrink the distance to the orbit (its relative error), when known. */
  readonly contraction?: number;
}

/** How {@link shootOrbit} looks for a periodic orbit: autonomous or driven, its iteration bound and tolerance, the multipliers, a Jacobian to start from. */
export interface ShootingOptions {
  /** Autonomous (the period is unknown, a phase condition fixes the start) or driven (T fixed). */
  readonly autonomous: boolean;
  /**
   * Largest number of periods integrated. @defaultValue 25, and beyond it up to
   * `LONGEST_SHOOTING` (100) while the mismatch still falls steadily (see `IterationCap`); a
   * given bound is not extended
   */
  readonly maxIterations?: number;
  /**
   * Periods after which a shooting gives up whose mismatch never fell below its first one, or
   * whose Newton step still reaches beyond the trust radius (a start out of Newton's reach); with
   * it, so does one whose first step would move the period by more than a fifth, or an unknown by
   * more than its peak over the period. @defaultValue never
   */
  readonly giveUpAfter?: number;
  /** The orbit is accepted when Newton's update of x₀ is within this fraction of each unknown's peak (plus its floor), and of T. @defaultValue 1e-9 */
  readonly relative?: number;
  readonly tolerances?: Partial<Tolerances>;
  /** Compute the Floquet multipliers at the converged orbit (one more period with sensitivities). */
  readonly multipliers?: boolean;
  /**
   * With `multipliers` and a given `jacobian` (a study's sample: its neighbour's Newton matrix
   * moved to first order in its drawn values, with a finite expected contraction), the
   * multipliers are that matrix's own when they leave the stability verdict beyond doubt — every
   * non-trivial one within `PREDICTED_STABLE` of the origin — and no period carries
   * sensitivities for them. They are then first-order estimates, good for the verdict (a sample
   * reports only that), not for the figures.
   */
  readonly predictedMultipliers?: boolean;
  /** A factored Newton matrix to start from (a chord iteration until it stops contracting). */
  readonly jacobian?: ShootingJacobian;
  /**
   * Where a fresh Newton matrix comes from: the map's sensitivities (`when-needed`), or, with
   * `given`, `jacobian` again in place of Broyden's updates the first time one is asked for (a
   * finer grid's shooting, whose map differs from the coarser grid's by O(h²): no period carries
   * the n + 1 sensitivity columns unless the given matrix, put back, still does not contract).
   * @defaultValue "when-needed"
   */
  readonly sensitivities?: "when-needed" | "given";
  /** Called before each period is integrated; throws to stop (a run's limits). */
  readonly check?: () => void;
  /** Newton–Krylov shooting without the dense Newton matrix (see `shootMatrixFree`). @defaultValue from `MATRIX_FREE_FROM` unknowns on */
  readonly matrixFree?: boolean;
  /** Matrix-free: the largest number of tangent passes per Newton step. @defaultValue 60 (`KRYLOV_PRODUCTS`) */
  readonly krylovProducts?: number;
}

/** The map's inner Newton is held this far below the orbit's own tolerance, so the map is smooth enough to shoot on. */
const INNER_SHARE = 1e-2;
/** A chord iteration that shrinks the mismatch less than this much per period gets a fresh Jacobian. */
const CHORD_CONTRACTION = 0.2;

/**
 * x_N − x₀ into the residual's first n entries, with its largest entry and its squared norm in
 * units of the unknowns' tolerances (`scale`).
 */
export function periodResidual(end: Float64Array, x0: Float64Array, scale: Float64Array, residual: Float64Array): { readonly mismatch: number; readonly square: number } {
  let mismatch = 0;
  let square = 0;
  for (let i = 0; i < x0.length; i++) {
    residual[i] = end[i]! - x0[i]!;
    mismatch = Math.max(mismatch, Math.abs(residual[i]!) / scale[i]!);
    square += (residual[i]! / scale[i]!) ** 2;
  }
  return { mismatch, square };
}

/**
 * What both shootings (dense and matrix-free) start from: the map, its inner Newton held to a
 * hundredth of the orbit's tolerance and referred to each unknown's peak over the guessed period;
 * the unknown the phase condition holds; and the scale of each unknown and of its residual, its
 * tolerance (relative × peak + floor, and relative × T for the period), as the mismatch measures it.
 */
export function shootingSetup(system: MnaSystem, guess: PeriodStart, predictor: readonly Float64Array[] | undefined, options: ShootingOptions) {
  const relative = options.relative ?? 1e-9;
  const base = resolveTolerances(options.tolerances);
  const map = new PeriodicMap(system, innerTolerances(base, relative));
  const { n } = map;
  const floor = absoluteTolerances(system.unknowns, base, "newton");
  const peak = new Float64Array(n);
  const trace = predictor ?? [guess.x];
  for (const x of trace) for (let i = 0; i < n; i++) peak[i] = Math.max(peak[i]!, Math.abs(x[i]!));
  map.solver.reference.set(peak);
  const unknowns = n + (options.autonomous ? 1 : 0);
  const phase = options.jacobian?.phase ?? (options.autonomous ? phaseUnknown(system, trace, peak, floor) : -1);
  const scale = new Float64Array(unknowns);
  for (let i = 0; i < n; i++) scale[i] = relative * peak[i]! + floor[i]!;
  if (options.autonomous) scale[n] = relative * guess.period;
  return { relative, map, n, floor, peak, unknowns, phase, scale };
}

/**
 * Gives up on a first Newton step that would move the period by more than a fifth, or an
 * unknown by more than its peak over the period (out of the range it visited): the start is out
 * of Newton's reach. `move(i)` is the step's change of unknown i (i = n: the period).
 */
export function refuseFarFirstStep(move: (i: number) => number, n: number, autonomous: boolean, T: number, peak: Float64Array, floor: Float64Array): void {
  const hint = "the start is too far from the orbit; run the start-up longer";
  if (autonomous && Math.abs(move(n)) > FIRST_RADIUS * T) throw simulationError("orbit-not-converged", "shooting's first step would move the period by more than a fifth", { hint });
  for (let i = 0; i < n; i++) {
    if (Math.abs(move(i)) > peak[i]! + floor[i]!) throw simulationError("orbit-not-converged", "shooting's first step would move an unknown beyond its range over the period", { hint });
  }
}

/** A shooting whose step took the period to zero or below. */
export function periodGone(): OnsetError {
  return simulationError("orbit-period", "shooting drove the period to zero: no periodic orbit near the guess");
}

/**
 * A shooting's headway, for `ShootingOptions.giveUpAfter`: the first period's mismatch and the
 * best since. From that many periods on, a shooting whose mismatch never fell below its first,
 * or whose step the trust radius still cuts short (`cut`: the start is out of Newton's reach), gives up.
 */
export class Headway {
  private first = Infinity;
  private best = Infinity;

  constructor(private readonly giveUpAfter: number | undefined) {}

  /** Records period `iteration`'s mismatch; throws when the shooting gives up there. */
  record(iteration: number, mismatch: number, cut: boolean): void {
    if (iteration === 1) this.first = mismatch;
    else this.best = Math.min(this.best, mismatch);
    if (this.giveUpAfter !== undefined && iteration >= this.giveUpAfter && !(this.best < this.first && !cut)) {
      throw simulationError("orbit-not-converged", `shooting made no headway in ${iteration} periods`, { hint: "the start is too far from the orbit; run the start-up longer" });
    }
  }
}

/** The map's Newton tolerances: a hundredth of the orbit's, relative and absolute. */
function innerTolerances(base: Tolerances, relative: number): Tolerances {
  const inner: Record<string, number> = { ...base, newtonRelative: INNER_SHARE * relative };
  for (const q of Object.values(QUANTITIES)) inner[q.newton] = INNER_SHARE * base[q.newton];
  return inner as unknown as Tolerances;
}

/**
 * Newton's method on the periodicity condition of the discrete map (shooting; Aprille & Trick
 * 1972, and for an autonomous circuit the period as an unknown with a phase condition, as in
 * Kundert, White & Sangiovanni-Vincentelli 1990; docs/references.md §9). Unknowns: the state
 * x₀ and T; equations x_N − x₀ = 0 and x₀[j] = its guessed value, for the state j moving
 * fastest at the start (where a shift in time changes it most). The Jacobian
 * [[Sx − I, ∂x_N/∂T], [eⱼ, 0]] comes from the sensitivities the map carries (each period with
 * them costs n + 1 extra solves per step), so it is computed only at the start and where the
 * iteration stops contracting; in between it is kept up to date by Broyden's rank-one update
 * from each step taken (Broyden 1965; Dennis & Schnabel 1983, §8). Each step is held within a
 * trust radius in the unknowns scaled by their tolerances (Powell's dogleg, see `trustStep`),
 * grown where the residual fell as the linear model predicted and shrunk where it did not
 * (Dennis & Schnabel 1983, §6.4; Nocedal & Wright 2006, ch. 4): a slowly attracting orbit — an
 * amplitude loop with a thermal time constant — has a nearly singular Jacobian, whose full steps
 * from far away overshoot far. A step the radius cuts short gets the exact Jacobian at its end.
 */
export function shootOrbit(system: MnaSystem, guess: PeriodStart, fractions: Float64Array, predictor: readonly Float64Array[] | undefined, options: ShootingOptions): PeriodicOrbit & { readonly jacobian: ShootingJacobian } {
  if (matrixFreeFor(system.n, options)) return shootMatrixFree(system, guess, fractions, predictor, options);
  const { relative, map, n, floor, peak, unknowns, phase, scale } = shootingSetup(system, guess, predictor, options);
  const newton = new ShootingMatrix(unknowns, phase, options.jacobian);
  // (Only from a matrix moved along every toleranced value: its expected contraction is then known.)
  const estimated = options.multipliers && options.predictedMultipliers && Number.isFinite(options.jacobian?.contraction) ? clearlyStable(options.jacobian!.matrix, unknowns, n, options.autonomous) : undefined;
  // Whether the multipliers need a period with sensitivities at (or near) the orbit.
  const exact = options.multipliers === true && estimated === undefined;
  // The point the last step started from (x₀ and T), its residual, the step taken, and the Newton step there.
  const x0 = Float64Array.from(guess.x);
  let T = guess.period;
  const from = new Float64Array(unknowns);
  const fromResidual = new Float64Array(unknowns);
  const step = new Float64Array(unknowns);
  const full = new Float64Array(unknowns);
  let radius = FIRST_RADIUS / relative;
  /** The step's scaled length, ‖r̃‖² where it started, and the model's ‖r̃ + J̃p̃‖² after it. */
  let length = 0;
  /** Newton's step's scaled length (the step is Newton's unless the radius cut it short). */
  let newtonLength = 0;
  let fromSquare = Infinity;
  let predicted = 0;
  /** The radius cut the step short of Newton's. */
  let cut = false;
  /** x₀ lies on a step from `from` (it is judged against `from` before it is kept). */
  let trial = false;
  let fresh = options.jacobian === undefined;
  let freshAtFrom = false;
  /** A step from `from` with an updated matrix was rejected once and learnt from. */
  let learnedAtFrom = false;
  const residual = new Float64Array(unknowns);
  let states: readonly Float64Array[] | undefined = predictor;
  let previous = Infinity;
  /** Whether the given matrix was already put back once (see `ShootingOptions.sensitivities`). */
  let givenAgain = false;
  /** The last sensitivities, when taken within `MULTIPLIER_REACH` of the orbit. */
  let near: MapSensitivity | undefined;
  const headway = new Headway(options.giveUpAfter);
  const maxIterations = options.maxIterations ?? 25;
  // (A given bound is kept as it is: a seeded sample falls back on a transient.)
  const cap = new IterationCap(maxIterations, options.maxIterations === undefined ? LONGEST_SHOOTING : maxIterations);
  const moveTo = (fraction: number) => {
    for (let i = 0; i < n; i++) x0[i] = from[i]! + fraction * step[i]!;
    if (options.autonomous) T = from[n]! + fraction * step[n]!;
  };
  /** The step from `from` within the trust radius (see `trustStep`), taken. */
  const stepWithin = () => {
    ({ length, newtonLength, predicted } = trustStep(newton.factored().matrix, fromResidual, scale, full, radius, step));
    cut = newtonLength > radius;
    moveTo(1);
    if (!(T > 0)) throw periodGone();
  };
  let iteration = 1;
  for (; cap.allows(iteration); iteration++) {
    options.check?.();
    const given: boolean = fresh && options.sensitivities === "given" && options.jacobian !== undefined && !givenAgain;
    givenAgain ||= given;
    let end: ReturnType<PeriodicMap["run"]>;
    try {
      end = map.run({ t0: guess.t0, x: x0, period: T }, fractions, states, fresh && !given);
    } catch (error) {
      // A trial step the map cannot follow (its inner Newton fails out there) lies beyond where the model holds.
      if (!trial || !isOnsetError(error)) throw error;
      radius = POOR_RADIUS * length;
      stepWithin();
      continue;
    }
    states = map.states;
    const { mismatch, square } = periodResidual(end.x, x0, scale, residual);
    if (options.autonomous) residual[n] = 0;
    headway.record(iteration, mismatch, cut);
    cap.record(mismatch);
    // How well the model predicted the step's reduction of ‖r̃‖² (the trust region's test).
    const ratio = trial ? (fromSquare - square) / Math.max(fromSquare - predicted, Number.MIN_VALUE) : 1;
    if (trial) radius = nextRadius(radius, length, ratio);
    if (trial && !(ratio > ACCEPT_RATIO)) {
      if (!freshAtFrom && learnedAtFrom) {
        // An updated matrix led astray again: back to where the step started, with the Jacobian there.
        moveTo(0);
        fresh = true;
        trial = false;
        continue;
      }
      // The exact Jacobian's model does not hold that far (the map bends within the step), or an
      // updated matrix led astray once: learn from the step, try a shorter one.
      learnedAtFrom = !freshAtFrom;
      newton.secant(step, fromResidual, residual);
      newton.solve(fromResidual, full);
      stepWithin();
      fresh = cut;
      continue;
    }
    if (end.sensitivity) newton.set(end.sensitivity, n);
    else if (given) newton.reset(options.jacobian!);
    // A finer grid keeps the coarser grid's matrix as it is (a chord iteration): its first step
    // is mostly the grids' O(h²) difference, and a secant update from it corrupts the matrix in
    // the slowly attracting direction, where the residual understates the distance most.
    else if (trial && options.sensitivities !== "given") newton.secant(step, fromResidual, residual);
    freshAtFrom = end.sensitivity !== undefined || given;
    learnedAtFrom = false;
    // (A step cut short to a share λ of Newton's is expected to shrink the mismatch to about 1 − λ of it.)
    const share = trial ? Math.min(1, length / Math.max(newtonLength, Number.MIN_VALUE)) : 1;
    const contracted = !trial || mismatch <= (1 - share * (1 - CHORD_CONTRACTION)) * previous;
    for (let i = 0; i < n; i++) from[i] = x0[i]!;
    if (options.autonomous) from[n] = T;
    fromResidual.set(residual);
    fromSquare = square;
    newton.solve(residual, full);
    // Newton's update is the distance to the orbit (the residual alone understates it by
    // 1/(1 − μ) when the orbit attracts slowly, μ the multiplier nearest 1): once it is within
    // the tolerance, this period's states are the orbit, and the update only sharpens x₀ and T.
    // The residual must be within it too: an update from a secant-updated matrix can understate
    // the distance (a mismatch of several tolerances with an update below one).
    let size = 0;
    for (let i = 0; i < n; i++) size = Math.max(size, Math.abs(full[i]!) / scale[i]!);
    if (options.autonomous) size = Math.max(size, Math.abs(full[n]!) / (relative * T));
    if (end.sensitivity) near = size <= MULTIPLIER_REACH ? end.sensitivity : undefined;
    if (size <= 1 && mismatch <= 1) {
      // (The map ends with this call: its states are the orbit's, copied only when one more period will overwrite them.)
      const more = exact && near === undefined;
      const kept = more ? map.states.map((v) => Float64Array.from(v)) : map.states;
      const start = { t0: guess.t0, x: Float64Array.from(x0, (v, i) => v + full[i]!), period: options.autonomous ? T + full[n]! : T };
      const atOrbit = exact && !near ? map.run(start, fractions, kept, true).sensitivity! : undefined;
      // (The exact matrix at the orbit, when that period computed it, is the one a finer grid starts from.)
      if (atOrbit) newton.set(atOrbit, n);
      const monodromy = options.multipliers && (near || atOrbit) ? monodromyOf(near ?? atOrbit!, n) : undefined;
      const multipliers = !options.multipliers ? [] : monodromy ? largestFirst(monodromy, n) : estimated!;
      const lastPeriod = { start: atOrbit ? start : { t0: guess.t0, x: Float64Array.from(x0), period: T }, fractions, states: map.states, middles: map.middlePoints };
      return { start, fractions, states: kept, iterations: iteration, mismatch, multipliers, ...(monodromy ? { monodromy } : {}), lastPeriod, jacobian: newton.factored() };
    }
    // A slow contraction asks for the Jacobian at the next point; so does a period that will
    // likely be the last (the step shrinking as the mismatch did), when the multipliers need it.
    // (After an exact Jacobian Newton converges quadratically: a step within a thousand tolerances
    // is most often the last but one; after a given matrix, the step shrinks by its contraction.)
    const likely = trial ? size * (mismatch / previous) <= 1 : freshAtFrom ? size <= LIKELY_LAST : size * (options.jacobian?.contraction ?? Infinity) <= 1;
    const last = exact && likely && near === undefined;
    previous = mismatch;
    trial = true;
    // A first step that would move the period by more than a fifth, or an unknown by more than its peak
    // over the period (out of the range it visited), says the start is out of Newton's reach.
    if (iteration === 1 && options.giveUpAfter !== undefined) refuseFarFirstStep((i) => full[i]!, n, options.autonomous, T, peak, floor);
    stepWithin();
    // A step cut short by the trust radius lies where the map bends: its point gets the exact Jacobian (a secant update learns too little there, and a step rejected from one would cost a period to recompute it at the start).
    fresh = !contracted || last || cut;
  }
  throw simulationError("orbit-not-converged", `shooting did not converge in ${iteration - 1} periods`, {
    hint: "the oscillation may not be periodic (it still drifts, or it is quasi-periodic); run the start-up longer",
  });
}

/** One period of the map from a point: the shooting's residual there and, when asked, its Newton matrix. */
export interface PeriodAt {
  /** [x_N − x₀; 0]: n + 1 values for an autonomous shooting (its phase row holds). */
  readonly residual: Float64Array;
  /** The shooting's Newton matrix at the point ((n + 1)², row-major), or null when not asked for. */
  readonly matrix: Float64Array | null;
}

/**
 * One period of an autonomous shooting's map from `start`, with the map's Newton held as tightly
 * as {@link shootOrbit} holds it for the same `relative`: the residual, and with `phase` (the
 * unknown the phase condition holds) the Newton matrix from the map's sensitivities.
 */
export function periodAt(system: MnaSystem, start: PeriodStart, fractions: Float64Array, predictor: readonly Float64Array[], options: Pick<ShootingOptions, "relative" | "tolerances"> & { readonly phase?: number }): PeriodAt {
  const map = new PeriodicMap(system, innerTolerances(resolveTolerances(options.tolerances), options.relative ?? 1e-9));
  const { n } = map;
  const end = map.run(start, fractions, predictor, options.phase !== undefined);
  const residual = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) residual[i] = end.x[i]! - start.x[i]!;
  if (options.phase === undefined) return { residual, matrix: null };
  const newton = new ShootingMatrix(n + 1, options.phase, undefined);
  newton.set(end.sensitivity!, n);
  return { residual, matrix: Float64Array.from(newton.factored().matrix) };
}

/**
 * The Floquet multipliers of a converged orbit on its own grid, as its shooting would give them
 * (`options` as for that shooting): one period of the map from the orbit's start with
 * sensitivities (its Newton held as {@link shootOrbit} holds it), the monodromy's eigenvalues,
 * largest magnitude first; or, for a matrix-free shooting, the dominant ones (see
 * `orbitRitzMultipliers`). The orbit is left as it is.
 */
export function orbitMultipliers(system: MnaSystem, orbit: PeriodicOrbit, options: ShootingOptions): Multiplier[] {
  if (matrixFreeFor(system.n, options)) return orbitRitzMultipliers(system, orbit, options);
  const { map, n } = shootingSetup(system, orbit.start, orbit.states, options);
  return floquetMultipliers(map.run(orbit.start, orbit.fractions, orbit.states, true).sensitivity!, n);
}

/**
 * Predicted multipliers are taken when every non-trivial one lies within this radius. The
 * prediction is only first order in the sample's moves: over 200 samples of the bridge source's
 * study its largest multiplier was off by up to 0.13 (exact 0.665, predicted 0.538), so only an
 * orbit predicted to attract strongly is judged without its exact multipliers — a verdict would
 * need an error of 0.4 to turn.
 */
const PREDICTED_STABLE = 0.6;

/**
 * The multipliers of a shooting's Newton matrix (S_x − I in its first n rows and columns, of
 * `unknowns` in all), when every non-trivial one (the one nearest 1 left out for an autonomous
 * orbit) lies within `PREDICTED_STABLE`; undefined otherwise.
 */
function clearlyStable(matrix: Float64Array, unknowns: number, n: number, autonomous: boolean): Multiplier[] | undefined {
  if (matrix.length !== unknowns * unknowns) return undefined;
  const monodromy = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let c = 0; c < n; c++) monodromy[i * n + c] = matrix[i * unknowns + c]!;
    monodromy[i * n + i] += 1;
  }
  const all = largestFirst(monodromy, n);
  return nonTrivialMultipliers(all, autonomous).every((m) => Math.hypot(m.re, m.im) <= PREDICTED_STABLE) ? all : undefined;
}

/** A step after an exact Jacobian this small (in tolerances) likely leaves one period to go. */
const LIKELY_LAST = 1e3;
/**
 * Sensitivities taken this close to the orbit (Newton's update from their point, in tolerances)
 * give its multipliers as well as the converged period's own, which is itself only known to
 * within one tolerance: no further period carries them.
 */
const MULTIPLIER_REACH = 2;
/**
 * The first trust radius, in tolerances (of `relative`) over `relative`: as long as a step moving
 * one unknown by a fifth of its peak, or the period by a fifth of it (a cautious start, Dennis &
 * Schnabel 1983, §6.4.1: a slowly attracting orbit's Newton step is long and bends out of the
 * map's linear reach).
 */
const FIRST_RADIUS = 0.2;
/** A trial step whose map fails cuts the radius to this share of it. */
const POOR_RADIUS = 0.25;
/** A trial step is kept when it achieves more than this share of the reduction its model predicted. */
const ACCEPT_RATIO = 1e-4;

/**
 * The shooting's Newton matrix M (of F(x₀, T) = [x_N − x₀; x₀[j] − c]), kept unfactored
 * beside its factorisation so that Broyden's update can correct it after a step.
 */
class ShootingMatrix {
  private readonly matrix: Float64Array;
  /** The factorisation of `matrix`, or undefined while it is out of date. */
  private lu: LuSolver | undefined;
  private own: LuSolver | undefined;
  private readonly product: Float64Array;

  constructor(
    private readonly unknowns: number,
    private readonly phase: number,
    start: ShootingJacobian | undefined,
  ) {
    this.matrix = start ? Float64Array.from(start.matrix) : new Float64Array(unknowns * unknowns);
    this.lu = start?.lu;
    this.product = new Float64Array(unknowns);
  }

  /** M back to a given matrix (its factorisation kept). */
  reset(start: ShootingJacobian): void {
    this.matrix.set(start.matrix);
    this.lu = start.lu;
  }

  /** M from the map's sensitivities. */
  set(s: MapSensitivity, n: number): void {
    const { matrix, unknowns } = this;
    matrix.fill(0);
    for (let i = 0; i < n; i++) {
      for (let c = 0; c < n; c++) matrix[i * unknowns + c] = s.x[i * s.columns + c]!;
      matrix[i * unknowns + i] -= 1;
      if (unknowns > n) matrix[i * unknowns + n] = s.x[i * s.columns + n]!;
    }
    if (unknowns > n) matrix[n * unknowns + this.phase] = 1;
    this.lu = undefined;
  }

  /**
   * Broyden's update after the step s moved the residual from `before` to `after`:
   * M += (Δr − M·s)·sᵀ / (sᵀs), so that M·s = Δr (the phase row, being linear, stays as it is).
   */
  secant(step: Float64Array, before: Float64Array, after: Float64Array): void {
    const { matrix, unknowns, product } = this;
    let norm = 0;
    for (let c = 0; c < unknowns; c++) norm += step[c]! ** 2;
    if (!(norm > 0)) return;
    for (let i = 0; i < unknowns; i++) {
      let sum = 0;
      for (let c = 0; c < unknowns; c++) sum += matrix[i * unknowns + c]! * step[c]!;
      product[i] = after[i]! - before[i]! - sum;
    }
    for (let i = 0; i < unknowns; i++) {
      const w = product[i]! / norm;
      if (w === 0) continue;
      for (let c = 0; c < unknowns; c++) matrix[i * unknowns + c] += w * step[c]!;
    }
    this.lu = undefined;
  }

  /** out = −M⁻¹·residual. */
  solve(residual: Float64Array, out: Float64Array): void {
    this.factored().lu.solveNegated(residual, out);
  }

  factored(): ShootingJacobian & { readonly lu: LuSolver } {
    if (!this.lu) {
      const lu = (this.own ??= new LuSolver(this.unknowns));
      if (!lu.factor(this.matrix)) throw simulationError("orbit-singular", "the shooting equations are singular: the orbit's period is not determined");
      this.lu = lu;
    }
    return { lu: this.lu, phase: this.phase, matrix: this.matrix };
  }
}

/**
 * The unknown the phase condition holds fixed: the charged state whose value changes fastest,
 * relative to its own scale, over the first step of the guessed period.
 */
function phaseUnknown(system: MnaSystem, trace: readonly Float64Array[], peak: Float64Array, floor: Float64Array): number {
  let best = -1;
  let bestRate = -1;
  const first = trace[0]!;
  const next = trace[Math.min(1, trace.length - 1)]!;
  for (const j of system.stateColumns) {
    const rate = Math.abs(next[j]! - first[j]!) / (peak[j]! + floor[j]!);
    if (rate > bestRate) {
      bestRate = rate;
      best = j;
    }
  }
  if (best < 0) throw simulationError("orbit-no-state", "the circuit has no charged state to fix the orbit's phase on");
  return best;
}

/** Eigenvalues of the monodromy matrix dx_N/dx₀, largest magnitude first. */
function floquetMultipliers(s: MapSensitivity, n: number): Multiplier[] {
  return largestFirst(monodromyOf(s, n), n);
}

/** The monodromy matrix dx_N/dx₀ (n × n, row-major) from the map's sensitivities. */
function monodromyOf(s: MapSensitivity, n: number): Float64Array {
  const monodromy = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let c = 0; c < n; c++) monodromy[i * n + c] = s.x[i * s.columns + c]!;
  return monodromy;
}

/** The eigenvalues of a monodromy matrix (n × n, row-major), largest magnitude first. */
function largestFirst(monodromy: Float64Array, n: number): Multiplier[] {
  const { re, im } = eigenvalues(monodromy, n);
  return Array.from(re, (v, k) => ({ re: v, im: im[k]! })).sort((a, b) => Math.hypot(b.re, b.im) - Math.hypot(a.re, a.im));
}

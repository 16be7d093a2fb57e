import { simulationError } from "../circuit/diagnostic.js";
import { Linearisation } from "../solver/linearisation.js";
import { DenseLu } from "../solver/dense-lu.js";
import { DeviceValues } from "./device-values.js";
import { NewtonSolver } from "../solver/newton.js";
import type { MnaSystem } from "../solver/system.js";
import type { Tolerances } from "../solver/tolerances.js";

/** Where one period of the map starts: the unknowns x₀ at time t₀, and the period T. */
export interface PeriodStart {
  readonly t0: number;
  readonly x: Float64Array;
  readonly period: number;
}

/** d x_N / d(x₀, T): n rows of n + 1 columns (the last is T), row-major. */
export interface MapSensitivity {
  readonly columns: number;
  readonly x: Float64Array;
}

/** TR-BDF2's stage fraction 2 − √2: both stages then share one Newton matrix G + a·C, a = 2/(γh). */
export const GAMMA = 2 - Math.SQRT2;
/** The second stage's weights of q(t+γh) and q(t) (Bank et al. 1985; Hosea & Shampine 1996). */
export const STAGE_NOW = 1 / (GAMMA * (2 - GAMMA));
export const STAGE_BEFORE = (1 - GAMMA) ** 2 / (GAMMA * (2 - GAMMA));
/** Weights of xₖ₋₁, xₖ and xₖ₊₁ in the parabola through them at tₖ + γhₖ, for steps hₖ₋₁ = `before`, hₖ = `step`. */
function stageWeights(before: number, step: number): readonly [number, number, number] {
  const t = GAMMA * step;
  return [(t * (t - step)) / (before * (before + step)), ((t + before) * (step - t)) / (before * step), ((t + before) * t) / ((step + before) * step)];
}

/** The predictor's deviation is extrapolated over at most twice the last step (see `run`). */
const MAX_TREND = 2;

/**
 * One period of the circuit by TR-BDF2 on a fixed grid whose steps are fractions of T: the map
 * x₀ ↦ x_N whose fixed point is the periodic steady state of the discretised circuit. TR-BDF2
 * is second order, one-step (the state is x alone) and L-stable, so a stiff mode — an op-amp's
 * pole, a capacitor on an amplifier's output — is damped within a step instead of ringing, and
 * the map's derivative has the orbit's true Floquet multipliers near zero for such modes.
 *
 * A step h from xₖ: the trapezoidal stage to t + γh,
 *   R₁ = G·x + f(x) + a·(q(x) − qₖ) − q̇ₖ − u = 0,  a = 2/(γh),
 * then BDF2 through tₖ, tₖ + γh and tₖ₊₁,
 *   R₂ = G·x + f(x) + a·(q(x) − c₁·q_γ + c₂·qₖ) − u = 0,  c₁ = 1/(γ(2−γ)), c₂ = (1−γ)²/(γ(2−γ)),
 * with the same a (for γ = 2 − √2). The rate q̇ at a point is u − G·x − f(x) on charged rows and 0
 * on algebraic ones. With `sensitivity`, dx_N/d(x₀, T) rides along (the variational equations
 * of the two stages; ∂R/∂h is −(q̇_γ + q̇ₖ)/h for the first stage and −q̇ₖ₊₁/h for the second).
 * Its eigenvalues in x₀ are the orbit's Floquet multipliers (Aprille & Trick 1972;
 * docs/references.md §9).
 */
export class PeriodicMap {
  readonly n: number;
  readonly solver: NewtonSolver;
  /** The unknowns at every grid point of the last run (N + 1 of them). */
  states: Float64Array[] = [];
  /** The last run's first-stage solutions, at tₖ + γhₖ (N of them). */
  private middles: Float64Array[] = [];
  /** The last run's first-stage solutions (overwritten by the next run). */
  get middlePoints(): readonly Float64Array[] {
    return this.middles;
  }
  private readonly system: MnaSystem;
  // The devices at xₖ, x_γ and xₖ₊₁: linearised when sensitivities ride along, values only otherwise.
  private readonly linearised: readonly [Linearisation, Linearisation, Linearisation];
  private readonly values: readonly [DeviceValues, DeviceValues, DeviceValues];
  /** The constant C and G by row, their nonzero entries only (column, C, G). */
  private readonly rowStart: Int32Array;
  private readonly rowColumn: Int32Array;
  private readonly rowC: Float64Array;
  private readonly rowG: Float64Array;
  private readonly lu: DenseLu;
  private readonly jacobian: Float64Array;
  // Charges and rates at xₖ, x_γ and xₖ₊₁ (here and next swap at each step).
  private qHere: Float64Array;
  private rateHere: Float64Array;
  private readonly qMiddle: Float64Array;
  private readonly rateMiddle: Float64Array;
  private qNext: Float64Array;
  private rateNext: Float64Array;
  private readonly xMiddle: Float64Array;
  private readonly xNext: Float64Array;
  private readonly sMiddle: Float64Array;
  private readonly rhs: Float64Array;
  /** The predictor's state at the current step's start, kept before the run overwrites it. */
  private readonly before: Float64Array;
  /** This run's deviation from the predictor at the last step's start. */
  private readonly deviation: Float64Array;
  private readonly iterations: number;

  constructor(system: MnaSystem, tolerances: Tolerances) {
    const n = system.n;
    this.n = n;
    this.system = system;
    this.solver = new NewtonSolver(system, tolerances);
    this.solver.setMode("step");
    this.iterations = tolerances.stepIterations;
    this.linearised = [new Linearisation(system), new Linearisation(system), new Linearisation(system)];
    this.values = [new DeviceValues(system), new DeviceValues(system), new DeviceValues(system)];
    const entries: number[] = [];
    this.rowStart = new Int32Array(n + 1);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) if (system.C[i * n + j] !== 0 || system.G[i * n + j] !== 0) entries.push(i * n + j);
      this.rowStart[i + 1] = entries.length;
    }
    this.rowColumn = Int32Array.from(entries, (e) => e % n);
    this.rowC = Float64Array.from(entries, (e) => system.C[e]!);
    this.rowG = Float64Array.from(entries, (e) => system.G[e]!);
    this.lu = new DenseLu(n);
    this.jacobian = new Float64Array(n * n);
    this.qHere = new Float64Array(n);
    this.rateHere = new Float64Array(n);
    this.qMiddle = new Float64Array(n);
    this.rateMiddle = new Float64Array(n);
    this.qNext = new Float64Array(n);
    this.rateNext = new Float64Array(n);
    this.xMiddle = new Float64Array(n);
    this.xNext = new Float64Array(n);
    this.sMiddle = new Float64Array(n * (n + 1));
    this.rhs = new Float64Array(n * (n + 1));
    this.before = new Float64Array(n);
    this.deviation = new Float64Array(n);
  }

  /** q = C·x + the devices' charges, and q̇ = u − G·x − f on charged rows, from the devices at x. */
  private chargeAndRate(x: Float64Array, at: DeviceValues | Linearisation, q: Float64Array, rate: Float64Array): void {
    const { n, rowStart, rowColumn, rowC, rowG } = this;
    const u = this.solver.u;
    const { chargedRows } = this.system;
    for (let i = 0; i < n; i++) {
      let cx = at.charges[i]!;
      let gx = at.f[i]!;
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) {
        const xj = x[rowColumn[e]!]!;
        cx += rowC[e]! * xj;
        gx += rowG[e]! * xj;
      }
      q[i] = cx;
      rate[i] = chargedRows[i] ? u[i]! - gx : 0;
    }
  }

  /**
   * Integrates one period from `start` over the grid (step k is fractions[k]·T). `predictor`
   * (the unknowns at each grid point of an earlier run) starts each step's Newton solves: its
   * step from point k to k + 1, taken from this run's point k, so that a start moved by the
   * shooting's update (which moves the whole period nearly alike) costs no extra iterations.
   */
  run(start: PeriodStart, fractions: Float64Array, predictor: readonly Float64Array[] | undefined, sensitivity: boolean): { x: Float64Array; sensitivity: MapSensitivity | undefined } {
    const { n, solver } = this;
    const N = fractions.length;
    const T = start.period;
    // A predictor that is this map's own last run on this grid also has its first stages.
    const own = predictor === this.states && this.middles.length === N;
    if (this.states.length !== N + 1) this.states = Array.from({ length: N + 1 }, () => new Float64Array(n));
    if (this.middles.length !== N) this.middles = Array.from({ length: N }, () => new Float64Array(n));
    if (predictor) this.before.set(predictor[0]!);
    this.states[0]!.set(start.x);
    const columns = n + 1;
    const sx = sensitivity ? new Float64Array(n * columns) : undefined;
    if (sx) for (let i = 0; i < n; i++) sx[i * columns + i] = 1;
    // (Linearisations exactly when sensitivities ride along: `propagate` reads their G_x and C_x.)
    let [here, middle, next]: readonly (DeviceValues | Linearisation)[] = sx ? this.linearised : this.values;
    here!.at(start.x);
    solver.loadSources(start.t0, 1, false);
    this.chargeAndRate(start.x, here!, this.qHere, this.rateHere);
    let elapsed = 0;
    for (let k = 0; k < N; k++) {
      const h = fractions[k]! * T;
      const a = 2 / (GAMMA * h);
      const t = start.t0 + elapsed * T;
      elapsed += fractions[k]!;
      solver.setCoefficients(a, a);
      const history = solver.history;
      // Stage 1: trapezoidal to t + γh.
      for (let i = 0; i < n; i++) history[i] = a * this.qHere[i]! + this.rateHere[i]!;
      solver.loadSources(t + GAMMA * h, 1, false);
      const x = this.states[k]!;
      const after = predictor?.[k + 1];
      const { before, deviation } = this;
      // The earlier run's point k + 1 moved by this run's deviation from it, dₖ = xₖ − pₖ,
      // extrapolated along the step: p_{k+1} + dₖ + (hₖ/hₖ₋₁)·(dₖ − dₖ₋₁) (the ratio at most 2,
      // so that a step far longer than the last does not magnify its Newton noise).
      // The first stage likewise from the last run's own, or on the parabola through xₖ₋₁, xₖ
      // and the guessed xₖ₊₁ (the chord's curvature error alone would cost a Newton update).
      const lastMiddle = own ? this.middles[k] : undefined;
      if (after) {
        const trend = k > 0 ? Math.min(MAX_TREND, fractions[k]! / fractions[k - 1]!) : 0;
        const [wBefore, wHere, wNext] = k > 0 ? stageWeights(fractions[k - 1]!, fractions[k]!) : [0, 1 - GAMMA, GAMMA];
        const xBefore = this.states[k > 0 ? k - 1 : 0]!;
        for (let i = 0; i < n; i++) {
          const d = x[i]! - before[i]!;
          const drift = trend * (d - deviation[i]!);
          this.xNext[i] = after[i]! + d + drift;
          this.xMiddle[i] = lastMiddle ? lastMiddle[i]! + d + GAMMA * drift : wBefore * xBefore[i]! + wHere * x[i]! + wNext * this.xNext[i]!;
          deviation[i] = d;
        }
      } else {
        this.xNext.set(x);
        this.xMiddle.set(x);
      }
      // A predictor moved by a deviation that is a jump (a source's edge landing on the other side
      // of a point than in the run it came from: 6 V on a ±3 V square) can start Newton past a
      // diode's knee; it starts again from this step's start.
      if (!this.tryToSolve(this.xMiddle, after)) {
        this.xMiddle.set(x);
        this.xNext.set(x);
        this.solve(this.xMiddle, k, N);
      }
      this.middles[k]!.set(this.xMiddle);
      middle!.at(this.xMiddle);
      this.chargeAndRate(this.xMiddle, middle!, this.qMiddle, this.rateMiddle);
      // Stage 2: BDF2 through t, t + γh and t + h.
      for (let i = 0; i < n; i++) history[i] = a * (STAGE_NOW * this.qMiddle[i]! - STAGE_BEFORE * this.qHere[i]!);
      solver.loadSources(start.t0 + elapsed * T, 1, false);
      if (!this.tryToSolve(this.xNext, after)) {
        this.xNext.set(this.xMiddle);
        this.solve(this.xNext, k, N);
      }
      next!.at(this.xNext);
      this.chargeAndRate(this.xNext, next!, this.qNext, this.rateNext);
      if (sx) this.propagate(sx, columns, a, h, fractions[k]!, here as Linearisation, middle as Linearisation, next as Linearisation);
      // (The predictor may be the last run's own states, about to be overwritten.)
      if (after) before.set(after);
      this.states[k + 1]!.set(this.xNext);
      // The new point becomes the start of the next step.
      [here, next] = [next, here];
      const q = this.qHere;
      this.qHere = this.qNext;
      this.qNext = q;
      const rate = this.rateHere;
      this.rateHere = this.rateNext;
      this.rateNext = rate;
    }
    return { x: this.states[N]!, sensitivity: sx ? { columns, x: sx } : undefined };
  }

  /** One solve from a predictor's guess (true when it converged); without a predictor, none is tried. */
  private tryToSolve(x: Float64Array, predicted: Float64Array | undefined): boolean {
    return predicted !== undefined && this.solver.solve(x, this.iterations).converged;
  }

  private solve(x: Float64Array, k: number, N: number): void {
    // The Jacobian is kept from stage to stage while the iteration contracts (the solver's own
    // chord rule): the inner tolerance is a hundredth of the orbit's, so the map stays smooth.
    if (!this.solver.solve(x, this.iterations).converged) {
      throw simulationError("orbit-step", `the periodic-orbit map did not converge at step ${k + 1} of ${N}`, {
        hint: "the guessed orbit is too far from a periodic solution; run the start-up longer before refining",
      });
    }
  }

  /** Factors G_x + a·C_x of a linearisation into the dense LU. */
  private factorAt(at: Linearisation, a: number): void {
    const { n, jacobian } = this;
    for (let k = 0; k < n * n; k++) jacobian[k] = at.G[k]! + a * at.C[k]!;
    if (!this.lu.factor(jacobian)) throw simulationError("orbit-singular", "the periodic-orbit map's Jacobian is singular");
  }

  /** rhs += (weightC·C_x + weightG·G_x|charged rows)·s, at a linearisation (n rows of `columns`). */
  private product(weightC: number, weightG: number, at: Linearisation, s: Float64Array, columns: number): void {
    const { n, rhs } = this;
    const charged = this.system.chargedRows;
    for (let i = 0; i < n; i++) {
      const g = charged[i] ? weightG : 0;
      const row = i * columns;
      for (let j = 0; j < n; j++) {
        const w = weightC * at.C[i * n + j]! + g * at.G[i * n + j]!;
        if (w === 0) continue;
        const from = j * columns;
        for (let c = 0; c < columns; c++) rhs[row + c] += w * s[from + c]!;
      }
    }
  }

  /**
   * One step of the variational equations: with `here` at xₖ, `middle` at x_γ, `next` at xₖ₊₁,
   *   J_γ·S_γ = (a·C_x(xₖ) − G_x(xₖ)|charged)·Sₖ − ∂R₁/∂h·f·e_T,
   *   J₊·Sₖ₊₁ = a·(c₁·C_x(x_γ)·S_γ − c₂·C_x(xₖ)·Sₖ) − ∂R₂/∂h·f·e_T.
   */
  private propagate(sx: Float64Array, columns: number, a: number, h: number, fraction: number, here: Linearisation, middle: Linearisation, next: Linearisation): void {
    const { n, rhs, sMiddle } = this;
    // Stage 1. q̇_γ = u − G·x_γ − f (its rate) equals a·(q_γ − qₖ) − q̇ₖ at the solution.
    this.factorAt(middle, a);
    rhs.fill(0);
    this.product(a, -1, here, sx, columns);
    for (let i = 0; i < n; i++) rhs[i * columns + n] += ((this.rateMiddle[i]! + this.rateHere[i]!) / h) * fraction;
    this.lu.solveColumns(rhs, sMiddle, columns);
    // Stage 2.
    this.factorAt(next, a);
    rhs.fill(0);
    this.product(a * STAGE_NOW, 0, middle, sMiddle, columns);
    this.product(-a * STAGE_BEFORE, 0, here, sx, columns);
    for (let i = 0; i < n; i++) rhs[i * columns + n] += (this.rateNext[i]! / h) * fraction;
    this.lu.solveColumns(rhs, sx, columns);
  }
}

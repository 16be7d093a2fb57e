import type { NonlinearTerm } from "../devices/device.js";
import { IterateLoad } from "./iterate-load.js";
import { NewtonMatrix, type NewtonMatrixState } from "./newton-matrix.js";
import { SourceVector } from "./source-vector.js";
import type { MnaSystem } from "./system.js";
import { absoluteTolerances, type Tolerances } from "./tolerances.js";

/** Largest scaled update (in tolerances) after which the next iteration may reuse the Jacobian. */
const CHORD_NEAR = 1e3;

/** Outcome of one Newton solve; `worst` is the unknown with the largest scaled update. */
export interface NewtonOutcome {
  converged: boolean;
  iterations: number;
  worst: number;
}

/** What a snapshot keeps of the Newton core (the stopping rule's memory and the matrix). */
export interface NewtonState {
  readonly contraction: number;
  readonly iterations: number;
  readonly reference: Float64Array;
  readonly matrix: NewtonMatrixState;
}

/**
 * The Newton–Raphson iteration shared by the bias point and the transient. It solves
 *   G·x + f(x) + a·(C·x + q(x)) − history − u = 0
 * in update form, where `a` is per row (0 at DC, 1/h backward Euler, 2/h trapezoidal); the
 * matrix and its reuse live in `NewtonMatrix`, the excitation in `SourceVector`, the devices'
 * contributions arrive through `IterateLoad`.
 */
export class NewtonSolver {
  readonly system: MnaSystem;
  readonly tolerances: Tolerances;
  readonly n: number;
  /** Charge history per row (a·qₙ + β·q̇ₙ), set by the integrator before a solve. */
  readonly history: Float64Array;
  /** Nonlinear charges per row at the last iterate. */
  readonly qNonlinear: Float64Array;
  /**
   * Magnitude each unknown's update is judged against besides its own value: the transient
   * sets it to the running peaks, the scale its truncation error is judged on (0 at the bias point).
   */
  readonly reference: Float64Array;
  iterations = 0;

  private readonly matrix: NewtonMatrix;
  private readonly sources: SourceVector;
  private readonly residual: Float64Array;
  private readonly update: Float64Array;
  /** Per unknown, the update rounding alone can cause (see `withinRounding`). */
  private readonly floor: Float64Array;
  private readonly load: IterateLoad;
  /** Absolute floor of each unknown's update, by its quantity. */
  private readonly tol: Float64Array;
  private readonly linear: boolean;
  /** The nonlinear devices with a step-limiting hook. */
  private readonly limiters: readonly NonlinearTerm[];
  /** The nonlinear devices that check their tangents over an update. */
  private readonly tangentCheckers: readonly NonlinearTerm[];
  /** Whether every nonlinear device checks its tangents (then a first update may be judged by the last solve's contraction). */
  private readonly checkable: boolean;
  /** The time of the next solve (set by `loadSources`), handed to time-dependent devices. */
  // NaN, then 0 in the constructor: a double field from the start (see TransientStepper.t).
  private time = NaN;
  /** The contraction factor the last iterations showed, for the stopping rule. */
  private contraction = 0.5;
  /**
   * `bias`: the iteration starts far from the solution, so a stale Jacobian is kept only near it
   * (`CHORD_NEAR`), and it stops when the update is within `biasRelative`. `step`: a time step
   * starts from a prediction; a stale Jacobian is refreshed only when the iteration stops
   * contracting, and an iterate is accepted once its predicted remaining error is within
   * `newtonRelative` (a tenth of the truncation-error tolerance).
   */
  private mode: "bias" | "step" = "bias";
  private chordLimit = NaN;
  private relative: number;

  constructor(system: MnaSystem, tolerances: Tolerances) {
    this.time = 0;
    this.chordLimit = CHORD_NEAR;
    const n = system.n;
    this.system = system;
    this.tolerances = tolerances;
    this.n = n;
    this.history = new Float64Array(n);
    this.qNonlinear = new Float64Array(n);
    this.reference = new Float64Array(n);
    this.matrix = new NewtonMatrix(system);
    this.sources = new SourceVector(n, system.sources);
    this.residual = new Float64Array(n);
    this.update = new Float64Array(n);
    this.floor = new Float64Array(n);
    this.tol = absoluteTolerances(system.unknowns, tolerances, "newton");
    this.relative = tolerances.biasRelative;
    this.linear = system.nonlinear.length === 0;
    this.limiters = system.nonlinear.filter((d) => d.limitStep !== undefined);
    this.tangentCheckers = system.nonlinear.filter((d) => d.tangentHolds !== undefined);
    this.checkable = this.tangentCheckers.length === system.nonlinear.length;
    this.load = new IterateLoad(this.residual, this.matrix.a, this.qNonlinear, this.matrix.devices);
  }

  /** Integration coefficient per row. */
  get a(): Float64Array {
    return this.matrix.a;
  }

  /** Excitation per row, set by `loadSources`. */
  get u(): Float64Array {
    return this.sources.u;
  }

  get factorizations(): number {
    return this.matrix.factorizations;
  }

  /** Conductance to ground added on every node row (gmin stepping); `invalidate` after changing it. */
  get gmin(): number {
    return this.matrix.gmin;
  }

  set gmin(value: number) {
    this.matrix.gmin = value;
  }

  /** Selects the bias-point or the time-step iteration (see `mode`). */
  setMode(mode: "bias" | "step"): void {
    this.mode = mode;
    this.chordLimit = mode === "bias" ? CHORD_NEAR : Infinity;
    this.relative = mode === "bias" ? this.tolerances.biasRelative : this.tolerances.newtonRelative;
  }

  /** Sets the per-row integration coefficients; the matrix is rebuilt when they change. */
  setCoefficients(uniform: number, stiff: number): void {
    this.matrix.setCoefficients(uniform, stiff);
  }

  /** Forgets the assembled matrix and its factorisation (coefficients or gmin changed). */
  invalidate(): void {
    this.matrix.invalidate();
  }

  /** Asks for a fresh Jacobian at the next iteration. */
  refreshJacobian(): void {
    this.matrix.refresh();
  }

  /** Fills `u` with every source's value at `t`, scaled by `scale`; `t` is also the time devices are loaded at. */
  loadSources(t: number, scale: number, left: boolean): void {
    this.time = t;
    this.sources.load(t, scale, left);
  }

  private loadDevices(x: Float64Array): void {
    const load = this.load;
    if (load.charged) this.qNonlinear.fill(0);
    this.matrix.devices.clear();
    const devices = this.system.nonlinear;
    const t = this.time;
    for (let d = 0; d < devices.length; d++) devices[d]!.load(x, load, t);
  }

  /** The devices' nonlinear charges at `x` into `qNonlinear` (for a run that starts from a given state). */
  chargesAt(x: Float64Array): void {
    this.residual.fill(0);
    if (!this.linear) this.loadDevices(x);
  }

  // One outcome object, reused: a solve runs every time step and must not allocate.
  private readonly outcome: NewtonOutcome = { converged: false, iterations: 0, worst: 0 };

  private finish(converged: boolean, iterations: number, worst: number): NewtonOutcome {
    const o = this.outcome;
    o.converged = converged;
    o.iterations = iterations;
    o.worst = worst;
    return o;
  }

  /**
   * Solves for x (guess in, solution out) at the coefficients, history and sources already
   * set. Throws OnsetError only for a singular matrix; non-convergence is reported in the outcome.
   */
  solve(x: Float64Array, maxIterations: number): NewtonOutcome {
    const { n, residual: r, update: dx, matrix } = this;
    matrix.prepare();
    let previousNorm = Infinity;
    let worst = 0;
    let floorKnown = false;
    for (let iter = 1; iter <= maxIterations; iter++) {
      this.iterations++;
      matrix.linearResidual(x, this.history, this.sources.u, r);
      if (!this.linear) this.loadDevices(x);
      const rebuild = matrix.stale(!this.linear);
      if (rebuild) matrix.factor();
      matrix.solveNegated(r, dx);
      if (this.linear) {
        // One solve is exact for a linear system: x ← x − M⁻¹·r.
        for (let i = 0; i < n; i++) x[i] += dx[i]!;
        return this.finish(true, iter, worst);
      }
      let lambda = 1;
      const limiters = this.limiters;
      for (let d = 0; d < limiters.length; d++) {
        const l = limiters[d]!.limitStep!(x, dx);
        if (l < lambda) lambda = l;
      }
      let trusted = lambda === 1;
      const checkers = this.tangentCheckers;
      for (let d = 0; trusted && d < checkers.length; d++) trusted = checkers[d]!.tangentHolds!(x, dx);
      let norm = 0;
      const relative = this.relative;
      const tol = this.tol;
      const reference = this.reference;
      for (let i = 0; i < n; i++) {
        const step = lambda * dx[i]!;
        const xi = x[i]!;
        const next = xi + step;
        x[i] = next;
        const scale = relative * Math.max(Math.abs(xi), Math.abs(next), reference[i]!) + tol[i]!;
        const ratio = Math.abs(step) / scale;
        if (ratio > norm) {
          norm = ratio;
          worst = i;
        }
      }
      // Stopping rule of simplified Newton (Hairer & Wanner, Solving ODEs II, §IV.8): with the
      // contraction ρ = ‖Δₖ‖/‖Δₖ₋₁‖ (or the last solve's), the error left after this update is
      // about ρ/(1 − ρ)·‖Δₖ‖, so the iterate is accepted once that is within tolerance. No iterate is
      // accepted on an update a device does not trust (its tangents moved); and the last solve's
      // ρ stands for the first update only when every device can vouch for its tangents.
      if (trusted) {
        const rho = iter > 1 ? norm / previousNorm : this.contraction;
        if (iter > 1 && rho < 1) this.contraction = Math.max(1e-3, rho);
        if (norm <= 1 || (this.mode === "step" && rho < 1 && (rho / (1 - rho)) * norm <= 1 && (iter > 1 || (norm <= 100 && this.checkable)))) {
          // The charges were loaded before the last update; the integrator's history needs them at the solution.
          if (this.load.charged) this.loadDevices(x);
          return this.finish(true, iter, worst);
        }
      }
      if (!Number.isFinite(norm)) return this.finish(false, iter, worst);
      // An update that stopped shrinking may be rounding noise: at tiny steps the residual's
      // rounding error, mapped through the matrix, can exceed a tight absolute tolerance, and
      // cutting the step only makes it larger. Such an iterate is as converged as arithmetic allows.
      if (trusted && iter > 1 && norm > 0.3 * previousNorm) {
        if (!floorKnown) this.matrix.roundingFloor(x, this.history, this.sources.u, this.floor);
        floorKnown = true;
        if (this.withinRounding(x, dx, lambda)) {
          if (this.load.charged) this.loadDevices(x);
          return this.finish(true, iter, worst);
        }
      }
      // Keep a stale Jacobian (a chord iteration) only close to the solution and while it
      // contracts well; after a large update the linearisation is refreshed.
      if (norm > this.chordLimit || !trusted || (!rebuild && iter > 1 && norm > 0.3 * previousNorm)) matrix.refresh();
      previousNorm = norm;
    }
    return this.finish(false, maxIterations, worst);
  }

  /**
   * Whether the last update (λ·dx, already applied to x) is within the tolerance widened by each
   * unknown's rounding floor (newton-matrix.ts), computed once per solve: a stalled iteration's
   * iterates differ by rounding only.
   */
  private withinRounding(x: Float64Array, dx: Float64Array, lambda: number): boolean {
    const { n, floor, tol, reference, relative } = this;
    for (let i = 0; i < n; i++) {
      const step = lambda * dx[i]!;
      const next = x[i]!;
      const scale = relative * Math.max(Math.abs(next - step), Math.abs(next), reference[i]!) + tol[i]! + floor[i]!;
      if (!(Math.abs(step) <= scale)) return false;
    }
    return true;
  }

  /** The iteration's memory and the matrix, for a snapshot of a run. */
  state(): NewtonState {
    return { contraction: this.contraction, iterations: this.iterations, reference: Float64Array.from(this.reference), matrix: this.matrix.state() };
  }

  /** Continues from a snapshot taken in step mode. */
  restore(state: NewtonState): void {
    this.contraction = state.contraction;
    this.iterations = state.iterations;
    this.reference.set(state.reference);
    this.matrix.restore(state.matrix);
    this.setMode("step");
  }
}

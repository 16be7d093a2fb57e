import { simulationError } from "../circuit/diagnostic.js";
import type { NonlinearTerm } from "../devices/device.js";
import { compileResidual, type ResidualProduct } from "./compiled-residual.js";
import { DeviceJacobian } from "./device-jacobian.js";
import { IterateLoad } from "./iterate-load.js";
import { LuSolver } from "./lu.js";
import type { MnaSystem } from "./system.js";
import type { Tolerances } from "./tolerances.js";

/** Largest scaled update (in tolerances) after which the next iteration may reuse the Jacobian. */
const CHORD_NEAR = 1e3;
/**
 * A factorisation is reused while no device entry of the matrix has moved by more than this
 * fraction of the entry; the chord iteration then contracts about as fast.
 */
const STALE_ENTRY = 0.25;
/** Entry changes below this fraction of their row's largest constant entry are ignored. */
const ENTRY_FLOOR = 1e-9;

/** The entries G + a·C + gmin can have: those of G and C, and every diagonal. */
function linearPatternOf(system: MnaSystem): Uint8Array {
  const n = system.n;
  const pattern = new Uint8Array(n * n);
  for (let k = 0; k < n * n; k++) if (system.G[k] !== 0 || system.C[k] !== 0) pattern[k] = 1;
  for (let i = 0; i < n; i++) pattern[i * n + i] = 1;
  return pattern;
}

/** Outcome of one Newton solve; `worst` is the unknown with the largest scaled update. */
export interface NewtonOutcome {
  converged: boolean;
  iterations: number;
  worst: number;
}

/**
 * The mutable core shared by the bias point and the transient: it owns the matrix, its LU,
 * and the scratch vectors, and solves
 *   G·x + f(x) + a·(C·x + q(x)) − history − u = 0
 * by Newton–Raphson in update form, where `a` is per row (0 at DC, 1/h backward Euler, 2/h
 * trapezoidal). The factorisation is kept while the matrix is unchanged and the iteration
 * contracts well (a chord iteration on a stale Jacobian converges to the same solution,
 * because the residual is always exact).
 */
export class NewtonSolver {
  readonly system: MnaSystem;
  readonly tolerances: Tolerances;
  readonly n: number;
  /** Integration coefficient per row. */
  readonly a: Float64Array;
  /** Charge history per row (a·qₙ + β·q̇ₙ), set by the integrator before a solve. */
  readonly history: Float64Array;
  /** Excitation per row, set by `loadSources`. */
  readonly u: Float64Array;
  /** Nonlinear charges per row at the last iterate. */
  readonly qNonlinear: Float64Array;
  /**
   * Magnitude each unknown's update is judged against besides its own value: the transient
   * sets it to the running peaks, the scale its truncation error is judged on (0 at the bias point).
   */
  readonly reference: Float64Array;
  /** Conductance to ground added on every node row (gmin stepping). */
  gmin = 0;
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
  private chordLimit = CHORD_NEAR;
  private relative: number;

  /** Selects the bias-point or the time-step iteration (see `mode`). */
  setMode(mode: "bias" | "step"): void {
    this.mode = mode;
    this.chordLimit = mode === "bias" ? CHORD_NEAR : Infinity;
    this.relative = mode === "bias" ? this.tolerances.biasRelative : this.tolerances.newtonRelative;
  }
  factorizations = 0;
  iterations = 0;

  private readonly matrix: Float64Array;
  private readonly base: Float64Array;
  private readonly lu: LuSolver;
  private readonly residual: Float64Array;
  private readonly update: Float64Array;
  private readonly load: IterateLoad;
  private readonly deviceJacobian: DeviceJacobian;
  /** Per row: changes of a device entry below this never force a new factorisation. */
  private readonly entryFloor: Float64Array;
  private readonly tol: Float64Array;
  private baseValid = false;
  private luValid = false;
  private readonly linear: boolean;
  /** The nonlinear devices with a step-limiting hook, and those that check their tangents. */
  private readonly limiters: readonly NonlinearTerm[];
  private readonly tangentCheckers: readonly NonlinearTerm[];

  constructor(system: MnaSystem, tolerances: Tolerances) {
    const n = system.n;
    this.system = system;
    this.tolerances = tolerances;
    this.n = n;
    this.a = new Float64Array(n);
    this.history = new Float64Array(n);
    this.u = new Float64Array(n);
    this.qNonlinear = new Float64Array(n);
    this.reference = new Float64Array(n);
    this.quietAfter = Float64Array.from(system.sources, (s) => s.quietAfter ?? Infinity);
    this.matrix = new Float64Array(n * n);
    this.base = new Float64Array(n * n);
    this.lu = new LuSolver(n);
    this.residual = new Float64Array(n);
    this.update = new Float64Array(n);
    this.tol = new Float64Array(n);
    this.relative = tolerances.biasRelative;
    this.baseRowStart = new Int32Array(n + 1);
    this.linear = system.nonlinear.length === 0;
    this.limiters = system.nonlinear.filter((d) => d.limitStep !== undefined);
    this.tangentCheckers = system.nonlinear.filter((d) => d.tangentHolds !== undefined);
    system.unknowns.forEach((u, i) => {
      this.tol[i] = u.kind === "current" ? tolerances.newtonCurrent : tolerances.newtonVoltage;
    });
    this.entryFloor = new Float64Array(n);
    this.linearPattern = linearPatternOf(system);
    this.residualProduct = compileResidual(n, this.linearPattern);
    this.deviceJacobian = new DeviceJacobian(n);
    this.load = new IterateLoad(this.residual, this.a, this.qNonlinear, this.deviceJacobian);
  }

  private lastUniform = Number.NaN;
  private lastBackwardEuler = Number.NaN;

  /** Sets the per-row integration coefficients; the matrix is rebuilt when they change. */
  setCoefficients(uniform: number, backwardEuler: number): void {
    if (uniform === this.lastUniform && backwardEuler === this.lastBackwardEuler) return;
    this.lastUniform = uniform;
    this.lastBackwardEuler = backwardEuler;
    const rows = this.system.backwardEulerRows;
    let changed = false;
    for (let i = 0; i < this.n; i++) {
      const value = rows[i] ? backwardEuler : uniform;
      if (this.a[i] !== value) {
        this.a[i] = value;
        changed = true;
      }
    }
    if (changed) this.invalidate();
  }

  /** Forgets the assembled matrix and its factorisation (coefficients or gmin changed). */
  invalidate(): void {
    this.baseValid = false;
    this.luValid = false;
    this.lastUniform = Number.NaN;
  }

  /** Asks for a fresh Jacobian at the next iteration. */
  refreshJacobian(): void {
    this.luValid = false;
  }

  /** Per source: after this time it adds nothing. */
  private readonly quietAfter: Float64Array;
  /** Whether `u` holds zeros (set when every source was silent). */
  private uZero = false;

  /** The time of the next solve (set by `loadSources`), handed to time-dependent devices. */
  private time = 0;

  /** Fills `u` with every source's value at `t`, scaled by `scale`. */
  loadSources(t: number, scale: number, left: boolean): void {
    this.time = t;
    const sources = this.system.sources;
    const quietAfter = this.quietAfter;
    const u = this.u;
    let active = false;
    for (let k = 0; k < sources.length; k++) {
      if (!(t > quietAfter[k]!)) {
        active = true;
        break;
      }
    }
    if (!active) {
      // Every source is silent: u is zero, and stays so without refilling it at each step.
      if (!this.uZero) u.fill(0);
      this.uZero = true;
      return;
    }
    for (let i = 0; i < u.length; i++) u[i] = 0;
    for (let k = 0; k < sources.length; k++) sources[k]!.addSource(t, scale, u, left);
    this.uZero = false;
  }

  private assembleBase(): void {
    const { n, system, base, a } = this;
    const { G, C } = system;
    for (let i = 0; i < n; i++) {
      const ai = a[i]!;
      const row = i * n;
      for (let j = 0; j < n; j++) base[row + j] = G[row + j]! + ai * C[row + j]!;
    }
    if (this.gmin > 0) {
      system.unknowns.forEach((u, i) => {
        if (u.isNode) base[i * n + i] += this.gmin;
      });
    }
    for (let i = 0; i < n; i++) {
      let largest = 0;
      for (let j = 0; j < n; j++) largest = Math.max(largest, Math.abs(base[i * n + j]!));
      this.entryFloor[i] = ENTRY_FLOOR * largest;
    }
    this.baseValid = true;
    if (this.residualProduct) return;
    // The nonzeros of the assembled matrix, row by row, for the residual product.
    let count = 0;
    for (let k = 0; k < n * n; k++) if (base[k] !== 0) count++;
    if (this.baseCols.length < count) {
      this.baseCols = new Int32Array(count);
      this.baseValues = new Float64Array(count);
    }
    let k = 0;
    for (let i = 0; i < n; i++) {
      this.baseRowStart[i] = k;
      for (let j = 0; j < n; j++) {
        const v = base[i * n + j]!;
        if (v === 0) continue;
        this.baseCols[k] = j;
        this.baseValues[k++] = v;
      }
    }
    this.baseRowStart[n] = k;
  }

  /** The product over the pattern of G, C and the node diagonals, generated once per circuit. */
  private readonly residualProduct: ResidualProduct | undefined;
  // Compressed rows of the assembled G + a·C (+ gmin), rebuilt with it (when not generated).
  private baseRowStart: Int32Array;
  private baseCols = new Int32Array(0);
  private baseValues = new Float64Array(0);

  /** r = (G + a·C + gmin)·x − history − u (the linear part of the residual). */
  private linearResidual(x: Float64Array): void {
    if (this.residualProduct) {
      this.residualProduct(this.base, x, this.history, this.u, this.residual);
      return;
    }
    const { n, residual: r, history, u, baseRowStart: start, baseCols: cols, baseValues: values } = this;
    for (let i = 0; i < n; i++) {
      let sum = -history[i]! - u[i]!;
      const end = start[i + 1]!;
      for (let k = start[i]!; k < end; k++) sum += values[k]! * x[cols[k]!]!;
      r[i] = sum;
    }
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

  private loadDevices(x: Float64Array): void {
    const load = this.load;
    if (this.load.charged) this.qNonlinear.fill(0);
    this.deviceJacobian.clear();
    const devices = this.system.nonlinear;
    const t = this.time;
    for (let d = 0; d < devices.length; d++) devices[d]!.load(x, load, t);
  }

  /** Device entries already in the pattern handed to the LU (-1: none handed yet). */
  private patternEntries = -1;

  /** The entries G + a·C + gmin can have. */
  private readonly linearPattern: Uint8Array;

  /** The entries that can ever be nonzero: the linear pattern and the device entries. */
  private updatePattern(): void {
    const pattern = Uint8Array.from(this.linearPattern);
    this.deviceJacobian.markInto(pattern);
    this.lu.setPattern(pattern);
    this.patternEntries = this.deviceJacobian.entryCount;
  }

  private factor(): void {
    if (this.deviceJacobian.entryCount !== this.patternEntries) this.updatePattern();
    this.deviceJacobian.assemble(this.base, this.matrix);
    if (!this.lu.factor(this.matrix)) {
      const label = this.system.unknowns[this.lu.singularColumn]?.label ?? "?";
      throw simulationError("singular-matrix", `the circuit equations are singular at unknown '${label}'`, {
        hint: "a node may be floating, or ideal sources/inductors may form a loop; check the parts at that node",
      });
    }
    this.factorizations++;
    this.luValid = true;
  }

  /**
   * Solves for x (guess in, solution out) at the coefficients, history and sources already
   * set. Throws OnsetError only for a singular matrix; non-convergence is reported in the outcome.
   */
  solve(x: Float64Array, maxIterations: number): NewtonOutcome {
    const { n, residual: r, update: dx } = this;
    if (!this.baseValid) this.assembleBase();
    let previousNorm = Infinity;
    let worst = 0;
    for (let iter = 1; iter <= maxIterations; iter++) {
      this.iterations++;
      this.linearResidual(x);
      if (!this.linear) this.loadDevices(x);
      const rebuild = !this.luValid || (!this.linear && this.deviceJacobian.moved(this.base, STALE_ENTRY, this.entryFloor));
      if (rebuild) this.factor();
      this.lu.solveNegated(r, dx);
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
      // about ρ/(1 − ρ)·‖Δₖ‖, so the iterate is accepted once that is within tolerance.
      if (trusted) {
        const rho = iter > 1 ? norm / previousNorm : this.contraction;
        if (iter > 1 && rho < 1) this.contraction = Math.max(1e-3, rho);
        if (norm <= 1 || (this.mode === "step" && rho < 1 && (iter > 1 || norm <= 100) && (rho / (1 - rho)) * norm <= 1)) return this.finish(true, iter, worst);
      }
      if (!Number.isFinite(norm)) return this.finish(false, iter, worst);
      // Keep a stale Jacobian (a chord iteration) only close to the solution and while it
      // contracts well; after a large update the linearisation is refreshed.
      if (norm > this.chordLimit || !trusted || (!rebuild && iter > 1 && norm > 0.3 * previousNorm)) this.luValid = false;
      previousNorm = norm;
    }
    return this.finish(false, maxIterations, worst);
  }
}

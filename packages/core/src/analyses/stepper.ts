import { isOnsetError, simulationError, type OnsetError } from "../circuit/diagnostic.js";
import { NewtonSolver, type NewtonOutcome, type NewtonState } from "../solver/newton.js";
import type { MnaSystem } from "../solver/system.js";
import { absoluteTolerances, resolveTolerances, type Tolerances } from "../solver/tolerances.js";
import { solveBias, type BiasPoint } from "./bias.js";
import { IntegrationState, type IntegrationMemory } from "./integration-state.js";
import { StepHistory, type StepHistoryState } from "./step-history.js";
import { doublingRatio, secondOrderRatio, type ErrorScale } from "./truncation-error.js";

/** A state of the circuit: every unknown at one time. A run may start from one. */
export interface CircuitState {
  readonly t: number;
  /** The unknowns in the system's order (see `MnaSystem.unknowns`). */
  readonly x: Float64Array;
}

/**
 * A state taken at an accepted step together with everything the stepper and its Newton core
 * carry forward (history, step size, running peaks, the factorisation in use), so that a run
 * started from it continues exactly, bit for bit, as the original would have.
 */
export interface StepperSnapshot extends CircuitState {
  readonly continuation: Continuation;
}

/** The second half of a checked first step, solved but not yet accepted. */
interface PendingHalf {
  readonly target: number;
  readonly step: number;
  readonly landing: boolean;
  readonly x: Float64Array;
  readonly qNonlinear: Float64Array;
}

export interface Continuation {
  readonly memory: IntegrationMemory;
  readonly peak: Float64Array;
  readonly h: number;
  readonly segment: readonly [start: number, step: number, count: number];
  readonly firstOrderNext: boolean;
  readonly nextBreak: number;
  readonly pending: PendingHalf | undefined;
  readonly history: StepHistoryState;
  readonly stats: StepperStats;
  readonly solver: NewtonState;
}

/** How a {@link TransientStepper} starts and steps: the starting state, the largest and first step, the tolerances. */
export interface StepperSettings {
  /**
   * Begin at the DC operating point, from rest (capacitors and inductors at `initial`), from a
   * given state (a checked first-order step first, like after a breakpoint), or from a snapshot
   * (continuing exactly).
   */
  readonly start: "bias" | "rest" | CircuitState | StepperSnapshot;
  /** Largest step (s). */
  readonly maxStep: number;
  /** First step (s); defaults to maxStep/100. */
  readonly firstStep?: number;
  readonly tolerances?: Partial<Tolerances>;
}

/** What a time-domain run cost: accepted and rejected steps, Newton iterations and failures, factorisations, breakpoints landed on. */
export interface StepperStats {
  accepted: number;
  rejected: number;
  /** Steps cut because Newton did not converge (also counted in `rejected`). */
  newtonFailures: number;
  newtonIterations: number;
  factorizations: number;
  breakpoints: number;
}

/** Called after every accepted point with the time, the unknowns and their rates. */
export type StepObserver = (t: number, x: Float64Array, dxdt: Float64Array) => void;

/** Error ratios up to this leave the step factor 0.9·ratio^(−1/3) ≥ 1 (0.9³). */
const GROWTH_SURE = 0.729;

/**
 * Largest ratio of a step to the one before it while BDF2 rows are integrated: variable-step
 * BDF2 is zero-stable only for ratios below 1 + √2 (Grigorieff 1983; docs/references.md §7).
 */
const BDF2_GROWTH = 2;

/** The step factor 0.9·(1/ratio)^(1/(p+1)) for a step of order p, within [0.2, 2]. */
function stepFactor(ratio: number, order: 1 | 2): number {
  if (ratio <= 0) return 2;
  const root = order === 1 ? Math.sqrt(ratio) : Math.cbrt(ratio);
  return Math.min(2, Math.max(0.2, 0.9 / root));
}

/**
 * The transient integrator. Between breakpoints the trapezoidal rule integrates every row but
 * the stiff ones (an op-amp's pole node), which take the variable-step BDF2 formula: both are
 * second order, and BDF2 is also L-stable, so a closed-loop pole far faster than the step is
 * damped instead of ringing (the trapezoidal rule is A-stable but not L-stable). The first step,
 * and the first after each breakpoint (source corners are landed on exactly), is taken by
 * backward Euler as one step of h and two of h/2, whose difference checks it; the two halves are
 * kept. Every unknown some charge depends on is under local-truncation-error control, judged
 * against reltol·(its running peak) + abstol, and h_new = h·clamp(0.9·(tol/LTE)^(1/3), 0.2, 2)
 * (Hairer, Nørsett & Wanner, *Solving ODEs I*, §II.4; docs/references.md §7).
 * It advances on request, so an analysis can run in stages (`advance(t1)`, then `advance(t2)`).
 */
export class TransientStepper {
  readonly system: MnaSystem;
  readonly solver: NewtonSolver;
  readonly tolerances: Tolerances;
  readonly stats: StepperStats = { accepted: 0, rejected: 0, newtonFailures: 0, newtonIterations: 0, factorizations: 0, breakpoints: 0 };
  readonly bias: BiasPoint | undefined;
  /**
   * Current time and unknowns (read-only for observers). The time fields start as NaN and are
   * zeroed in the constructor: a double first makes them double fields, where a 0 would make
   * them small integers and the first fractional time would change the stepper's shape and
   * throw away the optimised code of every method that had seen it.
   */
  t = NaN;
  readonly x: Float64Array;
  readonly dxdt: Float64Array;

  private readonly n: number;
  private readonly maxStep: number;
  /** The step the next attempt starts from. */
  private h: number;
  /** Unknowns, charges and their rates at the current point. */
  private readonly state: IntegrationState;
  /** Time points of a run of equal steps are segmentStart + k·segmentStep, so they do not drift. */
  private segmentStart = NaN;
  private segmentStep = NaN;
  private segmentCount = NaN;
  /** The next step is the checked first-order start (the first, and the first after a breakpoint). */
  private firstOrderNext = true;
  private pending: PendingHalf | undefined;
  private readonly xNew: Float64Array;
  private readonly peak: Float64Array;
  private readonly scale: ErrorScale;
  private readonly history: StepHistory;
  // Scratch of the checked first step: the whole step, the first half and its charges.
  private readonly xWhole: Float64Array;
  private readonly xHalf: Float64Array;
  private readonly qHalf: Float64Array;
  private readonly qMiddle: Float64Array;
  private nextBreak = Infinity;
  private readonly observers: StepObserver[] = [];
  /** The singular matrix that stopped the last Newton solve of a step, if one did (see `solveStep`). */
  private singular: OnsetError | undefined;

  constructor(system: MnaSystem, settings: StepperSettings) {
    this.t = this.segmentStart = this.segmentStep = this.segmentCount = 0;
    this.system = system;
    const n = system.n;
    this.n = n;
    this.tolerances = resolveTolerances(settings.tolerances);
    this.solver = new NewtonSolver(system, this.tolerances);
    if (!(settings.maxStep > 0)) throw simulationError("bad-step", `maximum step must be positive, got ${settings.maxStep}`);
    this.maxStep = settings.maxStep;
    this.h = Math.min(settings.firstStep ?? settings.maxStep / 100, settings.maxStep);
    this.state = new IntegrationState(system);
    this.x = this.state.x;
    this.dxdt = this.state.dxdt;
    this.xNew = new Float64Array(n);
    this.peak = new Float64Array(n);
    this.xWhole = new Float64Array(n);
    this.xHalf = new Float64Array(n);
    this.qHalf = new Float64Array(n);
    this.qMiddle = new Float64Array(n);
    this.scale = { relative: this.tolerances.lteRelative, peak: this.peak, absolute: absoluteTolerances(system.unknowns, this.tolerances, "lte") };
    this.history = new StepHistory(n);
    const start = settings.start;
    this.bias = undefined;
    if (typeof start === "object" && "continuation" in start) {
      this.resume(start);
      return;
    }
    if (start === "bias") {
      this.bias = solveBias(system, this.solver, this.tolerances);
      this.x.set(this.bias.x);
      this.state.chargesAt(this.x, this.solver.qNonlinear, this.state.q);
    } else if (start === "rest") {
      for (const d of system.devices) {
        d.initialCharge?.(this.state.q);
        d.restingState?.(this.x);
      }
      this.consistentStart();
    } else {
      if (start.x.length !== n) throw simulationError("bad-state", `the start state has ${start.x.length} unknowns; the circuit has ${n}`);
      this.t = start.t;
      this.x.set(start.x);
      this.solver.setCoefficients(0, 0);
      this.solver.chargesAt(this.x);
      this.state.chargesAt(this.x, this.solver.qNonlinear, this.state.q);
    }
    this.history.push(this.t, this.x);
    for (let i = 0; i < n; i++) this.peak[i] = Math.abs(this.x[i]!);
    this.solver.reference.set(this.peak);
    this.solver.setMode("step");
    this.nextBreak = this.findBreakpoint(this.t);
    this.segmentStart = this.t;
    this.collectSolverCounts();
  }

  /**
   * The state at the last accepted step with everything needed to continue from it exactly;
   * call it between `advance` calls or from an observer.
   */
  snapshot(): StepperSnapshot {
    const copy = (v: Float64Array) => Float64Array.from(v);
    const pending = this.pending && { ...this.pending, x: copy(this.pending.x), qNonlinear: copy(this.pending.qNonlinear) };
    return {
      t: this.t,
      x: copy(this.x),
      continuation: {
        memory: this.state.memory(),
        peak: copy(this.peak),
        h: this.h,
        segment: [this.segmentStart, this.segmentStep, this.segmentCount],
        firstOrderNext: this.firstOrderNext,
        nextBreak: this.nextBreak,
        pending,
        history: this.history.state(),
        stats: { ...this.stats },
        solver: this.solver.state(),
      },
    };
  }

  private resume(snapshot: StepperSnapshot): void {
    const c = snapshot.continuation;
    if (snapshot.x.length !== this.n) throw simulationError("bad-state", `the snapshot has ${snapshot.x.length} unknowns; the circuit has ${this.n}`);
    this.t = snapshot.t;
    this.state.restore(snapshot.x, c.memory);
    this.peak.set(c.peak);
    this.h = c.h;
    [this.segmentStart, this.segmentStep, this.segmentCount] = c.segment;
    this.firstOrderNext = c.firstOrderNext;
    this.nextBreak = c.nextBreak;
    this.pending = c.pending && { ...c.pending, x: Float64Array.from(c.pending.x), qNonlinear: Float64Array.from(c.pending.qNonlinear) };
    this.history.restore(c.history);
    Object.assign(this.stats, c.stats);
    this.solver.restore(c.solver);
  }

  /** Calls `observer` now (for the start) and after every accepted step. */
  observe(observer: StepObserver): void {
    this.observers.push(observer);
    observer(this.t, this.x, this.dxdt);
  }

  /**
   * From rest the node voltages at t = 0 follow from the stored charges: a backward-Euler step
   * of negligible length fixes every state and solves the algebraic rest. It is recorded at
   * t = 0 but not used as history, and time does not advance.
   */
  private consistentStart(): void {
    const h = this.h * 1e-6;
    const s = this.solver;
    s.setCoefficients(1 / h, 1 / h);
    this.state.firstOrderHistory(s.history, this.state.q, h);
    s.loadSources(0, 1, false);
    const outcome = s.solve(this.x, this.tolerances.biasIterations);
    if (!outcome.converged) {
      this.x.fill(0);
      for (const d of this.system.devices) d.restingState?.(this.x);
    }
    s.invalidate();
  }

  /**
   * The first source corner after `after`. A corner within rounding of `after` (the same corner
   * computed another way, e.g. delay + k·period against the time landed on) is the one just
   * landed on, not a new one.
   */
  private findBreakpoint(after: number): number {
    const same = 1e-12 * Math.max(Math.abs(after), this.maxStep);
    let from = after;
    for (;;) {
      let next = Infinity;
      for (const s of this.system.sources) {
        const b = s.nextBreakpoint(from);
        if (b < next) next = b;
      }
      if (next - after > same) return next;
      from = next;
    }
  }

  /**
   * Prepares a second-order step of length h to tNew: the charge history and the Newton starting
   * guess, the quadratic through the last three accepted points extrapolated to tNew.
   */
  private prepareStep(tNew: number, h: number, omega: number): void {
    const { n, xNew, history } = this;
    this.state.secondOrderHistory(this.solver.history, this.solver.a, h, omega);
    const t0 = history.time(0);
    const t1 = history.time(1);
    const t2 = history.time(2);
    const x0 = history.value(0);
    const x1 = history.value(1);
    const x2 = history.value(2);
    // Lagrange weights of the quadratic through (t0, x0), (t1, x1), (t2, x2) at tNew.
    const w0 = ((tNew - t1) * (tNew - t2)) / ((t0 - t1) * (t0 - t2));
    const w1 = ((tNew - t0) * (tNew - t2)) / ((t1 - t0) * (t1 - t2));
    const w2 = ((tNew - t0) * (tNew - t1)) / ((t2 - t0) * (t2 - t1));
    for (let i = 0; i < n; i++) xNew[i] = w0 * x0[i]! + w1 * x1[i]! + w2 * x2[i]!;
  }

  /** The largest share of its allowed change per step any watched state makes (0: none watched). */
  private changeRatio(): number {
    const watchers = this.system.changeWatchers;
    let ratio = 0;
    for (let d = 0; d < watchers.length; d++) {
      const r = watchers[d]!.changeRatio!(this.x, this.xNew);
      if (r > ratio) ratio = r;
    }
    return ratio;
  }

  private collectSolverCounts(): void {
    this.stats.newtonIterations = this.solver.iterations;
    this.stats.factorizations = this.solver.factorizations;
  }

  /**
   * The checked first-order step from the current point to `target`: one backward-Euler step of
   * h into xWhole, two of h/2 into xHalf and xNew (the first half's nonlinear charges kept in
   * qHalf). Returns the doubling error ratio, or the failed Newton outcome.
   */
  private firstOrderTrial(target: number, h: number, landing: boolean): number | NewtonOutcome {
    const { solver, tolerances, xWhole, xHalf, xNew, state } = this;
    const q = state.q;
    const iterations = tolerances.stepIterations;
    solver.setCoefficients(1 / h, 1 / h);
    state.firstOrderHistory(solver.history, q, h);
    solver.loadSources(target, 1, landing);
    xWhole.set(this.x);
    let outcome = this.solveStep(xWhole, iterations);
    if (!outcome.converged) return outcome;
    const half = 0.5 * h;
    solver.setCoefficients(1 / half, 1 / half);
    state.firstOrderHistory(solver.history, q, half);
    solver.loadSources(this.t + half, 1, false);
    for (let i = 0; i < this.n; i++) xHalf[i] = 0.5 * (this.x[i]! + xWhole[i]!);
    outcome = this.solveStep(xHalf, iterations);
    if (!outcome.converged) return outcome;
    this.qHalf.set(solver.qNonlinear);
    state.chargesAt(xHalf, this.qHalf, this.qMiddle);
    state.firstOrderHistory(solver.history, this.qMiddle, half);
    solver.loadSources(target, 1, landing);
    xNew.set(xWhole);
    outcome = this.solveStep(xNew, iterations);
    if (!outcome.converged) return outcome;
    return doublingRatio(xNew, xWhole, this.system.stateColumns, this.scale);
  }

  /**
   * One Newton solve of a step. A matrix singular at an iterate (a junction's conductance so
   * large, far out on a trial step, that a resistor beside it is lost to rounding) fails the
   * step like a Newton that does not converge: the step is cut, and only a step below the
   * smallest allowed still meeting it ends the run, with that error.
   */
  private solveStep(x: Float64Array, iterations: number): NewtonOutcome {
    try {
      this.singular = undefined;
      return this.solver.solve(x, iterations);
    } catch (error) {
      if (!isOnsetError(error) || error.diagnostic.code !== "singular-matrix") throw error;
      this.singular = error;
      return { converged: false, iterations: 0, worst: 0 };
    }
  }

  /** A step that could not be taken: the next attempt is shorter, or the run fails below `minStep`. */
  private reject(h: number, cause: NewtonOutcome | number, minStep: number): void {
    this.stats.rejected++;
    if (typeof cause === "number") {
      this.h = h * stepFactor(cause, this.firstOrderNext ? 1 : 2);
      if (this.h < minStep) {
        this.collectSolverCounts();
        throw simulationError("step-too-small", `the time step fell below ${minStep.toExponential(1)} s at t = ${Number(this.t.toPrecision(6))} s to meet the error tolerance`, {
          hint: "a very fast edge or a stiff loop; relax the tolerance or smooth the source edges",
        });
      }
      return;
    }
    this.stats.newtonFailures++;
    this.h = h / 8;
    this.solver.refreshJacobian();
    if (this.h < minStep) {
      this.collectSolverCounts();
      if (this.singular) throw this.singular;
      const worst = this.system.unknowns[cause.worst]?.label ?? "?";
      throw simulationError(
        "newton-not-converged",
        `Newton did not converge at t = ${Number(this.t.toPrecision(6))} s after ${cause.iterations} iterations (largest change at '${worst}'); the step fell below ${minStep.toExponential(1)} s`,
        { hint: "the circuit may have a discontinuity the model cannot follow; check the parts at that node, or soften limits (op-amp knee=)" },
      );
    }
  }

  /**
   * Integrates until `tEnd`, landing on it exactly; with `land` false, in whole steps until the
   * first that reaches it, so the steps taken (and a run's waveform) do not depend on where a
   * caller chose to stop and look.
   */
  advance(tEnd: number, land = true): void {
    const { solver, tolerances } = this;
    // Both scales are bounded by what is left to run: a max-step (and so a first step) far beyond
    // it (max-step=1e30) must neither end the run before its first step nor make every step too small.
    const span = tEnd - this.t;
    const minStep = 1e-14 * Math.max(tEnd, Math.min(this.maxStep, span));
    if (this.pending) this.acceptPending();
    while (tEnd - this.t > 1e-12 * Math.min(this.h, span)) {
      const hTry = Math.min(this.h, this.maxStep);
      const fromSegment = hTry === this.segmentStep && !this.firstOrderNext;
      let target = fromSegment ? this.segmentStart + (this.segmentCount + 1) * hTry : this.t + hTry;
      let adjusted = false;
      let landing = false;
      if (this.nextBreak <= target + 1e-9 * hTry) {
        target = this.nextBreak;
        landing = true;
        adjusted = true;
      } else if (this.nextBreak - target < 0.25 * hTry) {
        // Split what is left before the corner so the last step before it is not a sliver.
        target = this.t + 0.5 * (this.nextBreak - this.t);
        adjusted = true;
      }
      if (land && target >= tEnd) {
        landing = landing && target === tEnd;
        adjusted = adjusted || target !== tEnd;
        target = tEnd;
      }
      // The nominal step keeps the coefficients (and the factorisation) bit-identical across a run.
      const h = adjusted ? target - this.t : hTry;
      if (this.firstOrderNext) {
        const trial = this.firstOrderTrial(target, h, landing);
        if (typeof trial !== "number" || trial > 1) {
          this.reject(h, trial, minStep);
          continue;
        }
        const half = 0.5 * h;
        this.accept(this.t + half, half, true, false, this.xHalf, this.qHalf);
        this.pending = { target, step: half, landing, x: this.xNew, qNonlinear: solver.qNonlinear };
        this.segmentStep = 0;
        this.h = landing ? Math.min(h, hTry) * 0.25 : this.limitGrowth(h * stepFactor(trial, 1), half);
        this.notify();
        this.acceptPending();
        continue;
      }
      const omega = h / this.state.lastStep;
      solver.setCoefficients(2 / h, IntegrationState.bdf2Coefficient(h, omega));
      this.prepareStep(target, h, omega);
      solver.loadSources(target, 1, landing);
      const outcome = this.solveStep(this.xNew, tolerances.stepIterations);
      if (!outcome.converged) {
        this.reject(h, outcome, minStep);
        continue;
      }
      const change = this.changeRatio();
      if (change > 1) {
        this.stats.rejected++;
        this.h = h * Math.max(0.2, 0.9 / change);
        if (this.h < minStep) {
          this.collectSolverCounts();
          throw simulationError("step-too-small", `the time step fell below ${minStep.toExponential(1)} s at t = ${Number(this.t.toPrecision(6))} s to follow an amplifier's output`, {
            hint: "an output that jumps between its limits faster than the solver can follow; give the op-amp a finite gbw= or slew=",
          });
        }
        continue;
      }
      const ratio = secondOrderRatio(this.history, target, this.xNew, this.system.stateColumns, this.system.stiffStates, this.scale);
      if (ratio > 1) {
        this.reject(h, ratio, minStep);
        continue;
      }
      this.accept(target, h, false, landing, this.xNew, solver.qNonlinear);
      if (fromSegment && !adjusted) {
        this.segmentCount++;
      } else {
        this.segmentStart = target;
        this.segmentStep = hTry;
        this.segmentCount = 0;
      }
      const nominal = h < hTry ? hTry : h;
      if (nominal >= this.maxStep && ratio <= GROWTH_SURE) {
        // The step would grow, but it is already the largest allowed.
        this.h = nominal;
      } else {
        let factor = ratio < 0 ? 1.5 : stepFactor(ratio, 2);
        // A watched state's change grows about in proportion to the step.
        if (change > 0) factor = Math.min(factor, Math.max(1, 0.9 / change));
        // Keep the step (and with it the factorisation) unless a change is worth it.
        if (factor > 1 && factor < 1.2) factor = 1;
        this.h = factor < 1 ? Math.min(nominal, h * factor) : nominal * factor;
      }
      this.h = landing ? Math.min(this.h, hTry) * 0.25 : this.limitGrowth(this.h, h);
      // Observers run once the next step is chosen, so a snapshot taken by one is complete.
      this.notify();
    }
    this.collectSolverCounts();
  }

  /** The next step, no more than BDF2_GROWTH times the last one when BDF2 rows are integrated. */
  private limitGrowth(next: number, last: number): number {
    return this.state.stiffRowIndex.length > 0 ? Math.min(next, BDF2_GROWTH * last) : next;
  }

  /** Accepts the second half of a checked first step (solved with the first). */
  private acceptPending(): void {
    const p = this.pending!;
    this.pending = undefined;
    this.accept(p.target, p.step, true, p.landing, p.x, p.qNonlinear);
    this.notify();
  }

  /**
   * Makes (target, xNew) the current point: charges and rates (see IntegrationState.commit), the
   * running peaks and the history.
   */
  private accept(target: number, h: number, firstOrder: boolean, landing: boolean, xNew: Float64Array, nonlinear: Float64Array): void {
    const { n, x, peak } = this;
    const reference = this.solver.reference;
    this.state.commit(xNew, nonlinear, h, firstOrder, this.solver.a, this.history.value(1));
    for (let i = 0; i < n; i++) {
      const mag = Math.abs(x[i]!);
      if (mag > peak[i]!) {
        peak[i] = mag;
        reference[i] = mag;
      }
    }
    this.history.push(target, x);
    this.t = target;
    this.stats.accepted++;
    if (landing) {
      this.stats.breakpoints++;
      this.firstOrderNext = true;
      this.nextBreak = this.findBreakpoint(this.t);
      // The history restarts at the corner: only this point is kept.
      this.history.restart();
    } else {
      this.firstOrderNext = false;
    }
  }

  private notify(): void {
    const observers = this.observers;
    for (let o = 0; o < observers.length; o++) observers[o]!(this.t, this.x, this.dxdt);
  }
}

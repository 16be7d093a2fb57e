import { simulationError } from "../circuit/diagnostic.js";
import { NewtonSolver } from "../solver/newton.js";
import type { MnaSystem } from "../solver/system.js";
import { DEFAULT_TOLERANCES, type Tolerances } from "../solver/tolerances.js";
import { solveBias, type BiasPoint } from "./bias.js";

export interface StepperSettings {
  /** Begin at the DC operating point, or from rest (capacitors and inductors at `initial`). */
  readonly start: "bias" | "rest";
  /** Largest step (s). */
  readonly maxStep: number;
  /** First step (s); defaults to maxStep/100. */
  readonly firstStep?: number;
  readonly tolerances?: Partial<Tolerances>;
}

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

const HISTORY = 4;

/** Error ratios up to this leave the step factor 0.9·ratio^(−1/(p+1)) ≥ 1 for both orders (0.9³). */
const GROWTH_SURE = 0.729;

/** (1/ratio)^(1/(p+1)) for the error ratio of a step of order p (backward Euler 1, trapezoidal 2). */
function stepRatio(ratio: number, backwardEuler: boolean): number {
  return backwardEuler ? 1 / Math.sqrt(ratio) : 1 / Math.cbrt(ratio);
}

/**
 * The transient integrator: trapezoidal companion models, backward Euler on the first step and
 * right after each breakpoint (source corners are landed on exactly), local-truncation-error
 * step control with rejection, and a maximum step. It advances on request, so an analysis can
 * run in stages (`advance(t1)`, then `advance(t2)`).
 *
 * Step control (Hairer, Nørsett & Wanner, *Solving ODEs I*, §II.4; docs/references.md §7): the LTE of
 * the trapezoidal rule is −(h³/12)·x‴ with x‴ ≈ 6·DD₃ (third divided difference over the last
 * four points), that of backward Euler −(h²/2)·x″ with x″ ≈ 2·DD₂; each state is judged against
 * reltol·(its running peak) + abstol, and h_new = h·clamp(0.9·(tol/LTE)^(1/(p+1)), 0.2, 2).
 */
export class TransientStepper {
  readonly system: MnaSystem;
  readonly solver: NewtonSolver;
  readonly tolerances: Tolerances;
  readonly stats: StepperStats = { accepted: 0, rejected: 0, newtonFailures: 0, newtonIterations: 0, factorizations: 0, breakpoints: 0 };
  readonly bias: BiasPoint | undefined;
  /** Current time and unknowns (read-only for observers). */
  t = 0;
  readonly x: Float64Array;
  readonly dxdt: Float64Array;

  private readonly n: number;
  private readonly maxStep: number;
  private h: number;
  /** Time points of a run of equal steps are segmentStart + k·segmentStep, so they do not drift. */
  private segmentStart = 0;
  private segmentStep = 0;
  private segmentCount = 0;
  private backwardEulerNext = true;
  private readonly q: Float64Array;
  private readonly qdot: Float64Array;
  private readonly xNew: Float64Array;
  private readonly peak: Float64Array;
  /** C by compressed rows (the triplets are in row order), for q = C·x. */
  private readonly chargeRowStart: Int32Array;
  private readonly chargeCols: Int32Array;
  private readonly chargeValues: Float64Array;
  /** 1 on rows integrated by the trapezoidal rule between breakpoints, 0 on backward-Euler rows. */
  private readonly trapezoidalRows: Float64Array;
  private readonly lteAbs: Float64Array;
  private readonly historyTimes = new Float64Array(HISTORY);
  private readonly historyValues: Float64Array[];
  private historyCount = 0;
  private historyHead = 0;
  private nextBreak: number;
  private readonly observers: StepObserver[] = [];

  constructor(system: MnaSystem, settings: StepperSettings) {
    this.system = system;
    const n = system.n;
    this.n = n;
    this.tolerances = { ...DEFAULT_TOLERANCES, ...settings.tolerances };
    this.solver = new NewtonSolver(system, this.tolerances);
    if (!(settings.maxStep > 0)) throw simulationError("bad-step", `maximum step must be positive, got ${settings.maxStep}`);
    this.maxStep = settings.maxStep;
    this.h = Math.min(settings.firstStep ?? settings.maxStep / 100, settings.maxStep);
    this.x = new Float64Array(n);
    this.dxdt = new Float64Array(n);
    this.q = new Float64Array(n);
    this.qdot = new Float64Array(n);
    this.xNew = new Float64Array(n);
    this.peak = new Float64Array(n);
    this.trapezoidalRows = Float64Array.from(system.backwardEulerRows, (be) => (be ? 0 : 1));
    const { rows, cols, values } = system.cTriplets;
    this.chargeRowStart = new Int32Array(n + 1);
    for (let k = 0; k < rows.length; k++) this.chargeRowStart[rows[k]! + 1]++;
    for (let i = 0; i < n; i++) this.chargeRowStart[i + 1] += this.chargeRowStart[i]!;
    this.chargeCols = cols;
    this.chargeValues = values;
    this.lteAbs = new Float64Array(n);
    system.unknowns.forEach((u, i) => {
      this.lteAbs[i] = u.kind === "current" ? this.tolerances.lteCurrent : this.tolerances.lteVoltage;
    });
    this.historyValues = Array.from({ length: HISTORY }, () => new Float64Array(n));
    if (settings.start === "bias") {
      this.bias = solveBias(system, this.solver, this.tolerances);
      this.x.set(this.bias.x);
      this.chargesAt(this.x, this.q);
      this.pushHistory(0, this.x);
    } else {
      this.bias = undefined;
      for (const d of system.devices) d.initialCharge?.(this.q);
      this.consistentStart();
    }
    for (let i = 0; i < n; i++) this.peak[i] = Math.abs(this.x[i]!);
    this.solver.reference.set(this.peak);
    this.solver.setMode("step");
    this.nextBreak = this.findBreakpoint(0);
    this.collectSolverCounts();
  }

  /** Calls `observer` now (for t = 0) and after every accepted step. */
  observe(observer: StepObserver): void {
    this.observers.push(observer);
    observer(this.t, this.x, this.dxdt);
  }

  /** q = C·x + q_nl(x) for the linear part; the nonlinear part is taken from the last load. */
  private chargesAt(x: Float64Array, q: Float64Array): void {
    const { n, chargeRowStart, chargeCols, chargeValues } = this;
    const nl = this.solver.qNonlinear;
    for (let i = 0; i < n; i++) {
      let charge = nl[i]!;
      const end = chargeRowStart[i + 1]!;
      for (let k = chargeRowStart[i]!; k < end; k++) charge += chargeValues[k]! * x[chargeCols[k]!]!;
      q[i] = charge;
    }
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
    for (let i = 0; i < this.n; i++) s.history[i] = this.q[i]! / h;
    s.loadSources(0, 1, false);
    const outcome = s.solve(this.x, this.tolerances.biasIterations);
    if (!outcome.converged) this.x.fill(0);
    s.invalidate();
  }

  private findBreakpoint(after: number): number {
    let next = Infinity;
    for (const s of this.system.sources) {
      const b = s.nextBreakpoint(after);
      if (b < next) next = b;
    }
    return next;
  }

  private pushHistory(t: number, x: Float64Array): void {
    this.historyHead = (this.historyHead + 1) % HISTORY;
    this.historyTimes[this.historyHead] = t;
    this.historyValues[this.historyHead]!.set(x);
    if (this.historyCount < HISTORY) this.historyCount++;
  }

  /** History point `back` steps before the newest (0 = newest). */
  private slot(back: number): number {
    return (this.historyHead - back + HISTORY) % HISTORY;
  }

  /**
   * Largest ratio |LTE|/tolerance over the states for a candidate point (t, xNew), or -1 when
   * the history is too short to estimate it.
   */
  private truncationRatio(tNew: number, backwardEuler: boolean): number {
    const needed = backwardEuler ? 2 : 3;
    if (this.historyCount < needed) return -1;
    const { xNew, peak, lteAbs } = this;
    const cols = this.system.stateColumns;
    const rel = this.tolerances.lteRelative;
    const t0 = this.historyTimes[this.slot(0)]!;
    const t1 = this.historyTimes[this.slot(1)]!;
    const x0 = this.historyValues[this.slot(0)]!;
    const x1 = this.historyValues[this.slot(1)]!;
    const h = tNew - t0;
    // Divided differences share their denominators across states: invert them once.
    const i10 = 1 / (tNew - t0);
    const i01 = 1 / (t0 - t1);
    const i20 = 1 / (tNew - t1);
    let ratio = 0;
    if (backwardEuler) {
      const scale = h * h;
      for (let k = 0; k < cols.length; k++) {
        const j = cols[k]!;
        const dd2 = ((xNew[j]! - x0[j]!) * i10 - (x0[j]! - x1[j]!) * i01) * i20;
        const r = (scale * Math.abs(dd2)) / (rel * Math.max(peak[j]!, Math.abs(xNew[j]!)) + lteAbs[j]!);
        if (r > ratio) ratio = r;
      }
      return ratio;
    }
    const t2 = this.historyTimes[this.slot(2)]!;
    const x2 = this.historyValues[this.slot(2)]!;
    const i12 = 1 / (t1 - t2);
    const i02 = 1 / (t0 - t2);
    const i30 = 1 / (tNew - t2);
    const scale = 0.5 * h * h * h;
    for (let k = 0; k < cols.length; k++) {
      const j = cols[k]!;
      const d1b = (x0[j]! - x1[j]!) * i01;
      const d2a = ((xNew[j]! - x0[j]!) * i10 - d1b) * i20;
      const d2b = (d1b - (x1[j]! - x2[j]!) * i12) * i02;
      const r = (scale * Math.abs((d2a - d2b) * i30)) / (rel * Math.max(peak[j]!, Math.abs(xNew[j]!)) + lteAbs[j]!);
      if (r > ratio) ratio = r;
    }
    return ratio;
  }

  /**
   * Prepares a step to tNew in one pass over the unknowns: the charge history (a·qₙ, plus q̇ₙ on
   * trapezoidal rows after the first step) and the Newton starting guess, the polynomial through
   * the last three history points (two just after a breakpoint) extrapolated to tNew, so the
   * first update is small.
   */
  private prepareStep(tNew: number, be: boolean): void {
    const { n, xNew, q, qdot, trapezoidalRows } = this;
    const a = this.solver.a;
    const history = this.solver.history;
    const count = this.historyCount;
    let x0 = this.x;
    let x1 = x0;
    let x2 = x0;
    let w0 = 1;
    let w1 = 0;
    let w2 = 0;
    if (count >= 2) {
      const t0 = this.historyTimes[this.slot(0)]!;
      const t1 = this.historyTimes[this.slot(1)]!;
      x0 = this.historyValues[this.slot(0)]!;
      x1 = this.historyValues[this.slot(1)]!;
      if (count < 3) {
        const s = (tNew - t0) / (t0 - t1);
        w0 = 1 + s;
        w1 = -s;
      } else {
        const t2 = this.historyTimes[this.slot(2)]!;
        x2 = this.historyValues[this.slot(2)]!;
        // Lagrange weights of the quadratic through (t0, x0), (t1, x1), (t2, x2) at tNew.
        w0 = ((tNew - t1) * (tNew - t2)) / ((t0 - t1) * (t0 - t2));
        w1 = ((tNew - t0) * (tNew - t2)) / ((t1 - t0) * (t1 - t2));
        w2 = ((tNew - t0) * (tNew - t1)) / ((t2 - t0) * (t2 - t1));
      }
    }
    const rate = be ? 0 : 1;
    for (let i = 0; i < n; i++) {
      history[i] = a[i]! * q[i]! + rate * trapezoidalRows[i]! * qdot[i]!;
      xNew[i] = w0 * x0[i]! + w1 * x1[i]! + w2 * x2[i]!;
    }
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

  /** Integrates until `tEnd` (landing on it exactly). */
  advance(tEnd: number): void {
    const { solver, tolerances } = this;
    const minStep = 1e-14 * Math.max(tEnd, this.maxStep);
    while (tEnd - this.t > 1e-12 * this.h) {
      const hTry = Math.min(this.h, this.maxStep);
      const fromSegment = hTry === this.segmentStep;
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
      if (target >= tEnd) {
        landing = landing && target === tEnd;
        adjusted = adjusted || target !== tEnd;
        target = tEnd;
      }
      // The nominal step keeps the coefficients (and the factorisation) bit-identical across a run.
      const h = adjusted ? target - this.t : hTry;
      const be = this.backwardEulerNext;
      solver.setCoefficients(be ? 1 / h : 2 / h, 1 / h);
      this.prepareStep(target, be);
      solver.loadSources(target, 1, landing);
      const outcome = solver.solve(this.xNew, tolerances.stepIterations);
      if (!outcome.converged) {
        this.stats.rejected++;
        this.stats.newtonFailures++;
        this.h = h / 8;
        solver.refreshJacobian();
        if (this.h < minStep) {
          const worst = this.system.unknowns[outcome.worst]?.label ?? "?";
          this.collectSolverCounts();
          throw simulationError(
            "newton-not-converged",
            `Newton did not converge at t = ${this.t.toPrecision(6)} s after ${outcome.iterations} iterations (largest change at '${worst}'); the step fell below ${minStep.toExponential(1)} s`,
            { hint: "the circuit may have a discontinuity the model cannot follow; check the parts at that node, or soften limits (op-amp knee=)" },
          );
        }
        continue;
      }
      const change = this.changeRatio();
      if (change > 1) {
        this.stats.rejected++;
        this.h = h * Math.max(0.2, 0.9 / change);
        if (this.h < minStep) {
          this.collectSolverCounts();
          throw simulationError("step-too-small", `the time step fell below ${minStep.toExponential(1)} s at t = ${this.t.toPrecision(6)} s to follow an amplifier's output`, {
            hint: "an output that jumps between its limits faster than the solver can follow; give the op-amp a finite gbw= or slew=",
          });
        }
        continue;
      }
      const ratio = this.truncationRatio(target, be);
      if (ratio > 1) {
        this.stats.rejected++;
        this.h = h * Math.max(0.2, 0.9 * stepRatio(ratio, be));
        if (this.h < minStep) {
          this.collectSolverCounts();
          throw simulationError("step-too-small", `the time step fell below ${minStep.toExponential(1)} s at t = ${this.t.toPrecision(6)} s to meet the error tolerance`, {
            hint: "a very fast edge or a stiff loop; relax the tolerance or smooth the source edges",
          });
        }
        continue;
      }
      this.accept(target, h, be, landing);
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
        let factor = ratio < 0 ? 1.5 : ratio === 0 ? 2 : Math.min(2, Math.max(0.2, 0.9 * stepRatio(ratio, be)));
        // A watched state's change grows about in proportion to the step.
        if (change > 0) factor = Math.min(factor, Math.max(1, 0.9 / change));
        // Keep the step (and with it the factorisation) unless a change is worth it.
        if (factor > 1 && factor < 1.2) factor = 1;
        this.h = factor < 1 ? Math.min(nominal, h * factor) : nominal * factor;
      }
      if (landing) this.h = Math.min(this.h, hTry) * 0.25;
    }
    this.collectSolverCounts();
  }

  private accept(target: number, h: number, be: boolean, landing: boolean): void {
    const { n, q, qdot, x, xNew, dxdt, peak } = this;
    const a = this.solver.a;
    const reference = this.solver.reference;
    const nonlinear = this.solver.qNonlinear;
    const beRows = this.system.backwardEulerRows;
    const { chargeRowStart, chargeCols, chargeValues } = this;
    this.historyHead = (this.historyHead + 1) % HISTORY;
    this.historyTimes[this.historyHead] = target;
    const stored = this.historyValues[this.historyHead]!;
    if (this.historyCount < HISTORY) this.historyCount++;
    // One pass: charges q = C·x + q_nl (the triplets run row by row), their rates, the unknowns'
    // rates and peaks, and the copies into x and the history.
    const inverse = 1 / h;
    for (let i = 0; i < n; i++) {
      let charge = nonlinear[i]!;
      const end = chargeRowStart[i + 1]!;
      for (let k = chargeRowStart[i]!; k < end; k++) charge += chargeValues[k]! * xNew[chargeCols[k]!]!;
      const rowBe = be || beRows[i] === 1;
      qdot[i] = a[i]! * (charge - q[i]!) - (rowBe ? 0 : qdot[i]!);
      q[i] = charge;
      const value = xNew[i]!;
      const dx = value - x[i]!;
      dxdt[i] = rowBe ? dx * inverse : 2 * dx * inverse - dxdt[i]!;
      x[i] = value;
      stored[i] = value;
      const mag = Math.abs(value);
      if (mag > peak[i]!) {
        peak[i] = mag;
        reference[i] = mag;
      }
    }
    this.t = target;
    this.stats.accepted++;
    if (landing) {
      this.stats.breakpoints++;
      this.backwardEulerNext = true;
      this.nextBreak = this.findBreakpoint(this.t);
      // The history restarts at the corner: only this point is kept.
      this.historyCount = 1;
    } else {
      this.backwardEulerNext = false;
    }
    const observers = this.observers;
    for (let o = 0; o < observers.length; o++) observers[o]!(target, x, dxdt);
  }
}

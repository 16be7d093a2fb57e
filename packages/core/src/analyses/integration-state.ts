import type { MnaSystem } from "../solver/system.js";

/** What a snapshot keeps of the integration state (besides x). */
export interface IntegrationMemory {
  readonly dxdt: Float64Array;
  readonly q: Float64Array;
  readonly qdot: Float64Array;
  readonly qPrevious: Float64Array;
  readonly lastStep: number;
}

/**
 * What the integrator carries from one accepted point to the next: the unknowns and their
 * rates, the charges q = C·x + q_nl(x) and their rates, and the charges one step back (the BDF2
 * rows' second history point), with the companion formulas that use them. Between breakpoints
 * a row is integrated by the trapezoidal rule, or, when the system marks it stiff, by the
 * variable-step BDF2 formula (second order and L-stable); a first-order step is backward Euler
 * on every row. The transient stepper and the periodic-orbit map share it.
 */
export class IntegrationState {
  readonly n: number;
  readonly x: Float64Array;
  readonly dxdt: Float64Array;
  readonly q: Float64Array;
  readonly qdot: Float64Array;
  readonly qPrevious: Float64Array;
  /** Length of the last step taken (the BDF2 rows' previous step); NaN, then 0: a double field from the start (see TransientStepper.t). */
  lastStep = NaN;
  /** Row indices integrated by BDF2. */
  readonly stiffRowIndex: Int32Array;
  private readonly stiffRows: Uint8Array;
  /** 1 on trapezoidal rows, 0 on BDF2 rows. */
  private readonly trapezoidalRows: Float64Array;
  /** C by compressed rows (the triplets are in row order), for q = C·x. */
  private readonly chargeRowStart: Int32Array;
  private readonly chargeCols: Int32Array;
  private readonly chargeValues: Float64Array;

  constructor(system: MnaSystem) {
    this.lastStep = 0;
    const n = system.n;
    this.n = n;
    this.x = new Float64Array(n);
    this.dxdt = new Float64Array(n);
    this.q = new Float64Array(n);
    this.qdot = new Float64Array(n);
    this.qPrevious = new Float64Array(n);
    this.stiffRows = system.stiffRows;
    this.trapezoidalRows = Float64Array.from(system.stiffRows, (stiff) => (stiff ? 0 : 1));
    this.stiffRowIndex = Int32Array.from(Array.from(system.stiffRows).flatMap((stiff, i) => (stiff ? [i] : [])));
    const { rows, cols, values } = system.cTriplets;
    this.chargeRowStart = new Int32Array(n + 1);
    for (let k = 0; k < rows.length; k++) this.chargeRowStart[rows[k]! + 1]++;
    for (let i = 0; i < n; i++) this.chargeRowStart[i + 1] += this.chargeRowStart[i]!;
    this.chargeCols = cols;
    this.chargeValues = values;
  }

  /** q = C·x + the nonlinear charges `nonlinear` (loaded at x). */
  chargesAt(x: Float64Array, nonlinear: Float64Array, q: Float64Array): void {
    const { n, chargeRowStart, chargeCols, chargeValues } = this;
    for (let i = 0; i < n; i++) {
      let charge = nonlinear[i]!;
      const end = chargeRowStart[i + 1]!;
      for (let k = chargeRowStart[i]!; k < end; k++) charge += chargeValues[k]! * x[chargeCols[k]!]!;
      q[i] = charge;
    }
  }

  /** Backward-Euler history q/h on every row, from the charges `q`. */
  firstOrderHistory(out: Float64Array, q: Float64Array, h: number): void {
    const inverse = 1 / h;
    for (let i = 0; i < this.n; i++) out[i] = q[i]! * inverse;
  }

  /** The BDF2 rows' coefficient of qₙ₊₁ for a step h after one of hₚ: (1 + 2ω)/((1 + ω)·h), ω = h/hₚ. */
  static bdf2Coefficient(h: number, omega: number): number {
    return (1 + 2 * omega) / ((1 + omega) * h);
  }

  /**
   * History of a second-order step of length h (ω = h/lastStep) with the per-row coefficients
   * `a`: a·qₙ + q̇ₙ on trapezoidal rows (a = 2/h), ((1 + ω)·qₙ − ω²/(1 + ω)·qₙ₋₁)/h on BDF2 rows.
   */
  secondOrderHistory(out: Float64Array, a: Float64Array, h: number, omega: number): void {
    const { n, q, qdot, trapezoidalRows, stiffRowIndex, qPrevious } = this;
    for (let i = 0; i < n; i++) out[i] = a[i]! * q[i]! + trapezoidalRows[i]! * qdot[i]!;
    const now = (1 + omega) / h;
    const before = (omega * omega) / ((1 + omega) * h);
    for (let k = 0; k < stiffRowIndex.length; k++) {
      const i = stiffRowIndex[k]!;
      out[i] = now * q[i]! - before * qPrevious[i]!;
    }
  }

  /**
   * Makes xNew (solved with coefficients `a` over a step h; its nonlinear charges `nonlinear`)
   * the current point: the charges, the charges' and unknowns' rates by the step's formula row
   * by row (backward Euler on a first-order step, else trapezoidal or BDF2; `xBefore` is the
   * point before the current one, for BDF2), and the previous charges.
   */
  commit(xNew: Float64Array, nonlinear: Float64Array, h: number, firstOrder: boolean, a: Float64Array, xBefore: Float64Array): void {
    const { n, q, qdot, qPrevious, x, dxdt, stiffRows } = this;
    const { chargeRowStart, chargeCols, chargeValues } = this;
    const inverse = 1 / h;
    const omega = firstOrder ? 0 : h / this.lastStep;
    // BDF2 weights of xₙ₊₁, xₙ and xₙ₋₁ in the derivative at tₙ₊₁ (times 1/h).
    const wNew = (1 + 2 * omega) / (1 + omega);
    const wNow = -(1 + omega);
    const wBefore = (omega * omega) / (1 + omega);
    for (let i = 0; i < n; i++) {
      let charge = nonlinear[i]!;
      const end = chargeRowStart[i + 1]!;
      for (let k = chargeRowStart[i]!; k < end; k++) charge += chargeValues[k]! * xNew[chargeCols[k]!]!;
      const value = xNew[i]!;
      if (firstOrder) {
        qdot[i] = a[i]! * (charge - q[i]!);
        dxdt[i] = (value - x[i]!) * inverse;
      } else if (stiffRows[i] === 1) {
        qdot[i] = (wNew * charge + wNow * q[i]! + wBefore * qPrevious[i]!) * inverse;
        dxdt[i] = (wNew * value + wNow * x[i]! + wBefore * xBefore[i]!) * inverse;
      } else {
        qdot[i] = a[i]! * (charge - q[i]!) - qdot[i]!;
        dxdt[i] = 2 * (value - x[i]!) * inverse - dxdt[i]!;
      }
      qPrevious[i] = q[i]!;
      q[i] = charge;
      x[i] = value;
    }
    this.lastStep = h;
  }

  memory(): IntegrationMemory {
    const copy = (v: Float64Array) => Float64Array.from(v);
    return { dxdt: copy(this.dxdt), q: copy(this.q), qdot: copy(this.qdot), qPrevious: copy(this.qPrevious), lastStep: this.lastStep };
  }

  restore(x: Float64Array, memory: IntegrationMemory): void {
    this.x.set(x);
    this.dxdt.set(memory.dxdt);
    this.q.set(memory.q);
    this.qdot.set(memory.qdot);
    this.qPrevious.set(memory.qPrevious);
    this.lastStep = memory.lastStep;
  }
}

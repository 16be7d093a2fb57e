import { simulationError, type OnsetError } from "../circuit/diagnostic.js";
import { compileResidual, type ResidualProduct } from "./compiled-residual.js";
import { DeviceJacobian, type DeviceJacobianState } from "./device-jacobian.js";
import { linearStructureOf, type LinearStructure } from "./linear-structure.js";
import { SparseLu, type SparseLuState } from "./sparse-lu.js";
import type { MnaSystem } from "./system.js";

/**
 * A factorisation is reused while no device entry of the matrix has moved by more than this
 * fraction of the entry; the chord iteration then contracts about as fast.
 */
export const STALE_ENTRY = 0.25;
/** Entry changes below this fraction of their row's largest constant entry are ignored. */
const ENTRY_FLOOR = 1e-9;
/**
 * Multiple of the unit roundoff a row's residual is taken to carry: rows of a circuit matrix sum
 * a handful of terms, and the solve adds an error of the same order.
 */
const ROUNDING_MARGIN = 16;

/** What a snapshot keeps of the Newton matrix so that a resumed run factors exactly as the original. */
export interface NewtonMatrixState {
  readonly a: Float64Array;
  readonly factorizations: number;
  readonly luValid: boolean;
  readonly patternEntries: number;
  readonly lu: SparseLuState | undefined;
  readonly devices: DeviceJacobianState;
}

/**
 * The Newton matrix G + a·C + gmin + (device Jacobians) and its LU. The constant part is
 * assembled when the coefficients change; the devices' part is added at each factorisation, and
 * a factorisation is kept while no device entry has moved by more than STALE_ENTRY of its whole
 * matrix entry (a chord iteration on it converges to the same solution, the residual being exact).
 */
export class NewtonMatrix {
  readonly n: number;
  /** Integration coefficient per row (0 at DC, 1/h backward Euler, 2/h trapezoidal). */
  readonly a: Float64Array;
  /** The devices' derivatives at the last iterate. */
  readonly devices: DeviceJacobian;
  /** Conductance to ground added on every node row (gmin stepping). */
  gmin = 0;
  factorizations = 0;

  private readonly system: MnaSystem;
  private readonly structure: LinearStructure;
  /** G + a·C + gmin at the structure's entries. */
  private readonly base: Float64Array;
  /** The factored matrix: the structure's entries, then the device entries outside it. */
  private lu: SparseLu | undefined;
  /** Per row: changes of a device entry below this never force a new factorisation. */
  private readonly entryFloor: Float64Array;
  /** The product over the structure, generated once per circuit (else a loop). */
  private readonly residualProduct: ResidualProduct | undefined;
  private baseValid = false;
  private luValid = false;
  /** Device entries already in the structure handed to the LU (-1: none handed yet). */
  private patternEntries = -1;
  /** Device entries whose place among the constant part's entries is known to them. */
  private baseLinked = 0;
  private lastUniform = Number.NaN;
  private lastStiff = Number.NaN;

  constructor(system: MnaSystem) {
    const n = system.n;
    this.n = n;
    this.system = system;
    this.a = new Float64Array(n);
    this.structure = linearStructureOf(system);
    this.base = new Float64Array(this.structure.rows.length);
    this.entryFloor = new Float64Array(n);
    this.residualProduct = compileResidual(n, this.structure.rowStart, this.structure.cols);
    this.devices = new DeviceJacobian(n);
  }

  /** Sets the per-row integration coefficients: `stiff` on the L-stable rows, `uniform` elsewhere. */
  setCoefficients(uniform: number, stiff: number): void {
    if (uniform === this.lastUniform && stiff === this.lastStiff) return;
    this.lastUniform = uniform;
    this.lastStiff = stiff;
    const rows = this.system.stiffRows;
    let changed = false;
    for (let i = 0; i < this.n; i++) {
      const value = rows[i] ? stiff : uniform;
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

  /** Asks for a fresh factorisation at the next iteration. */
  refresh(): void {
    this.luValid = false;
  }

  /** Whether a factorisation is in use. */
  get factored(): boolean {
    return this.luValid;
  }

  /** Assembles the constant part if the coefficients changed since. */
  prepare(): void {
    if (!this.baseValid) this.assembleBase();
  }

  private assembleBase(): void {
    const { n, base, a, entryFloor } = this;
    const { rows, g, c, rowStart, nodeDiagonals } = this.structure;
    for (let e = 0; e < base.length; e++) base[e] = g[e]! + a[rows[e]!]! * c[e]!;
    if (this.gmin > 0) for (const e of nodeDiagonals) base[e] += this.gmin;
    for (let i = 0; i < n; i++) {
      let largest = 0;
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) largest = Math.max(largest, Math.abs(base[e]!));
      entryFloor[i] = ENTRY_FLOOR * largest;
    }
    this.baseValid = true;
  }

  /** r = (G + a·C + gmin)·x − history − u (the linear part of the residual). */
  linearResidual(x: Float64Array, history: Float64Array, u: Float64Array, r: Float64Array): void {
    if (this.residualProduct) {
      this.residualProduct(this.base, x, history, u, r);
      return;
    }
    const { n, base } = this;
    const { rowStart, cols } = this.structure;
    for (let i = 0; i < n; i++) {
      let sum = -history[i]! - u[i]!;
      const end = rowStart[i + 1]!;
      for (let e = rowStart[i]!; e < end; e++) sum += base[e]! * x[cols[e]!]!;
      r[i] = sum;
    }
  }

  /** True when there is no factorisation, or the devices' entries have moved too far from it. */
  stale(nonlinear: boolean): boolean {
    if (!this.luValid) return true;
    if (!nonlinear) return false;
    // The check outside linkBase keeps this method small enough to inline into the Newton loop.
    if (this.baseLinked !== this.devices.entryCount) this.linkBase();
    return this.devices.moved(this.base, STALE_ENTRY, this.entryFloor);
  }

  /** Tells the device entries touched since where they sit among the constant part's. */
  private linkBase(): void {
    const devices = this.devices;
    for (let e = this.baseLinked; e < devices.entryCount; e++) devices.linkBase(e, this.structure.entryOf(devices.rows[e]!, devices.cols[e]!) ?? -1);
    this.baseLinked = devices.entryCount;
  }

  /**
   * A new LU for the structure's entries plus the first `count` device entries outside it (the
   * pivot order is chosen afresh at its first factorisation).
   */
  private updatePattern(count: number): SparseLu {
    const { structure, devices } = this;
    const rows = Array.from(structure.rows);
    const cols = Array.from(structure.cols);
    for (let e = 0; e < count; e++) {
      const row = devices.rows[e]!;
      const col = devices.cols[e]!;
      const at = structure.entryOf(row, col);
      if (at !== undefined) {
        devices.linkTarget(e, at);
      } else {
        devices.linkTarget(e, rows.length);
        rows.push(row);
        cols.push(col);
      }
    }
    this.lu = new SparseLu(this.n, Int32Array.from(rows), Int32Array.from(cols));
    this.patternEntries = count;
    return this.lu;
  }

  /** Factors the constant part plus the devices' derivatives at the last iterate. */
  factor(): void {
    if (this.devices.entryCount !== this.patternEntries) this.updatePattern(this.devices.entryCount);
    const lu = this.lu!;
    const matrix = lu.a;
    // Loops, not set() and fill(): a builtin call costs more than a small circuit's few dozen entries.
    const base = this.base;
    const constant = base.length;
    for (let e = 0; e < constant; e++) matrix[e] = base[e]!;
    for (let e = constant; e < matrix.length; e++) matrix[e] = 0;
    if (this.baseLinked !== this.devices.entryCount) this.linkBase();
    this.devices.assemble(matrix, base, this.entryFloor);
    if (!lu.factor()) throw this.singular(lu.singularColumn);
    this.factorizations++;
    this.luValid = true;
  }

  private singular(column: number): OnsetError {
    const label = this.system.unknowns[column]?.label ?? "?";
    return simulationError("singular-matrix", `the circuit equations are singular at unknown '${label}'`, {
      hint: "a node may be floating, or ideal sources/inductors may form a loop; check the parts at that node",
    });
  }

  /**
   * How far rounding alone moves a Newton update, per unknown: |M⁻¹·s| with
   * sᵢ = ROUNDING_MARGIN·ε·(Σⱼ|Mᵢⱼ·xⱼ| + |historyᵢ| + |uᵢ|), the rounding error a row's
   * residual can carry (a sum of m terms is exact to m·ε of the sum of their sizes: Higham,
   * *Accuracy and Stability of Numerical Algorithms*, 2nd ed., §3.1). At tiny steps a·C·x and
   * the history are large and cancel, so this floor grows as 1/h.
   */
  roundingFloor(x: Float64Array, history: Float64Array, u: Float64Array, out: Float64Array): void {
    const { n, base } = this;
    const { rowStart, cols } = this.structure;
    for (let i = 0; i < n; i++) {
      let size = Math.abs(history[i]!) + Math.abs(u[i]!);
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) size += Math.abs(base[e]! * x[cols[e]!]!);
      out[i] = ROUNDING_MARGIN * Number.EPSILON * size;
    }
    this.lu!.solve(out, out);
    for (let i = 0; i < n; i++) out[i] = Math.abs(out[i]!);
  }

  /** dx = −M⁻¹·r with the factorisation in use. */
  solveNegated(r: Float64Array, dx: Float64Array): void {
    this.lu!.solveNegated(r, dx);
  }

  /** Everything a resumed run needs to factor and reuse exactly as this one would. */
  state(): NewtonMatrixState {
    return {
      a: Float64Array.from(this.a),
      factorizations: this.factorizations,
      luValid: this.luValid,
      patternEntries: this.patternEntries,
      lu: this.lu?.state(),
      devices: this.devices.state(),
    };
  }

  restore(state: NewtonMatrixState): void {
    this.a.set(state.a);
    this.factorizations = state.factorizations;
    this.lastUniform = Number.NaN;
    this.lastStiff = Number.NaN;
    // Coefficients are compared against `a` itself in setCoefficients, so the matrix stays valid.
    this.assembleBase();
    this.devices.restore(state.devices);
    this.patternEntries = -1;
    this.lu = undefined;
    if (state.patternEntries >= 0) {
      const lu = this.updatePattern(state.patternEntries);
      if (state.lu) lu.restore(state.lu);
    }
    this.luValid = state.luValid;
  }
}

import { simulationError } from "../circuit/diagnostic.js";
import { compileResidual, type ResidualProduct } from "./compiled-residual.js";
import { DeviceJacobian, type DeviceJacobianState } from "./device-jacobian.js";
import { LuSolver, type LuState } from "./lu.js";
import type { MnaSystem } from "./system.js";

/**
 * A factorisation is reused while no device entry of the matrix has moved by more than this
 * fraction of the entry; the chord iteration then contracts about as fast.
 */
export const STALE_ENTRY = 0.25;
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

/** What a snapshot keeps of the Newton matrix so that a resumed run factors exactly as the original. */
export interface NewtonMatrixState {
  readonly a: Float64Array;
  readonly factorizations: number;
  readonly luValid: boolean;
  readonly patternEntries: number;
  readonly lu: LuState;
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
  private readonly base: Float64Array;
  private readonly matrix: Float64Array;
  private readonly lu: LuSolver;
  /** Per row: changes of a device entry below this never force a new factorisation. */
  private readonly entryFloor: Float64Array;
  /** The entries G + a·C + gmin can have. */
  private readonly linearPattern: Uint8Array;
  /** The product over the pattern of G, C and the node diagonals, generated once per circuit. */
  private readonly residualProduct: ResidualProduct | undefined;
  // Compressed rows of the assembled G + a·C (+ gmin), rebuilt with it (when not generated).
  private readonly baseRowStart: Int32Array;
  private baseCols = new Int32Array(0);
  private baseValues = new Float64Array(0);
  private baseValid = false;
  private luValid = false;
  /** Device entries already in the pattern handed to the LU (-1: none handed yet). */
  private patternEntries = -1;
  private lastUniform = Number.NaN;
  private lastStiff = Number.NaN;

  constructor(system: MnaSystem) {
    const n = system.n;
    this.n = n;
    this.system = system;
    this.a = new Float64Array(n);
    this.base = new Float64Array(n * n);
    this.matrix = new Float64Array(n * n);
    this.lu = new LuSolver(n);
    this.entryFloor = new Float64Array(n);
    this.baseRowStart = new Int32Array(n + 1);
    this.linearPattern = linearPatternOf(system);
    this.residualProduct = compileResidual(n, this.linearPattern);
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

  /** r = (G + a·C + gmin)·x − history − u (the linear part of the residual). */
  linearResidual(x: Float64Array, history: Float64Array, u: Float64Array, r: Float64Array): void {
    if (this.residualProduct) {
      this.residualProduct(this.base, x, history, u, r);
      return;
    }
    const { n, baseRowStart: start, baseCols: cols, baseValues: values } = this;
    for (let i = 0; i < n; i++) {
      let sum = -history[i]! - u[i]!;
      const end = start[i + 1]!;
      for (let k = start[i]!; k < end; k++) sum += values[k]! * x[cols[k]!]!;
      r[i] = sum;
    }
  }

  /** True when there is no factorisation, or the devices' entries have moved too far from it. */
  stale(nonlinear: boolean): boolean {
    return !this.luValid || (nonlinear && this.devices.moved(this.base, STALE_ENTRY, this.entryFloor));
  }

  /** The entries that can ever be nonzero: the linear pattern and the device entries. */
  private updatePattern(): void {
    const pattern = Uint8Array.from(this.linearPattern);
    this.devices.markInto(pattern);
    this.lu.setPattern(pattern);
    this.patternEntries = this.devices.entryCount;
  }

  /** Factors the constant part plus the devices' derivatives at the last iterate. */
  factor(): void {
    if (this.devices.entryCount !== this.patternEntries) this.updatePattern();
    this.devices.assemble(this.base, this.matrix);
    if (!this.lu.factor(this.matrix)) {
      const label = this.system.unknowns[this.lu.singularColumn]?.label ?? "?";
      throw simulationError("singular-matrix", `the circuit equations are singular at unknown '${label}'`, {
        hint: "a node may be floating, or ideal sources/inductors may form a loop; check the parts at that node",
      });
    }
    this.factorizations++;
    this.luValid = true;
  }

  /** dx = −M⁻¹·r with the factorisation in use. */
  solveNegated(r: Float64Array, dx: Float64Array): void {
    this.lu.solveNegated(r, dx);
  }

  /** Everything a resumed run needs to factor and reuse exactly as this one would. */
  state(): NewtonMatrixState {
    return {
      a: Float64Array.from(this.a),
      factorizations: this.factorizations,
      luValid: this.luValid,
      patternEntries: this.patternEntries,
      lu: this.lu.state(),
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
    this.patternEntries = state.patternEntries;
    this.lu.restore(state.lu);
    this.luValid = state.luValid;
  }
}

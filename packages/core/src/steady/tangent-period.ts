import { simulationError } from "../circuit/diagnostic.js";
import { linearStructureOf, type LinearStructure } from "../solver/linear-structure.js";
import { SourceVector } from "../solver/source-vector.js";
import { SparseLu } from "../solver/sparse-lu.js";
import type { MnaSystem } from "../solver/system.js";
import { DeviceEntries } from "./device-entries.js";
import { GAMMA, STAGE_BEFORE, STAGE_NOW, type PeriodStart } from "./periodic-map.js";

/** One run of the periodic map: its start, grid, and the points it passed (see `PeriodicMap`). */
export interface MapRun {
  readonly start: PeriodStart;
  readonly fractions: Float64Array;
  /** The N + 1 grid points (read again by each pass when the linearisations are not kept: not to be overwritten while the tangent is in use). */
  readonly states: readonly Float64Array[];
  /** The N first-stage solutions, at tₖ + γhₖ (likewise). */
  readonly middles: readonly Float64Array[];
}

/**
 * The devices' derivatives at every point are kept while they take at most this many doubles
 * (128 MiB); beyond it each pass linearises the devices again at the run's points (a device load
 * per point: the pass then costs about a plain period instead of half of one).
 */
export const KEPT_DOUBLES = 2 ** 24;

/** The devices' derivatives (per shared entry) and the rate q̇ at one point of the run. */
interface Point {
  readonly dF: Float64Array;
  readonly dQ: Float64Array;
  readonly rate: Float64Array;
}

/**
 * The derivative of one period of the periodic map along one direction: S·[v; τ] = dx_N for
 * dx₀ = v, dT = τ, by the variational recursion `PeriodicMap.propagate` carries for all n + 1
 * columns, here for one, each stage's matrix G_x + a·C_x factored sparse (the engine's SparseLu,
 * its pivot order kept from step to step while it serves). A pass costs two sparse
 * factorisations and two solves per step, about one plain period of the map; this makes
 * Newton–Krylov shooting possible where the dense monodromy matrix is too dear (Telichevesky,
 * Kundert & White 1995; docs/references.md §9).
 *
 * The devices are linearised once, at construction, on every point of the run, and kept while
 * that takes at most `keptDoubles` ((2N + 1)·(2e + n) doubles for e device entries); beyond it
 * each pass loads them again, in memory for three points. The factorisations are redone on every
 * pass (keeping 2N of them would cost the fill-in 2N times over).
 */
export class TangentPeriod {
  readonly n: number;
  private readonly system: MnaSystem;
  private readonly fractions: Float64Array;
  private readonly period: number;
  private readonly structure: LinearStructure;
  /** Points in run order: state k at 2k, the middle of step k at 2k + 1 (empty when not kept). */
  private readonly points: Point[] = [];
  /** Otherwise: the run, the points' times, the devices and sources to load them again, and three points' room. */
  private readonly run: MapRun;
  private readonly times: Float64Array;
  private readonly entries: DeviceEntries;
  private readonly sources: SourceVector;
  private readonly room: Point[] = [];
  private readonly deviceRows: Int32Array;
  private readonly deviceCols: Int32Array;
  /** Per device entry: its place among the factored matrix's entries. */
  private readonly target: Int32Array;
  private readonly lu: SparseLu;
  private readonly s: Float64Array;
  private readonly sMiddle: Float64Array;
  private readonly rhs: Float64Array;
  /** Tangent passes made. */
  passes = 0;

  /** `previous`: a tangent of the same system, whose factorisation (its pivot order and schedule) is taken over when the device entries are the same. */
  constructor(system: MnaSystem, run: MapRun, previous?: TangentPeriod, keptDoubles = KEPT_DOUBLES) {
    const n = system.n;
    this.n = n;
    this.system = system;
    this.run = run;
    this.fractions = run.fractions;
    this.period = run.start.period;
    this.structure = previous?.structure ?? linearStructureOf(system);
    const entries = new DeviceEntries(system);
    this.entries = entries;
    this.sources = new SourceVector(n, system.sources);
    // The times as the map computes them (t₀ + T·Σ fractions, summed in the same order).
    const N = run.fractions.length;
    const { t0, period } = run.start;
    this.times = new Float64Array(2 * N + 1);
    this.times[0] = t0;
    let elapsed = 0;
    for (let k = 0; k < N; k++) {
      this.times[2 * k + 1] = t0 + elapsed * period + GAMMA * run.fractions[k]! * period;
      elapsed += run.fractions[k]!;
      this.times[2 * k + 2] = t0 + elapsed * period;
    }
    // Every point is loaded once (so the entries are all known), and kept while they fit.
    let kept = 0;
    for (let i = 0; i <= 2 * N; i++) {
      const rate = new Float64Array(n);
      this.load(i, rate);
      kept += 2 * entries.count + n;
      if (kept <= keptDoubles) this.points.push({ dF: entries.dF.slice(0, entries.count), dQ: entries.dQ.slice(0, entries.count), rate });
    }
    if (kept > keptDoubles) {
      this.points.length = 0;
      for (let k = 0; k < 3; k++) this.room.push({ dF: new Float64Array(entries.count), dQ: new Float64Array(entries.count), rate: new Float64Array(n) });
    }
    this.deviceRows = Int32Array.from(entries.rows);
    this.deviceCols = Int32Array.from(entries.cols);
    this.s = new Float64Array(n);
    this.sMiddle = new Float64Array(n);
    this.rhs = new Float64Array(n);
    if (previous && sameEntries(previous.deviceRows, this.deviceRows) && sameEntries(previous.deviceCols, this.deviceCols)) {
      this.target = previous.target;
      this.lu = previous.lu;
      return;
    }
    const rows = Array.from(this.structure.rows);
    const cols = Array.from(this.structure.cols);
    this.target = new Int32Array(entries.count);
    for (let e = 0; e < entries.count; e++) {
      const at = this.structure.entryOf(this.deviceRows[e]!, this.deviceCols[e]!);
      this.target[e] = at ?? rows.length;
      if (at === undefined) {
        rows.push(this.deviceRows[e]!);
        cols.push(this.deviceCols[e]!);
      }
    }
    this.lu = new SparseLu(n, Int32Array.from(rows), Int32Array.from(cols));
  }

  /** Loads the devices and sources at point i (state i/2 or the middle of step (i − 1)/2), its rate into `rate`. */
  private load(i: number, rate: Float64Array): void {
    const x = i % 2 === 0 ? this.run.states[i / 2]! : this.run.middles[(i - 1) / 2]!;
    this.entries.at(x);
    this.sources.load(this.times[i]!, 1, false);
    this.rateAt(x, this.entries.f, this.sources.u, rate);
  }

  /** Point i: the kept one, or loaded again into the room's `slot`. */
  private pointAt(i: number, slot: number): Point {
    if (this.points.length > 0) return this.points[i]!;
    const p = this.room[slot]!;
    this.load(i, p.rate);
    p.dF.set(this.entries.dF.subarray(0, p.dF.length));
    p.dQ.set(this.entries.dQ.subarray(0, p.dQ.length));
    return p;
  }

  /** q̇ = u − G·x − f on charged rows, 0 on algebraic ones (as the map's). */
  private rateAt(x: Float64Array, f: Float64Array, u: Float64Array, rate: Float64Array): void {
    const { rowStart, cols, g } = this.structure;
    const charged = this.system.chargedRows;
    for (let i = 0; i < this.n; i++) {
      if (!charged[i]) continue;
      let gx = f[i]!;
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) gx += g[e]! * x[cols[e]!]!;
      rate[i] = u[i]! - gx;
    }
  }

  /** out = S·[v; τ], the end state's change for a start moved by v and a period moved by τ. */
  apply(v: Float64Array, tau: number, out: Float64Array): void {
    this.applyEach([v], [tau], [out]);
  }

  /**
   * outs[c] = S·[vs[c]; taus[c]] for each c, in one sweep over the period: each stage's matrix is
   * factored once for all the directions (the factorisations are most of a pass's cost).
   */
  applyEach(vs: readonly Float64Array[], taus: readonly number[], outs: readonly Float64Array[]): void {
    const { n, fractions, period, rhs } = this;
    const count = vs.length;
    const s = count === 1 ? [this.s] : vs.map(() => new Float64Array(n));
    const sMiddle = count === 1 ? [this.sMiddle] : vs.map(() => new Float64Array(n));
    for (let c = 0; c < count; c++) s[c]!.set(vs[c]!.subarray(0, n));
    // (The room's slots: xₖ in `at`, x_γ in 1, xₖ₊₁ in 2 − at; the end of a step starts the next.)
    let at = 0;
    let here = this.pointAt(0, at);
    for (let k = 0; k < fractions.length; k++) {
      const fraction = fractions[k]!;
      const h = fraction * period;
      const a = 2 / (GAMMA * h);
      const middle = this.pointAt(2 * k + 1, 1);
      const next = this.pointAt(2 * k + 2, 2 - at);
      // Stage 1: J_γ·s_γ = (a·C_x(xₖ) − G_x(xₖ)|charged)·sₖ − ∂R₁/∂h·fraction·τ.
      this.factorAt(middle, a);
      for (let c = 0; c < count; c++) {
        const tau = taus[c]!;
        rhs.fill(0);
        this.product(a, -1, here, s[c]!);
        if (tau !== 0) for (let i = 0; i < n; i++) rhs[i] += ((middle.rate[i]! + here.rate[i]!) / h) * fraction * tau;
        this.lu.solve(rhs, sMiddle[c]!);
      }
      // Stage 2: J₊·sₖ₊₁ = a·(c₁·C_x(x_γ)·s_γ − c₂·C_x(xₖ)·sₖ) − ∂R₂/∂h·fraction·τ.
      this.factorAt(next, a);
      for (let c = 0; c < count; c++) {
        const tau = taus[c]!;
        rhs.fill(0);
        this.product(a * STAGE_NOW, 0, middle, sMiddle[c]!);
        this.product(-a * STAGE_BEFORE, 0, here, s[c]!);
        if (tau !== 0) for (let i = 0; i < n; i++) rhs[i] += (next.rate[i]! / h) * fraction * tau;
        this.lu.solve(rhs, s[c]!);
      }
      here = next;
      at = 2 - at;
    }
    for (let c = 0; c < count; c++) outs[c]!.set(s[c]!);
    this.passes += count;
  }

  /** Factors G_x + a·C_x at a point. */
  private factorAt(p: Point, a: number): void {
    const { g, c } = this.structure;
    const matrix = this.lu.a;
    const constant = g.length;
    for (let e = 0; e < constant; e++) matrix[e] = g[e]! + a * c[e]!;
    for (let e = constant; e < matrix.length; e++) matrix[e] = 0;
    const { target } = this;
    for (let e = 0; e < p.dF.length; e++) matrix[target[e]!] += p.dF[e]! + a * p.dQ[e]!;
    if (!this.lu.factor()) throw simulationError("orbit-singular", "the periodic-orbit map's Jacobian is singular");
  }

  /** rhs += (weightC·C_x + weightG·G_x|charged rows)·s at a point. */
  private product(weightC: number, weightG: number, p: Point, s: Float64Array): void {
    const { rhs } = this;
    const { rowStart, cols, g, c } = this.structure;
    const charged = this.system.chargedRows;
    for (let i = 0; i < this.n; i++) {
      const wG = charged[i] ? weightG : 0;
      let sum = 0;
      for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) sum += (weightC * c[e]! + wG * g[e]!) * s[cols[e]!]!;
      rhs[i] += sum;
    }
    const { deviceRows, deviceCols } = this;
    for (let e = 0; e < p.dF.length; e++) {
      const row = deviceRows[e]!;
      const w = weightC * p.dQ[e]! + (charged[row] ? weightG : 0) * p.dF[e]!;
      if (w !== 0) rhs[row] += w * s[deviceCols[e]!]!;
    }
  }
}

function sameEntries(a: Int32Array, b: Int32Array): boolean {
  if (a.length !== b.length) return false;
  for (let e = 0; e < a.length; e++) if (a[e] !== b[e]) return false;
  return true;
}

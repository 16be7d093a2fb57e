import type { NonlinearLoad } from "../devices/device.js";
import type { MnaSystem } from "../solver/system.js";

/**
 * The devices' f(x), charges and derivatives ∂f/∂x, ∂q/∂x at one point, the derivatives kept
 * sparse: entry e is (rows[e], cols[e]) of a table shared by every point loaded through it, so
 * storage follows the devices' entries, not n². Entries are numbered as the devices first touch
 * them; a point loaded before an entry was first touched has it as zero.
 */
export class DeviceEntries implements NonlinearLoad {
  readonly f: Float64Array;
  readonly charges: Float64Array;
  /** ∂f/∂x and ∂q/∂x at the last point, per entry (the first `count` are in use). */
  dF = new Float64Array(16);
  dQ = new Float64Array(16);
  rows: number[] = [];
  cols: number[] = [];
  private readonly index = new Map<number, number>();
  private readonly system: MnaSystem;

  constructor(system: MnaSystem) {
    this.system = system;
    this.f = new Float64Array(system.n);
    this.charges = new Float64Array(system.n);
  }

  get count(): number {
    return this.rows.length;
  }

  /** Loads every device at x, the circuit fully powered (as `Linearisation.at`). */
  at(x: Float64Array): this {
    this.f.fill(0);
    this.charges.fill(0);
    this.dF.fill(0);
    this.dQ.fill(0);
    const devices = this.system.nonlinear;
    for (let d = 0; d < devices.length; d++) devices[d]!.load(x, this, Infinity);
    return this;
  }

  private entry(row: number, col: number): number {
    const key = row * this.system.n + col;
    const known = this.index.get(key);
    if (known !== undefined) return known;
    const e = this.rows.length;
    this.index.set(key, e);
    this.rows.push(row);
    this.cols.push(col);
    if (e >= this.dF.length) {
      const grow = (a: Float64Array) => {
        const b = new Float64Array(2 * a.length);
        b.set(a);
        return b;
      };
      this.dF = grow(this.dF);
      this.dQ = grow(this.dQ);
    }
    return e;
  }

  addF(row: number, value: number): void {
    if (row >= 0) this.f[row] += value;
  }

  adddF(row: number, col: number, value: number): void {
    if (row >= 0 && col >= 0) this.dF[this.entry(row, col)] += value;
  }

  addQ(row: number, value: number): void {
    if (row >= 0) this.charges[row] += value;
  }

  adddQ(row: number, col: number, value: number): void {
    if (row >= 0 && col >= 0) this.dQ[this.entry(row, col)] += value;
  }
}

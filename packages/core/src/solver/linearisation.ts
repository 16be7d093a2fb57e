import type { NonlinearLoad } from "../devices/device.js";
import type { MnaSystem } from "./system.js";

/**
 * The circuit's equations and their derivatives at one point x, as dense n×n matrices:
 * f(x) and q_nl(x) of the devices, G_x = G + ∂f/∂x and C_x = C + ∂q/∂x (row-major). The
 * periodic-orbit sensitivities read them at every step; the arrays are allocated once.
 */
export class Linearisation implements NonlinearLoad {
  readonly n: number;
  readonly f: Float64Array;
  readonly charges: Float64Array;
  readonly G: Float64Array;
  readonly C: Float64Array;
  private readonly system: MnaSystem;

  constructor(system: MnaSystem) {
    const n = system.n;
    this.n = n;
    this.system = system;
    this.f = new Float64Array(n);
    this.charges = new Float64Array(n);
    this.G = new Float64Array(n * n);
    this.C = new Float64Array(n * n);
  }

  /** Loads every device at x and time t (Infinity: the circuit fully powered). */
  at(x: Float64Array, t = Infinity): this {
    this.f.fill(0);
    this.charges.fill(0);
    this.G.set(this.system.G);
    this.C.set(this.system.C);
    const devices = this.system.nonlinear;
    for (let d = 0; d < devices.length; d++) devices[d]!.load(x, this, t);
    return this;
  }

  /** Copies another point's linearisation (to keep the previous step's). */
  copyFrom(other: Linearisation): void {
    this.f.set(other.f);
    this.charges.set(other.charges);
    this.G.set(other.G);
    this.C.set(other.C);
  }

  addF(row: number, value: number): void {
    if (row >= 0) this.f[row] += value;
  }

  adddF(row: number, col: number, value: number): void {
    if (row >= 0 && col >= 0) this.G[row * this.n + col] += value;
  }

  addQ(row: number, value: number): void {
    if (row >= 0) this.charges[row] += value;
  }

  adddQ(row: number, col: number, value: number): void {
    if (row >= 0 && col >= 0) this.C[row * this.n + col] += value;
  }
}

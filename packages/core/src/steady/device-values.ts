import type { NonlinearLoad } from "../devices/device.js";
import type { MnaSystem } from "../solver/system.js";

/**
 * The devices' f(x) and charges q_nl(x) at one point, without their derivatives: what a period
 * of the periodic map needs at each stage when no sensitivities ride along (the dense G_x and
 * C_x of a `Linearisation` are then neither copied nor stamped).
 */
export class DeviceValues implements NonlinearLoad {
  readonly f: Float64Array;
  readonly charges: Float64Array;
  private readonly system: MnaSystem;

  constructor(system: MnaSystem) {
    this.system = system;
    this.f = new Float64Array(system.n);
    this.charges = new Float64Array(system.n);
  }

  /** Loads every device at x, the circuit fully powered (as `Linearisation.at`). */
  at(x: Float64Array): this {
    this.f.fill(0);
    this.charges.fill(0);
    const devices = this.system.nonlinear;
    for (let d = 0; d < devices.length; d++) devices[d]!.load(x, this, Infinity);
    return this;
  }

  addF(row: number, value: number): void {
    if (row >= 0) this.f[row] += value;
  }

  adddF(): void {}

  addQ(row: number, value: number): void {
    if (row >= 0) this.charges[row] += value;
  }

  adddQ(): void {}
}

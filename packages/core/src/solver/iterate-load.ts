import type { NonlinearLoad } from "../devices/device.js";
import type { DeviceJacobian } from "./device-jacobian.js";

/**
 * What the Newton core hands the devices at each iterate: their currents go into the residual,
 * their charges into the residual (times each row's integration coefficient) and the charge
 * vector, their derivatives into the device Jacobian. A class rather than closures, so every
 * device's calls reach one and the same method whichever solver is running.
 */
export class IterateLoad implements NonlinearLoad {
  /** Set once a device has added a nonlinear charge; until then `charges` stays zero. */
  charged = false;
  private readonly n: number;
  /** The Jacobian's table of entry positions (empty when it has none: every read is then undefined). */
  private readonly position: Int32Array;
  /** The Jacobian's values, never replaced when it has a position table. */
  private readonly values: Float64Array;

  constructor(
    private readonly residual: Float64Array,
    private readonly coefficients: Float64Array,
    private readonly charges: Float64Array,
    private readonly jacobian: DeviceJacobian,
  ) {
    this.n = jacobian.n;
    this.position = jacobian.position ?? new Int32Array(0);
    this.values = jacobian.values;
  }

  addF(row: number, value: number): void {
    if (row >= 0) this.residual[row] += value;
  }

  /**
   * A known entry of a small circuit is added to here, without a call: the devices' stamps
   * (four of these per branch) then stay small enough to be inlined into their loads, and the
   * doubles they pass are not boxed.
   */
  adddF(row: number, col: number, value: number): void {
    if ((row | col) < 0) return;
    // Past the end of an empty table the read is undefined, and undefined >= 0 is false.
    const e = this.position[row * this.n + col]!;
    if (e >= 0) this.values[e] += value;
    else this.jacobian.add(row, col, value);
  }

  addQ(row: number, value: number): void {
    if (row >= 0) {
      this.residual[row] += this.coefficients[row]! * value;
      this.charges[row] += value;
      this.charged = true;
    }
  }

  adddQ(row: number, col: number, value: number): void {
    if (row >= 0) this.adddF(row, col, this.coefficients[row]! * value);
  }
}

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

  constructor(
    private readonly residual: Float64Array,
    private readonly coefficients: Float64Array,
    private readonly charges: Float64Array,
    private readonly jacobian: DeviceJacobian,
  ) {}

  addF(row: number, value: number): void {
    if (row >= 0) this.residual[row] += value;
  }

  adddF(row: number, col: number, value: number): void {
    if (row >= 0 && col >= 0) this.jacobian.add(row, col, value);
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

import { describe, expect, test } from "vitest";
import { DeviceJacobian } from "../../../packages/core/src/solver/device-jacobian.js";

/** What the solver's load does for one derivative: touch the entry once, then add. */
function add(jacobian: DeviceJacobian, row: number, col: number, value: number): void {
  jacobian.touch(row, col);
  jacobian.values[row * jacobian.n + col] += value;
}

describe("DeviceJacobian", () => {
  const n = 2;
  const base = Float64Array.from([1, -1, -1, 1]);
  const floor = Float64Array.from([1e-9, 1e-9]);

  function factoredAt(g: number): { jacobian: DeviceJacobian; matrix: Float64Array } {
    const jacobian = new DeviceJacobian(n);
    add(jacobian, 1, 1, g);
    const matrix = new Float64Array(n * n);
    jacobian.assemble(base, matrix);
    return { jacobian, matrix };
  }

  test("assemble adds the device entries to the constant matrix", () => {
    const { matrix } = factoredAt(0.5);
    expect([...matrix]).toEqual([1, -1, -1, 1.5]);
  });

  test("an entry counts as moved beyond the fraction of the whole factored entry, not of the device part alone", () => {
    const { jacobian } = factoredAt(0.5); // factored entry 1.5
    jacobian.clear();
    add(jacobian, 1, 1, 0.5 + 0.2); // 0.2 / 1.5 = 13 %
    expect(jacobian.moved(base, 0.25, floor)).toBe(false);
    jacobian.clear();
    add(jacobian, 1, 1, 0.5 + 0.4); // 27 %
    expect(jacobian.moved(base, 0.25, floor)).toBe(true);
  });

  test("changes below the row's floor are ignored; clear forgets the last values", () => {
    const { jacobian } = factoredAt(0);
    jacobian.clear();
    add(jacobian, 1, 1, 1e-12);
    expect(jacobian.moved(new Float64Array(n * n), 0.25, floor)).toBe(false);
    jacobian.clear();
    expect(jacobian.values[3]).toBe(0);
    expect(jacobian.entryCount).toBe(1);
  });
});

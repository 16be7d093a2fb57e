import { expect } from "vitest";
import type { DeviceJacobian } from "../../../packages/core/src/solver/device-jacobian.js";

/**
 * The Jacobian holds what `adds` (row, col, value; a negative row or column is ground, left out)
 * sum to per position, as a map would: its entries numbered in the order first touched.
 */
export function expectSummedEntries(jacobian: DeviceJacobian, adds: readonly (readonly [number, number, number])[]): void {
  const expected = new Map<string, number>();
  for (const [row, col, v] of adds) {
    if (row < 0 || col < 0) continue;
    const key = `${row},${col}`;
    expected.set(key, (expected.get(key) ?? 0) + v);
  }
  expect(jacobian.entryCount).toBe(expected.size);
  [...expected].forEach(([key, sum], e) => {
    expect(`${jacobian.rows[e]},${jacobian.cols[e]}`).toBe(key);
    expect(jacobian.values[e]).toBe(sum);
  });
}

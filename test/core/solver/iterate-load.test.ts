import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { DeviceJacobian } from "../../../packages/core/src/solver/device-jacobian.js";
import { IterateLoad } from "../../../packages/core/src/solver/iterate-load.js";

describe("IterateLoad.adddF(row, col, value)", () => {
  // Small circuits go through the Jacobian's position table (n ≤ 128), large ones through its hash.
  test.each([7, 300])("with n = %i: sums per position, entries in the order first touched, ground (−1) left out", (n) => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: -1, max: n - 1 }), fc.integer({ min: -1, max: n - 1 }), fc.integer({ min: -9, max: 9 })), { maxLength: 300 }), (adds) => {
        const jacobian = new DeviceJacobian(n);
        const load = new IterateLoad(new Float64Array(n), new Float64Array(n), new Float64Array(n), jacobian);
        const expected = new Map<string, number>();
        for (const [row, col, v] of adds) {
          load.adddF(row, col, v);
          if (row < 0 || col < 0) continue;
          const key = `${row},${col}`;
          expected.set(key, (expected.get(key) ?? 0) + v);
        }
        expect(jacobian.entryCount).toBe(expected.size);
        [...expected].forEach(([key, sum], e) => {
          expect(`${jacobian.rows[e]},${jacobian.cols[e]}`).toBe(key);
          expect(jacobian.values[e]).toBe(sum);
        });
      }),
      { numRuns: 100 },
    );
  });
});

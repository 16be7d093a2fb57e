import { describe, test } from "vitest";
import fc from "fast-check";
import { DeviceJacobian } from "../../../packages/core/src/solver/device-jacobian.js";
import { IterateLoad } from "../../../packages/core/src/solver/iterate-load.js";
import { expectSummedEntries } from "./jacobian-sums.js";

describe("IterateLoad.adddF(row, col, value)", () => {
  // Small circuits go through the Jacobian's position table (n ≤ 128), large ones through its hash.
  test.each([7, 300])("with n = %i: sums per position, entries in the order first touched, ground (−1) left out", (n) => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: -1, max: n - 1 }), fc.integer({ min: -1, max: n - 1 }), fc.integer({ min: -9, max: 9 })), { maxLength: 300 }), (adds) => {
        const jacobian = new DeviceJacobian(n);
        const load = new IterateLoad(new Float64Array(n), new Float64Array(n), new Float64Array(n), jacobian);
        for (const [row, col, v] of adds) load.adddF(row, col, v);
        expectSummedEntries(jacobian, adds);
      }),
      { numRuns: 100 },
    );
  });
});

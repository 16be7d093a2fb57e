import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { DeviceJacobian } from "../../../packages/core/src/solver/device-jacobian.js";
import { expectSummedEntries } from "./jacobian-sums.js";

describe("DeviceJacobian", () => {
  const base = Float64Array.from([1]); // the constant part's entry (1, 1)
  const floor = Float64Array.from([1e-9, 1e-9]);

  function factoredAt(g: number): { jacobian: DeviceJacobian; matrix: Float64Array } {
    const jacobian = new DeviceJacobian(2);
    jacobian.add(1, 1, g);
    jacobian.linkBase(0, 0);
    jacobian.linkTarget(0, 3);
    const matrix = Float64Array.from([1, -1, -1, 1]);
    jacobian.assemble(matrix, base, floor);
    return { jacobian, matrix };
  }

  test("assemble adds the device entries where they are linked", () => {
    const { matrix } = factoredAt(0.5);
    expect([...matrix]).toEqual([1, -1, -1, 1.5]);
  });

  test("an entry counts as moved beyond the fraction of the whole factored entry, not of the device part alone", () => {
    const { jacobian } = factoredAt(0.5); // factored entry 1.5
    jacobian.clear();
    jacobian.add(1, 1, 0.5 + 0.2); // 0.2 / 1.5 = 13 %
    expect(jacobian.moved(base, 0.25, floor)).toBe(false);
    jacobian.clear();
    jacobian.add(1, 1, 0.5 + 0.4); // 27 %
    expect(jacobian.moved(base, 0.25, floor)).toBe(true);
  });

  test("changes below the row's floor are ignored; clear forgets the last values", () => {
    const { jacobian } = factoredAt(0);
    jacobian.linkBase(0, -1);
    jacobian.clear();
    jacobian.add(1, 1, 1e-12);
    expect(jacobian.moved(base, 0.25, floor)).toBe(false);
    jacobian.clear();
    expect(jacobian.values[0]).toBe(0);
    expect(jacobian.entryCount).toBe(1);
  });

  test("adds to any set of positions sum per position, entries numbered in the order first touched (as a map would)", () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.nat(5000), fc.nat(5000), fc.integer({ min: -9, max: 9 })), { maxLength: 400 }), (adds) => {
        const jacobian = new DeviceJacobian(5001);
        for (const [row, col, v] of adds) jacobian.add(row, col, v);
        expectSummedEntries(jacobian, adds);
      }),
      { numRuns: 200 },
    );
  });
});

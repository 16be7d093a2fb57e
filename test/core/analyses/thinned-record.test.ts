import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { ThinnedRecord } from "../../../packages/core/src/analyses/thinned-record.js";

/** Feeds `n` steps t = k, v = f(k) into a record of `capacity` points. */
function fill(n: number, capacity: number, f: (k: number) => number): ThinnedRecord {
  const r = new ThinnedRecord(1, capacity);
  for (let k = 0; k < n; k++) {
    r.set(0, f(k));
    r.add(k);
  }
  return r;
}

describe("ThinnedRecord", () => {
  test("never stores more than its capacity, keeps the first and last points, and every stored point lies on the stride's grid", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 5000 }), fc.integer({ min: 4, max: 300 }), (n, capacity) => {
        const r = fill(n, capacity, (k) => Math.sin(k));
        const t = r.times();
        expect(r.length).toBeLessThanOrEqual(capacity);
        expect(t.length).toBeLessThanOrEqual(capacity + 1);
        expect(t[0]).toBe(0);
        expect(t[t.length - 1]).toBe(n - 1);
        for (let i = 0; i < r.length; i++) expect(t[i]! % r.stride).toBe(0);
        // Times increase strictly and the values are those of their steps.
        const v = r.values(0);
        for (let i = 0; i < t.length; i++) {
          if (i > 0) expect(t[i]!).toBeGreaterThan(t[i - 1]!);
          expect(v[i]).toBe(Math.sin(t[i]!));
        }
      }),
    );
  });

  test("keeps every step while it fits: a run within the capacity is stored whole", () => {
    const r = fill(100, 100, (k) => k * k);
    expect([r.stride, r.length, Array.from(r.times()).slice(-2)]).toEqual([1, 100, [98, 99]]);
  });

  test("min and max are exact over every step, also those thinned away", () => {
    // A spike at an odd step is thinned from the stored points, but not from the extremes.
    const r = fill(1000, 16, (k) => (k === 501 ? 7 : k === 333 ? -5 : 0));
    expect(Array.from(r.values(0))).not.toContain(7);
    expect([r.min[0], r.max[0]]).toEqual([-5, 7]);
  });

  test("memory does not grow with the run: 10⁵ and 10⁶ steps store the same number of points", () => {
    const a = fill(1e5, 1000, Math.cos);
    const b = fill(1e6, 1000, Math.cos);
    expect(a.length).toBeLessThanOrEqual(1000);
    expect(b.length).toBeLessThanOrEqual(1000);
    expect(b.stride).toBeGreaterThan(a.stride);
  });
});

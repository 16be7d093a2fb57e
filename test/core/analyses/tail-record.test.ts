import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { TailRecord } from "../../../packages/core/src/analyses/tail-record.js";
import { isOnsetError } from "@onset/core";

/** Feeds `n` steps t = k, v = sin k into a record of `capacity` points. */
function fill(n: number, capacity: number): TailRecord {
  const r = new TailRecord(capacity);
  for (let k = 0; k < n; k++) r.push(k, Math.sin(k));
  return r;
}

describe("TailRecord", () => {
  test("keeps at most its capacity (and the last thinned step), in order, the first and last steps, and its last quarter at every step", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 4000 }), fc.integer({ min: 8, max: 400 }), (n, capacity) => {
        const r = fill(n, capacity);
        const { time, values } = r.toArrays();
        expect(r.length).toBeLessThanOrEqual(capacity);
        expect(time.length).toBeLessThanOrEqual(capacity + 1);
        expect([time[0], time[time.length - 1]]).toEqual([0, n - 1]);
        for (let i = 0; i < time.length; i++) {
          if (i > 0) expect(time[i]!).toBeGreaterThan(time[i - 1]!);
          expect(values[i]).toBe(Math.sin(time[i]!));
        }
        const tail = Math.min(n, Math.floor(capacity / 4));
        expect(Array.from(time.subarray(time.length - tail))).toEqual(Array.from({ length: tail }, (_, i) => n - tail + i));
      }),
    );
  });

  test("a record within its capacity is kept whole", () => {
    const r = fill(100, 100);
    expect([r.stride, Array.from(r.toArrays().time)]).toEqual([1, Array.from({ length: 100 }, (_, i) => i)]);
  });

  test("10⁶ steps keep no more points than 10⁴ do once both are past the capacity", () => {
    const a = fill(1e4, 1000);
    const b = fill(1e6, 1000);
    expect(a.length).toBeLessThanOrEqual(1000);
    expect(b.length).toBeLessThanOrEqual(1000);
    expect(b.stride).toBeGreaterThan(a.stride);
  });

  test("a capacity that is not a whole number ≥ 8 is a bad-argument error", () => {
    for (const bad of [7, 8.5, NaN, -1]) {
      let caught: unknown;
      try {
        new TailRecord(bad);
      } catch (error) {
        caught = error;
      }
      expect(isOnsetError(caught) && caught.diagnostic.code).toBe("bad-argument");
    }
  });
});

import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { defaultBinCount, histogram } from "../../../packages/cli/src/plot/histogram.js";

describe("histogram(values, bins)", () => {
  it("puts every finite value in the bin whose edges hold it (the last bin closed)", () => {
    fc.assert(
      fc.property(fc.array(fc.oneof(fc.double({ min: -1e3, max: 1e3 }), fc.constant(Number.NaN)), { maxLength: 300 }), fc.integer({ min: 1, max: 40 }), (values, bins) => {
        const { edges, counts } = histogram(values, bins);
        expect(edges).toHaveLength(bins + 1);
        const expected = new Uint32Array(bins);
        for (const v of values) {
          if (!Number.isFinite(v)) continue;
          let b = 0;
          while (b < bins - 1 && v >= (edges[b + 1] as number)) b += 1;
          expected[b] = (expected[b] as number) + 1;
          expect(v).toBeGreaterThanOrEqual(edges[0] as number);
          expect(v).toBeLessThanOrEqual(edges[bins] as number);
        }
        expect([...counts]).toEqual([...expected]);
      }),
    );
  });

  it("spans the smallest to the largest value, with equal bins", () => {
    const { edges, counts } = histogram([1, 2, 3, 4, 5], 4);
    expect([...edges]).toEqual([1, 2, 3, 4, 5]);
    expect([...counts]).toEqual([1, 1, 1, 2]);
  });

  it("centres a bin on constant values and gives zero counts over [0, 1] without values", () => {
    const constant = histogram([2.5, 2.5, 2.5], 1);
    expect(constant.counts[0]).toBe(3);
    expect((constant.edges[0] as number) < 2.5 && (constant.edges[1] as number) > 2.5).toBe(true);
    const empty = histogram([Number.NaN], 3);
    expect([...empty.edges]).toEqual([0, 1 / 3, 2 / 3, 1]);
    expect([...empty.counts]).toEqual([0, 0, 0]);
  });

  it("rejects a bin count that is not a positive integer", () => {
    expect(() => histogram([1], 0)).toThrow(new RangeError("histogram: bins must be a positive integer, got 0"));
  });
});

describe("defaultBinCount(samples)", () => {
  // Sturges (1926): ⌈log2 n⌉ + 1, e.g. 1000 samples → 11 bins.
  it("follows Sturges' rule between 5 and 50 bins", () => {
    expect(defaultBinCount(1000)).toBe(11);
    expect(defaultBinCount(3)).toBe(5);
    expect(defaultBinCount(2 ** 60)).toBe(50);
  });
});

import { describe, expect, test } from "vitest";
import fc from "fast-check";
import jStat from "jstat";
import { normalAt, streamKey } from "../../../packages/core/src/random/counter-normal.js";

const N = 200_000;
const draw = (seed: number, name: string, n = N) => {
  const key = streamKey(seed, name);
  return Float64Array.from({ length: n }, (_, k) => normalAt(key, k + 1));
};

describe("counter-based normal stream", () => {
  test("normalAt(key, k) is a pure function of the key and k (any order, any number of calls)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2 ** 40 }), fc.string(), fc.array(fc.integer({ min: 0, max: 2 ** 45 }), { minLength: 1, maxLength: 20 }), (seed, name, counters) => {
        const first = counters.map((k) => normalAt(streamKey(seed, name), k));
        const again = [...counters].reverse().map((k) => normalAt(streamKey(seed, name), k)).reverse();
        expect(again).toEqual(first);
        for (const v of first) expect(Number.isFinite(v)).toBe(true);
      }),
    );
  });

  test("the samples are standard normal: Kolmogorov–Smirnov distance to jstat's normal CDF below the 1 % critical value 1.63/√n", () => {
    const x = draw(1, "R1").sort();
    let d = 0;
    for (let i = 0; i < x.length; i++) {
      const F = jStat.normal.cdf(x[i]!, 0, 1);
      d = Math.max(d, Math.abs(F - i / x.length), Math.abs(F - (i + 1) / x.length));
    }
    expect(d).toBeLessThan(1.63 / Math.sqrt(x.length));
  });

  test("mean 0 and variance 1 within four standard errors (mathematics: se = 1/√n and √(2/n))", () => {
    const x = draw(7, "U1.input");
    const mean = x.reduce((s, v) => s + v, 0) / N;
    const variance = x.reduce((s, v) => s + (v - mean) ** 2, 0) / (N - 1);
    expect(Math.abs(mean)).toBeLessThan(4 / Math.sqrt(N));
    expect(Math.abs(variance - 1)).toBeLessThan(4 * Math.sqrt(2 / N));
  });

  test("successive samples, neighbouring names and neighbouring seeds are uncorrelated (|r| < 4/√n)", () => {
    const a = draw(1, "R1");
    const pairs: Array<[Float64Array, Float64Array]> = [
      [a.subarray(0, N - 1), a.subarray(1)],
      [a, draw(1, "R2")],
      [a, draw(2, "R1")],
      [draw(1, "P1.end1"), draw(1, "P1.end2")],
    ];
    for (const [x, y] of pairs) {
      let sxy = 0;
      let sxx = 0;
      let syy = 0;
      for (let i = 0; i < x.length; i++) {
        sxy += x[i]! * y[i]!;
        sxx += x[i]! ** 2;
        syy += y[i]! ** 2;
      }
      expect(Math.abs(sxy / Math.sqrt(sxx * syy))).toBeLessThan(4 / Math.sqrt(x.length));
    }
  });

  test("a stream's key depends on its own name and the seed, not on other streams", () => {
    expect(streamKey(1, "R1")).toEqual(streamKey(1, "R1"));
    expect(streamKey(1, "R1")).not.toEqual(streamKey(1, "R2"));
    expect(streamKey(1, "R1")).not.toEqual(streamKey(2, "R1"));
    expect(streamKey(2 ** 33, "R1")).not.toEqual(streamKey(2 ** 33 + 1, "R1"));
  });
});

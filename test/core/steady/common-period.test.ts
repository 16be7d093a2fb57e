// The sources' common period (mathematics: tones at whole multiples m₁·f₀, m₂·f₀, … of f₀, with
// gcd(m₁, m₂, …) = 1, all repeat after 1/f₀ and after no shorter time).
import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { commonPeriod, MOST_COMMON_MULTIPLE } from "../../../packages/core/src/steady/common-period.js";

const gcd = (a: number, b: number): number => (b === 0 ? a : gcd(b, a % b));

describe("commonPeriod", () => {
  test("tones at coprime whole multiples of f₀ share exactly 1/f₀", () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 1e5, noNaN: true }), fc.array(fc.integer({ min: 1, max: 16 }), { minLength: 1, maxLength: 5 }), (f0, multiples) => {
        const g = multiples.reduce(gcd);
        const tones = multiples.map((m) => (m / g) * f0);
        expect(Math.abs(commonPeriod(tones)! * f0 - 1)).toBeLessThan(1e-12);
      }),
    );
  });

  test("a ratio beyond the bound, or an irrational one, has none", () => {
    expect(commonPeriod([1e3, 1e3 * Math.SQRT2])).toBeNull();
    expect(commonPeriod([MOST_COMMON_MULTIPLE + 1, MOST_COMMON_MULTIPLE + 2])).toBeNull();
    expect(commonPeriod([MOST_COMMON_MULTIPLE, MOST_COMMON_MULTIPLE + 1])).toBe(1);
  });
});

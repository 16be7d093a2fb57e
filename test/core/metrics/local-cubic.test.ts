import fc from "fast-check";
import { describe, expect, test } from "vitest";
import {
  cubicLevelCrossing,
  cubicOnInterval,
  cubicScratch,
  cubicStationaryPoints,
  cubicValue,
  intervalAt,
} from "../../../packages/core/src/metrics/local-cubic.js";
import { resampleUniform } from "../../../packages/core/src/metrics/resample.js";

// Random strictly increasing times with steps varying up to 10× between neighbours.
const unevenTimes = fc
  .array(fc.double({ min: 0.1, max: 1, noNaN: true }), { minLength: 4, maxLength: 12 })
  .map((steps) => {
    const t = new Float64Array(steps.length + 1);
    for (let i = 0; i < steps.length; i++) t[i + 1] = t[i] + steps[i];
    return t;
  });
const coefficient = fc.double({ min: -3, max: 3, noNaN: true });

describe("cubicOnInterval", () => {
  // Mathematics: the cubic through four distinct nodes is unique, so sampling a cubic and
  // interpolating must give the same cubic back on every interval.
  test("reproduces any cubic exactly on uneven nodes (uniqueness of the interpolating cubic)", () => {
    fc.assert(
      fc.property(unevenTimes, coefficient, coefficient, coefficient, coefficient, fc.double({ min: 0, max: 1, noNaN: true }), (t, a, b, c, d, u) => {
        const p = (x: number): number => a + x * (b + x * (c + x * d));
        const v = t.map(p);
        const coefficients = cubicScratch();
        for (let i = 0; i < t.length - 1; i++) {
          cubicOnInterval(t, v, i, coefficients);
          const time = t[i] + u * (t[i + 1] - t[i]);
          expect(cubicValue(coefficients, u)).toBeCloseTo(p(time), 9);
        }
      }),
    );
  });

  test("passes through the interval's own end samples", () => {
    const t = Float64Array.from([0, 0.1, 1.1, 1.2, 3, 3.05]);
    const v = Float64Array.from([1, -2, 0.5, 4, -1, 2]);
    const c = cubicScratch();
    for (let i = 0; i < t.length - 1; i++) {
      cubicOnInterval(t, v, i, c);
      expect(cubicValue(c, 0)).toBeCloseTo(v[i], 12);
      expect(cubicValue(c, 1)).toBeCloseTo(v[i + 1], 12);
    }
  });
});

describe("cubicLevelCrossing and cubicStationaryPoints", () => {
  test("cubicLevelCrossing(c, level) solves p(u) = level inside the bracket", () => {
    // p(u) = (u − 0.3)(u − 2)(u + 1) = u³ − 1.3u² − 1.7u + 0.6 has one root in [0, 1] at 0.3.
    const c = Float64Array.from([0.6, -1.7, -1.3, 1]);
    expect(cubicLevelCrossing(c, 0)).toBeCloseTo(0.3, 14);
    const level = cubicValue(c, 0.8);
    expect(cubicLevelCrossing(c, level)).toBeCloseTo(0.8, 13);
    expect(cubicLevelCrossing(c, level, 0.5, 1)).toBeCloseTo(0.8, 13);
  });

  test("cubicStationaryPoints returns the roots of p′ that lie in (0, 1)", () => {
    // p′(u) = 3(u − 0.25)(u − 0.75) for p(u) = u³ − 1.5u² + 0.5625u.
    const roots = new Float64Array(2);
    const c = Float64Array.from([0, 0.5625, -1.5, 1]);
    expect(cubicStationaryPoints(c, roots)).toBe(2);
    expect([...roots].sort()).toEqual([expect.closeTo(0.25, 14), expect.closeTo(0.75, 14)]);
    // A parabola with its vertex at 0.4, and a line with none.
    expect(cubicStationaryPoints(Float64Array.from([0, -0.8, 1, 0]), roots)).toBe(1);
    expect(roots[0]).toBeCloseTo(0.4, 14);
    expect(cubicStationaryPoints(Float64Array.from([1, 2, 0, 0]), roots)).toBe(0);
  });

  test("intervalAt(t, time) finds t[i] <= time < t[i+1] and clamps outside the record", () => {
    const t = Float64Array.from([0, 1, 2.5, 4]);
    expect(intervalAt(t, -1)).toBe(0);
    expect(intervalAt(t, 0)).toBe(0);
    expect(intervalAt(t, 1)).toBe(1);
    expect(intervalAt(t, 3)).toBe(2);
    expect(intervalAt(t, 4)).toBe(2);
    expect(intervalAt(t, 9)).toBe(2);
  });
});

describe("resampleUniform", () => {
  test("reproduces a cubic exactly at uniform times (mathematics: the interpolant is that cubic)", () => {
    const t = Float64Array.from([0, 0.05, 0.4, 0.45, 1.2, 1.3, 2]);
    const p = (x: number): number => 0.5 - x + 2 * x * x - 0.7 * x ** 3;
    const out = new Float64Array(41);
    resampleUniform(t, t.map(p), 0, 0.05, out);
    out.forEach((value, m) => expect(value).toBeCloseTo(p(m * 0.05), 12));
  });

  test("a sine at about 30 samples per period comes back within the cubic's (ωh)⁴ error", () => {
    const omega = 2 * Math.PI;
    const t = Float64Array.from({ length: 301 }, (_, i) => (i + 0.3 * Math.sin(1.7 * i)) / 30);
    const out = new Float64Array(500);
    resampleUniform(t, t.map((x) => Math.sin(omega * x)), t[1], 0.019, out);
    // Lagrange remainder (mathematics): |f⁗|·max|Π(u − xᵢ)|·h⁴/24 with h at most 1.6/30.
    const bound = (((omega * 1.6) / 30) ** 4 / 24) * 2.5;
    out.forEach((value, m) => expect(Math.abs(value - Math.sin(omega * (t[1] + m * 0.019)))).toBeLessThan(bound));
  });
});

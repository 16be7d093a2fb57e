import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { noiseShape } from "@onset/core/engine";

// The noise streams' Catmull–Rom kernel (waves/smooth-noise.ts), written out again here.
function kernel(x: number): number {
  const a = Math.abs(x);
  if (a < 1) return 1.5 * a ** 3 - 2.5 * a ** 2 + 1;
  if (a < 2) return -0.5 * a ** 3 + 2.5 * a ** 2 - 4 * a + 2;
  return 0;
}

/** Mathematics: Φ(ν) = ∫ φ(x)·cos(2πνx) dx over [−2, 2] (φ is even), by the midpoint rule on 100 000 points. */
function transformByQuadrature(nu: number): number {
  const n = 100_000;
  let sum = 0;
  for (let m = 0; m < n; m++) {
    const x = -2 + (4 * (m + 0.5)) / n;
    sum += kernel(x) * Math.cos(2 * Math.PI * nu * x);
  }
  return (sum * 4) / n;
}

describe("noiseShape: |Φ|² of the noise streams' kernel", () => {
  test("equals the Fourier integral of the kernel by quadrature across the band (samples 1/(2·corner) apart)", () => {
    const corner = 50e3;
    for (const share of [0.004, 0.02, 0.0399, 0.0401, 0.1, 0.25, 0.5, 0.73, 1, 1.5, 1.9, 1.99]) {
      const f = share * corner;
      expect(noiseShape(f, corner)).toBeCloseTo(transformByQuadrature(f / (2 * corner)) ** 2, 9);
    }
  });

  test("is 1 at DC, 0.9996 at a tenth of the corner, and 0 from twice the corner", () => {
    expect(noiseShape(0, 1e3)).toBe(1);
    expect(noiseShape(100, 1e3)).toBeCloseTo(0.99976, 5);
    expect(noiseShape(2e3, 1e3)).toBe(0);
    expect(noiseShape(5e3, 1e3)).toBe(0);
  });

  test("depends on f/corner only, lies within [0, 1] and falls with frequency over the band (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1.999, noNaN: true }), fc.double({ min: 1, max: 1e9, noNaN: true }), fc.double({ min: 1e-3, max: 0.5, noNaN: true }), (r, corner, dr) => {
        const s = noiseShape(r * corner, corner);
        expect(s).toBeGreaterThanOrEqual(0);
        expect(s).toBeLessThanOrEqual(1);
        expect(noiseShape(r * 7.5, 7.5)).toBeCloseTo(s, 12);
        expect(noiseShape(Math.min(r + dr, 2) * corner, corner)).toBeLessThanOrEqual(s + 1e-12);
      }),
    );
  });
});

import { describe, expect, it } from "vitest";
import { SERIES_TONES, toneColour } from "../../../packages/cli/src/plot/palette.js";

type Vector = [number, number, number];
type Matrix = [Vector, Vector, Vector];

const times = (m: Matrix, v: Vector): Vector => m.map((row) => row[0] * v[0] + row[1] * v[1] + row[2] * v[2]) as Vector;

// sRGB decoding and the sRGB → XYZ (D65) matrix: IEC 61966-2-1.
function linearRgb(hex: string): Vector {
  return [1, 3, 5].map((i) => {
    const c = parseInt(hex.slice(i, i + 2), 16) / 255;
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  }) as Vector;
}
const SRGB_TO_XYZ: Matrix = [
  [0.4124, 0.3576, 0.1805],
  [0.2126, 0.7152, 0.0722],
  [0.0193, 0.1192, 0.9505],
];
const WHITE: Vector = [0.9505, 1, 1.089];

// CIELAB (CIE 15:2004) and ΔE*ab as the Euclidean distance.
function lab(rgb: Vector): Vector {
  const xyz = times(SRGB_TO_XYZ, rgb.map((c) => Math.min(1, Math.max(0, c))) as Vector);
  const f = xyz.map((v, i) => {
    const t = v / (WHITE[i] as number);
    return t > 0.008856 ? Math.cbrt(t) : 7.787 * t + 16 / 116;
  }) as Vector;
  return [116 * f[1] - 16, 500 * (f[0] - f[1]), 200 * (f[1] - f[2])];
}

// Colour-vision deficiency simulation at full severity, linear RGB: Machado, Oliveira and
// Fernandes, IEEE TVCG 15(6), 2009 (matrix values from memory).
const VISION: Record<string, Matrix> = {
  normal: [
    [1, 0, 0],
    [0, 1, 0],
    [0, 0, 1],
  ],
  protanopia: [
    [0.152286, 1.052583, -0.204868],
    [0.114503, 0.786281, 0.099216],
    [-0.003882, -0.048116, 1.051998],
  ],
  deuteranopia: [
    [0.367322, 0.860646, -0.227968],
    [0.280085, 0.672501, 0.047413],
    [-0.01182, 0.04294, 0.968881],
  ],
  tritanopia: [
    [1.255528, -0.076749, -0.178779],
    [-0.078411, 0.930809, 0.147602],
    [0.004733, 0.691367, 0.3039],
  ],
};

describe("SERIES_TONES", () => {
  it.each(Object.keys(VISION))("keeps every pair at least 20 ΔE apart for %s", (vision) => {
    const seen = SERIES_TONES.map((hex) => lab(times(VISION[vision] as Matrix, linearRgb(hex))));
    let closest = Number.POSITIVE_INFINITY;
    for (let i = 0; i < seen.length; i += 1) {
      for (let j = i + 1; j < seen.length; j += 1) {
        const [a, b] = [seen[i] as Vector, seen[j] as Vector];
        closest = Math.min(closest, Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]));
      }
    }
    expect(closest).toBeGreaterThan(20);
  });

  it("stays dark enough to read as a thin line on white (CIELAB L* ≤ 65)", () => {
    for (const hex of SERIES_TONES) expect(lab(linearRgb(hex))[0]).toBeLessThanOrEqual(65);
  });
});

describe("toneColour(tone)", () => {
  it("wraps around the palette in both directions", () => {
    expect(toneColour(SERIES_TONES.length + 1)).toBe(SERIES_TONES[1]);
    expect(toneColour(-1)).toBe(SERIES_TONES.at(-1));
  });
});

/**
 * The local cubic through four neighbouring samples, the one interpolant every metric uses for
 * crossing times, extrema and resampling.
 *
 * On the interval from `t[i]` to `t[i+1]` the cubic passes through samples `i-1 … i+2` (shifted
 * inwards at the ends of the record). It is written in the unit variable
 * u = (τ − t[i]) / (t[i+1] − t[i]), so its coefficients stay well scaled whatever the step size.
 * Neighbouring intervals share their end samples, so the piecewise curve is continuous.
 */

/** Power-basis coefficients c0 + c1·u + c2·u² + c3·u³ of the cubic on one interval, u ∈ [0, 1]. */
export type CubicCoefficients = Float64Array;

/** A coefficient buffer, allocated once per caller and refilled per interval. */
export function cubicScratch(): CubicCoefficients {
  return new Float64Array(4);
}

/**
 * Fills `c` with the cubic on interval `i` of (`t`, `v`); the caller guarantees
 * `t.length >= 4` and `0 <= i < t.length - 1`.
 */
export function cubicOnInterval(t: Float64Array, v: Float64Array, i: number, c: CubicCoefficients): void {
  let j = i - 1;
  if (j < 0) j = 0;
  else if (j > t.length - 4) j = t.length - 4;
  const t0 = t[i];
  const h = t[i + 1] - t0;
  const x0 = (t[j] - t0) / h;
  const x1 = (t[j + 1] - t0) / h;
  const x2 = (t[j + 2] - t0) / h;
  const x3 = (t[j + 3] - t0) / h;
  const y0 = v[j];
  // Newton divided differences.
  const d01 = (v[j + 1] - y0) / (x1 - x0);
  const d12 = (v[j + 2] - v[j + 1]) / (x2 - x1);
  const d23 = (v[j + 3] - v[j + 2]) / (x3 - x2);
  const d012 = (d12 - d01) / (x2 - x0);
  const d123 = (d23 - d12) / (x3 - x1);
  const d0123 = (d123 - d012) / (x3 - x0);
  // Expand y0 + d01(u−x0) + d012(u−x0)(u−x1) + d0123(u−x0)(u−x1)(u−x2) from the innermost
  // factor out: q = d0123·u + p0, then q·(u − x1) + d01 = d0123·u² + q1·u + q0.
  const p0 = d012 - x2 * d0123;
  const q1 = p0 - x1 * d0123;
  const q0 = d01 - x1 * p0;
  c[3] = d0123;
  c[2] = q1 - x0 * d0123;
  c[1] = q0 - x0 * q1;
  c[0] = y0 - x0 * q0;
}

/** The cubic's value at u. */
export function cubicValue(c: CubicCoefficients, u: number): number {
  return c[0] + u * (c[1] + u * (c[2] + u * c[3]));
}

function cubicSlope(c: CubicCoefficients, u: number): number {
  return c[1] + u * (2 * c[2] + u * 3 * c[3]);
}

/**
 * The u in [`lo`, `hi`] ⊆ [0, 1] where the cubic equals `level`, given that it lies on opposite
 * sides of it (or on it) at the two ends. Newton steps kept inside a shrinking bracket, falling
 * back to bisection.
 */
export function cubicLevelCrossing(c: CubicCoefficients, level: number, lo = 0, hi = 1): number {
  let flo = cubicValue(c, lo) - level;
  const fhi = cubicValue(c, hi) - level;
  if (flo === 0) return lo;
  if (fhi === 0) return hi;
  // Linear guess: exact when the samples lie on a straight line.
  let u = lo + (flo / (flo - fhi)) * (hi - lo);
  if (!(u > lo && u < hi)) u = 0.5 * (lo + hi);
  for (let iter = 0; iter < 60; iter++) {
    const f = cubicValue(c, u) - level;
    if (f === 0) return u;
    if (f < 0 === flo < 0) {
      lo = u;
      flo = f;
    } else {
      hi = u;
    }
    let next = u - f / cubicSlope(c, u);
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (Math.abs(next - u) <= 1e-15 || hi - lo <= 1e-15) return next;
    u = next;
  }
  return u;
}

/**
 * Writes the stationary points of the cubic that lie strictly inside (0, 1) into `out` and
 * returns how many there are (0, 1 or 2).
 */
export function cubicStationaryPoints(c: CubicCoefficients, out: Float64Array): number {
  // 3·c3·u² + 2·c2·u + c1 = 0
  const a = 3 * c[3];
  const b = 2 * c[2];
  const k = c[1];
  let count = 0;
  const keep = (u: number): void => {
    if (u > 0 && u < 1) out[count++] = u;
  };
  const scale = Math.abs(a) + Math.abs(b) + Math.abs(k);
  if (scale === 0) return 0;
  if (Math.abs(a) <= 1e-14 * scale) {
    if (b !== 0) keep(-k / b);
    return count;
  }
  const disc = b * b - 4 * a * k;
  if (disc < 0) return 0;
  // Numerically stable quadratic roots (no cancellation between −b and √disc).
  const q = -0.5 * (b + (b >= 0 ? Math.sqrt(disc) : -Math.sqrt(disc)));
  const r1 = q / a;
  keep(r1);
  if (q !== 0) {
    const r2 = k / q;
    if (r2 !== r1) keep(r2);
  }
  return count;
}

/** Index i with t[i] <= time < t[i+1], clamped to the first and last intervals. */
export function intervalAt(t: Float64Array, time: number): number {
  let lo = 0;
  let hi = t.length - 1;
  if (!(time > t[0])) return 0;
  if (time >= t[hi]) return hi - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >>> 1;
    if (t[mid] <= time) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** A column whose part independent of the earlier ones is below this share of its norm is dropped. */
const DEPENDENT = 1e-12;

/**
 * The least-squares fit e ≈ c₀ + c₁·b₁ + c₂·b₂: writes (c₀, c₁, c₂) into `out` and returns the
 * residual sum of squares. Gram–Schmidt with a second orthogonalisation pass (stable to rounding
 * for three columns, Björck, "Numerical Methods for Least Squares Problems", §2.4); a column
 * that depends on the earlier ones gets coefficient 0. Overwrites `b1` and `b2`.
 */
export function leastSquares3(e: Float64Array, b1: Float64Array, b2: Float64Array, out: Float64Array): number {
  const m = e.length;
  const r00 = Math.sqrt(m);
  const n1 = norm(b1);
  let r01 = 0;
  for (let pass = 0; pass < 2; pass++) {
    const d = sum(b1) / m;
    for (let j = 0; j < m; j++) b1[j] -= d;
    r01 += d * r00;
  }
  let r11 = norm(b1);
  const keep1 = r11 > DEPENDENT * n1 && r11 > 0;
  if (keep1) for (let j = 0; j < m; j++) b1[j] /= r11;
  else {
    b1.fill(0);
    r11 = 1;
  }
  const n2 = norm(b2);
  let r02 = 0;
  let r12 = 0;
  for (let pass = 0; pass < 2; pass++) {
    const d0 = sum(b2) / m;
    let d1 = 0;
    for (let j = 0; j < m; j++) d1 += b1[j] * b2[j];
    for (let j = 0; j < m; j++) b2[j] -= d0 + d1 * b1[j];
    r02 += d0 * r00;
    r12 += d1;
  }
  let r22 = norm(b2);
  const keep2 = r22 > DEPENDENT * n2 && r22 > 0;
  if (keep2) for (let j = 0; j < m; j++) b2[j] /= r22;
  else {
    b2.fill(0);
    r22 = 1;
  }
  const mean = sum(e) / m;
  let y1 = 0;
  let y2 = 0;
  for (let j = 0; j < m; j++) {
    y1 += b1[j] * e[j];
    y2 += b2[j] * e[j];
  }
  let rss = 0;
  for (let j = 0; j < m; j++) rss += (e[j] - mean - y1 * b1[j] - y2 * b2[j]) ** 2;
  const c2 = keep2 ? y2 / r22 : 0;
  const c1 = keep1 ? (y1 - r12 * c2) / r11 : 0;
  out[0] = (mean * r00 - r01 * c1 - r02 * c2) / r00;
  out[1] = c1;
  out[2] = c2;
  return rss;
}

function sum(x: Float64Array): number {
  let s = 0;
  for (let j = 0; j < x.length; j++) s += x[j];
  return s;
}

function norm(x: Float64Array): number {
  let s = 0;
  for (let j = 0; j < x.length; j++) s += x[j] * x[j];
  return Math.sqrt(s);
}

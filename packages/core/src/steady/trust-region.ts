/**
 * A step of Newton's method held within a trust radius, in scaled unknowns (each unknown and each
 * residual divided by its scale): Powell's dogleg between the steepest-descent (Cauchy) step of
 * ½‖r + J·p‖² and the Newton step (Powell 1970; Dennis & Schnabel 1983, §6.4.2; Nocedal & Wright
 * 2006, §4.1). `matrix` is J (m × m, row-major), `newton` the Newton step −J⁻¹r (unscaled);
 * `out` gets the step (unscaled). Returns its scaled length, the Newton step's scaled length and
 * the model's predicted ‖r + J·p‖² (scaled), against which the actual residual judges the radius (see {@link nextRadius}).
 */
export function trustStep(matrix: Float64Array, residual: Float64Array, scale: Float64Array, newton: Float64Array, radius: number, out: Float64Array): { readonly length: number; readonly newtonLength: number; readonly predicted: number } {
  const m = scale.length;
  const pn = new Float64Array(m);
  for (let c = 0; c < m; c++) pn[c] = newton[c]! / scale[c]!;
  const newtonLength = norm(pn);
  if (newtonLength <= radius) {
    out.set(newton.subarray(0, m));
    return { length: newtonLength, newtonLength, predicted: predictedSquare(matrix, residual, scale, out) };
  }
  // The gradient of ½‖r̃ + J̃p̃‖² at p̃ = 0, J̃ᵀr̃, with J̃ = S⁻¹JS and r̃ = S⁻¹r.
  const g = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    const ri = residual[i]! / scale[i]!;
    if (ri === 0) continue;
    for (let c = 0; c < m; c++) g[c] += ((matrix[i * m + c]! * scale[c]!) / scale[i]!) * ri;
  }
  const gg = dot(g, g);
  let jg = 0;
  for (let i = 0; i < m; i++) {
    let sum = 0;
    for (let c = 0; c < m; c++) sum += ((matrix[i * m + c]! * scale[c]!) / scale[i]!) * g[c]!;
    jg += sum * sum;
  }
  const p = new Float64Array(m);
  if (!(gg > 0 && jg > 0)) {
    for (let c = 0; c < m; c++) p[c] = (radius / newtonLength) * pn[c]!;
  } else {
    const cauchy = gg / jg;
    const cauchyLength = cauchy * Math.sqrt(gg);
    if (cauchyLength >= radius) {
      for (let c = 0; c < m; c++) p[c] = (-radius / Math.sqrt(gg)) * g[c]!;
    } else {
      // The dogleg's second leg, from the Cauchy point towards the Newton step, to the radius.
      const d = new Float64Array(m);
      for (let c = 0; c < m; c++) d[c] = pn[c]! + cauchy * g[c]!;
      const a = dot(d, d);
      let b = 0;
      for (let c = 0; c < m; c++) b += -cauchy * g[c]! * d[c]!;
      const q = cauchyLength * cauchyLength - radius * radius;
      const tau = a > 0 ? (-b + Math.sqrt(Math.max(0, b * b - a * q))) / a : 0;
      for (let c = 0; c < m; c++) p[c] = -cauchy * g[c]! + tau * d[c]!;
    }
  }
  for (let c = 0; c < m; c++) out[c] = p[c]! * scale[c]!;
  return { length: Math.min(norm(p), radius), newtonLength, predicted: predictedSquare(matrix, residual, scale, out) };
}

/** The trust radius is cut to a quarter of the step when the model predicted the reduction badly (less than this share of it)… */
const POOR = 0.25;
/** …and doubled when it predicted more than this share and the step reached the radius (Nocedal & Wright 2006, Algorithm 4.1). */
const GOOD = 0.75;

/**
 * The trust radius after a step of scaled `length` from a radius `radius`, whose actual reduction
 * of ‖r̃‖² was `ratio` times the model's predicted one.
 */
export function nextRadius(radius: number, length: number, ratio: number): number {
  if (!(ratio >= POOR)) return POOR * length;
  if (ratio > GOOD && length >= 0.99 * radius) return 2 * radius;
  return radius;
}

/** ‖S⁻¹(r + J·p)‖². */
function predictedSquare(matrix: Float64Array, residual: Float64Array, scale: Float64Array, p: Float64Array): number {
  const m = scale.length;
  let sum = 0;
  for (let i = 0; i < m; i++) {
    let v = residual[i]!;
    for (let c = 0; c < m; c++) v += matrix[i * m + c]! * p[c]!;
    sum += (v / scale[i]!) ** 2;
  }
  return sum;
}

function dot(a: Float64Array, b: Float64Array): number {
  let sum = 0;
  for (let k = 0; k < a.length; k++) sum += a[k]! * b[k]!;
  return sum;
}

function norm(a: Float64Array): number {
  return Math.sqrt(dot(a, a));
}

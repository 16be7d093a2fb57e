import type { StepHistory } from "./step-history.js";

/** What each state's error is judged against: rel·max(its running peak, |x|) + abs. */
export interface ErrorScale {
  readonly relative: number;
  readonly peak: Float64Array;
  readonly absolute: Float64Array;
}

/**
 * Local truncation error of a second-order step to (tNew, xNew), as the largest ratio
 * |LTE|/tolerance over the state columns (Hairer, Nørsett & Wanner, *Solving ODEs I*, §III.5;
 * docs/references.md §7). With x‴ ≈ 6·DD₃, the third divided difference over the new point and
 * the last three:
 * - trapezoidal rows: LTE = −(h³/12)·x‴ = −(h³/2)·DD₃;
 * - BDF2 rows, variable step ω = h/hₚ: the interpolation error of the quadratic through the
 *   last three points differentiated at tNew, h·(h + hₚ)·x‴/6, divided by the formula's
 *   leading coefficient (1 + 2ω)/((1 + ω)·h): LTE = h²·(h + hₚ)·(1 + ω)/(1 + 2ω)·DD₃
 *   (−(2/9)·h³·x‴ at constant step).
 * Needs three history points; returns -1 with fewer.
 */
export function secondOrderRatio(history: StepHistory, tNew: number, xNew: Float64Array, cols: Int32Array, stiff: Uint8Array, scale: ErrorScale): number {
  if (history.count < 3) return -1;
  const { relative, peak, absolute } = scale;
  const t0 = history.time(0);
  const t1 = history.time(1);
  const t2 = history.time(2);
  const x0 = history.value(0);
  const x1 = history.value(1);
  const x2 = history.value(2);
  const h = tNew - t0;
  const hPrev = t0 - t1;
  const omega = h / hPrev;
  // Divided differences share their denominators across states: invert them once.
  const i10 = 1 / h;
  const i01 = 1 / hPrev;
  const i20 = 1 / (tNew - t1);
  const i12 = 1 / (t1 - t2);
  const i02 = 1 / (t0 - t2);
  const i30 = 1 / (tNew - t2);
  const trapezoidal = 0.5 * h * h * h;
  const bdf2 = (h * h * (h + hPrev) * (1 + omega)) / (1 + 2 * omega);
  let ratio = 0;
  for (let k = 0; k < cols.length; k++) {
    const j = cols[k]!;
    const d1b = (x0[j]! - x1[j]!) * i01;
    const d2a = ((xNew[j]! - x0[j]!) * i10 - d1b) * i20;
    const d2b = (d1b - (x1[j]! - x2[j]!) * i12) * i02;
    const lte = (stiff[k] ? bdf2 : trapezoidal) * Math.abs((d2a - d2b) * i30);
    const r = lte / (relative * Math.max(peak[j]!, Math.abs(xNew[j]!)) + absolute[j]!);
    if (r > ratio) ratio = r;
  }
  return ratio;
}

/**
 * Local truncation error of a backward-Euler step, (h²/2)·x″ with x″ ≈ 2·DD₂ over the new point
 * and the last two, as the largest ratio to the tolerance; -1 with fewer than two history points.
 */
export function firstOrderRatio(history: StepHistory, tNew: number, xNew: Float64Array, cols: Int32Array, scale: ErrorScale): number {
  if (history.count < 2) return -1;
  const { relative, peak, absolute } = scale;
  const t0 = history.time(0);
  const t1 = history.time(1);
  const x0 = history.value(0);
  const x1 = history.value(1);
  const h = tNew - t0;
  const i10 = 1 / h;
  const i01 = 1 / (t0 - t1);
  const i20 = 1 / (tNew - t1);
  let ratio = 0;
  for (let k = 0; k < cols.length; k++) {
    const j = cols[k]!;
    const dd2 = ((xNew[j]! - x0[j]!) * i10 - (x0[j]! - x1[j]!) * i01) * i20;
    const r = (h * h * Math.abs(dd2)) / (relative * Math.max(peak[j]!, Math.abs(xNew[j]!)) + absolute[j]!);
    if (r > ratio) ratio = r;
  }
  return ratio;
}

/**
 * Step doubling for a first-order step with no usable history (at the start and right after a
 * corner): one step of h and two of h/2 differ by about the error of the pair, (h/2)²·x″
 * (Hairer, Nørsett & Wanner, §II.4: for order p the error of the halves is (x½ − x₁)/(2ᵖ − 1)).
 */
export function doublingRatio(xHalves: Float64Array, xWhole: Float64Array, cols: Int32Array, scale: ErrorScale): number {
  const { relative, peak, absolute } = scale;
  let ratio = 0;
  for (let k = 0; k < cols.length; k++) {
    const j = cols[k]!;
    const r = Math.abs(xHalves[j]! - xWhole[j]!) / (relative * Math.max(peak[j]!, Math.abs(xHalves[j]!)) + absolute[j]!);
    if (r > ratio) ratio = r;
  }
  return ratio;
}

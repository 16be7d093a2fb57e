import { EigenvalueDecomposition, Matrix } from "ml-matrix";
import { simulationError } from "../circuit/diagnostic.js";

/** The eigenvalues of a real square matrix: real and imaginary parts, a complex pair next to each other (positive imaginary part first). */
export interface Eigenvalues {
  readonly re: Float64Array;
  readonly im: Float64Array;
}

/**
 * The eigenvalues of A (n×n, row-major; not modified), without the eigenvectors: the
 * Hessenberg reduction and the shifted QR iteration of ml-matrix's EigenvalueDecomposition
 * (JAMA's orthes and hqr2; Wilkinson & Reinsch, Handbook for Automatic Computation II, 1971:
 * procedures orthes and hqr), less the work whose only use is the eigenvectors: the
 * orthogonal transformations' accumulation, the columns beyond the block being reduced, the
 * rotation of a deflated pair of real roots, and the back-substitution. Every entry the eigenvalues are computed from
 * goes through the same operations in the same order, so they are bit-identical to the
 * library's (a test checks it). Called for every sample of a study (the poles, the seed's
 * contraction), where the library's 500-line routine cost more to compile than to run (two
 * optimising compiles per thread, some 0.1 s each, against 0.05 s of running for 1000
 * samples). A symmetric matrix goes to the library (its own route, tred2/tql2). Unlike the
 * library, the iteration is bounded: `MAX_SWEEPS` sweeps per eigenvalue, then an error.
 */
export function eigenvalues(a: Float64Array, n: number, check?: () => void): Eigenvalues {
  if (isSymmetric(a, n)) {
    const eig = new EigenvalueDecomposition(new Matrix(Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, i * n + n)))));
    return { re: Float64Array.from(eig.realEigenvalues), im: Float64Array.from(eig.imaginaryEigenvalues) };
  }
  const h = Float64Array.from(a);
  const scale = exactScale(h);
  if (scale !== 1) for (let k = 0; k < h.length; k++) h[k] = h[k]! / scale;
  hessenberg(h, n, check);
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  shiftedQr(h, n, re, im, check);
  if (scale !== 1) for (let k = 0; k < n; k++) [re[k], im[k]] = [re[k]! * scale, im[k]! * scale];
  return { re, im };
}

/**
 * Entries beyond 2^±256 in magnitude: the QR sweep multiplies three of them, which underflows
 * (to subnormals and 0) or overflows, and the iteration never deflates. Such a matrix is scaled by
 * the power of two nearest its largest entry, which is exact, and its eigenvalues scaled back; any
 * other is left as it is (the library's eigenvalues, bit for bit).
 */
const SCALED_BEYOND = 2 ** 256;

/**
 * A subdiagonal entry below 2^−500 is negligible whatever its neighbours: with the largest entry
 * within 2^±256 (see `SCALED_BEYOND`) it is some 2^−200 of the matrix's norm, far below the
 * rounding error every sweep already makes, and a block that small cannot be swept (its products
 * underflow: a fast state's column in a monodromy matrix, e^−T/τ, meets another such one).
 * LAPACK's hqr deflates on an absolute threshold for the same reason.
 */
const NEGLIGIBLE = 2 ** -500;

/** The power of two A is divided by before the iteration (1: none, see `SCALED_BEYOND`). */
function exactScale(a: Float64Array): number {
  let largest = 0;
  for (let k = 0; k < a.length; k++) largest = Math.max(largest, Math.abs(a[k]!));
  if (!(largest > 0 && largest < 1 / SCALED_BEYOND) && !(largest > SCALED_BEYOND && largest < Infinity)) return 1;
  return 2 ** Math.round(Math.log2(largest));
}

function isSymmetric(a: Float64Array, n: number): boolean {
  for (let i = 0; i < n; i++) for (let j = 0; j < i; j++) if (a[i * n + j] !== a[j * n + i]) return false;
  return true;
}

/** H in place to upper Hessenberg form by Householder similarity transformations (orthes). */
function hessenberg(h: Float64Array, n: number, check?: () => void): void {
  const high = n - 1;
  const ort = new Float64Array(n);
  for (let m = 1; m <= high - 1; m++) {
    if (check && (m & CHECK_EVERY) === 0) check();
    let scale = 0;
    for (let i = m; i <= high; i++) scale = scale + Math.abs(h[i * n + m - 1]!);
    if (scale === 0) continue;
    let sum = 0;
    for (let i = high; i >= m; i--) {
      ort[i] = h[i * n + m - 1]! / scale;
      sum += ort[i]! * ort[i]!;
    }
    let g = Math.sqrt(sum);
    if (ort[m]! > 0) g = -g;
    sum = sum - ort[m]! * g;
    ort[m] = ort[m]! - g;
    for (let j = m; j < n; j++) {
      let f = 0;
      for (let i = high; i >= m; i--) f += ort[i]! * h[i * n + j]!;
      f = f / sum;
      for (let i = m; i <= high; i++) h[i * n + j] = h[i * n + j]! - f * ort[i]!;
    }
    for (let i = 0; i <= high; i++) {
      let f = 0;
      for (let j = high; j >= m; j--) f += ort[j]! * h[i * n + j]!;
      f = f / sum;
      for (let j = m; j <= high; j++) h[i * n + j] = h[i * n + j]! - f * ort[j]!;
    }
    ort[m] = scale * ort[m]!;
    h[m * n + m - 1] = scale * g;
  }
}

/**
 * Sweeps allowed per eigenvalue (LAPACK's bound; common practice): two or three are typical,
 * and the exceptional shifts come at 10 and 30.
 */
const MAX_SWEEPS = 30;

/**
 * The QR iteration's state between sweeps, by index: the accumulated shift and the sweep's shift
 * parameters x, y, w (doubles from the start: an object whose fields start as small integers
 * changes shape when they turn fractional, and its readers get deoptimised).
 */
const EXSHIFT = 0;
/**
 * The caller's `check` (a run's limits) is called every 16 columns of the reduction and every 16
 * QR sweeps: each costs O(n²), so at some thousand unknowns a pass takes seconds.
 */
const CHECK_EVERY = 15;

const X = 1;
const Y = 2;
const W = 3;

/** The eigenvalues of the Hessenberg matrix H (destroyed) by the double-shift QR iteration (hqr). */
function shiftedQr(h: Float64Array, nn: number, re: Float64Array, im: Float64Array, check?: () => void): void {
  const eps = Number.EPSILON;
  let norm = 0;
  for (let i = 0; i < nn; i++) for (let j = Math.max(i - 1, 0); j < nn; j++) norm = norm + Math.abs(h[i * nn + j]!);
  const shift = new Float64Array(4);
  let n = nn - 1;
  let iter = 0;
  let sweeps = 0;
  while (n >= 0) {
    // The lowest negligible subdiagonal entry above row n (0 when there is none).
    let l = n;
    while (l > 0) {
      let s = Math.abs(h[(l - 1) * nn + l - 1]!) + Math.abs(h[l * nn + l]!);
      if (s === 0) s = norm;
      if (Math.abs(h[l * nn + l - 1]!) < eps * s || Math.abs(h[l * nn + l - 1]!) < NEGLIGIBLE) break;
      l--;
    }
    if (l === n) {
      h[n * nn + n] = h[n * nn + n]! + shift[EXSHIFT]!;
      re[n] = h[n * nn + n]!;
      im[n] = 0;
      n--;
      iter = 0;
    } else if (l === n - 1) {
      twoRoots(h, nn, n, shift[EXSHIFT]!, re, im);
      n = n - 2;
      iter = 0;
    } else {
      if (check && (sweeps & CHECK_EVERY) === 0) check();
      if (++sweeps > MAX_SWEEPS * nn) throw simulationError("eigenvalues-not-converged", `the eigenvalues of a ${nn}×${nn} matrix did not converge in ${MAX_SWEEPS * nn} QR sweeps`);
      shiftOf(h, nn, l, n, iter, shift);
      iter = iter + 1;
      sweep(h, nn, l, n, shift);
    }
  }
}

/** The two eigenvalues of the 2×2 block ending at row n. */
function twoRoots(h: Float64Array, nn: number, n: number, exshift: number, re: Float64Array, im: Float64Array): void {
  const w = h[n * nn + n - 1]! * h[(n - 1) * nn + n]!;
  const p = (h[(n - 1) * nn + n - 1]! - h[n * nn + n]!) / 2;
  const q = p * p + w;
  let z = Math.sqrt(Math.abs(q));
  h[n * nn + n] = h[n * nn + n]! + exshift;
  h[(n - 1) * nn + n - 1] = h[(n - 1) * nn + n - 1]! + exshift;
  const x = h[n * nn + n]!;
  if (q >= 0) {
    z = p >= 0 ? p + z : p - z;
    re[n - 1] = x + z;
    re[n] = re[n - 1]!;
    if (z !== 0) re[n] = x - w / z;
    im[n - 1] = 0;
    im[n] = 0;
  } else {
    re[n - 1] = x + p;
    re[n] = x + p;
    im[n - 1] = z;
    im[n] = -z;
  }
}

/** The sweep's shift: Wilkinson's from the trailing 2×2 block, or an exceptional one after 10 and 30 sweeps without deflation. */
function shiftOf(h: Float64Array, nn: number, l: number, n: number, iter: number, shift: Float64Array): void {
  let x = h[n * nn + n]!;
  let y = 0;
  let w = 0;
  if (l < n) {
    y = h[(n - 1) * nn + n - 1]!;
    w = h[n * nn + n - 1]! * h[(n - 1) * nn + n]!;
  }
  if (iter === 10) {
    shift[EXSHIFT] += x;
    for (let i = 0; i <= n; i++) h[i * nn + i] = h[i * nn + i]! - x;
    const s = Math.abs(h[n * nn + n - 1]!) + Math.abs(h[(n - 1) * nn + n - 2]!);
    x = y = 0.75 * s;
    w = -0.4375 * s * s;
  }
  if (iter === 30) {
    let s = (y - x) / 2;
    s = s * s + w;
    if (s > 0) {
      s = Math.sqrt(s);
      if (y < x) s = -s;
      s = x - w / ((y - x) / 2 + s);
      for (let i = 0; i <= n; i++) h[i * nn + i] = h[i * nn + i]! - s;
      shift[EXSHIFT] += s;
      x = y = w = 0.964;
    }
  }
  shift[X] = x;
  shift[Y] = y;
  shift[W] = w;
}

/** One double-shift QR sweep over rows and columns l…n (Francis' step, by 3×3 Householder reflections). */
function sweep(h: Float64Array, nn: number, l: number, n: number, shift: Float64Array): void {
  const eps = Number.EPSILON;
  let x = shift[X]!;
  let y = shift[Y]!;
  const w = shift[W]!;
  let p = 0;
  let q = 0;
  let r = 0;
  let z = 0;
  let m = n - 2;
  while (m >= l) {
    z = h[m * nn + m]!;
    r = x - z;
    let s = y - z;
    p = (r * s - w) / h[(m + 1) * nn + m]! + h[m * nn + m + 1]!;
    q = h[(m + 1) * nn + m + 1]! - z - r - s;
    r = h[(m + 2) * nn + m + 1]!;
    s = Math.abs(p) + Math.abs(q) + Math.abs(r);
    p = p / s;
    q = q / s;
    r = r / s;
    if (m === l) break;
    if (Math.abs(h[m * nn + m - 1]!) * (Math.abs(q) + Math.abs(r)) < eps * (Math.abs(p) * (Math.abs(h[(m - 1) * nn + m - 1]!) + Math.abs(z) + Math.abs(h[(m + 1) * nn + m + 1]!)))) break;
    m--;
  }
  for (let i = m + 2; i <= n; i++) {
    h[i * nn + i - 2] = 0;
    if (i > m + 2) h[i * nn + i - 3] = 0;
  }
  for (let k = m; k <= n - 1; k++) {
    const notlast = k !== n - 1;
    if (k !== m) {
      p = h[k * nn + k - 1]!;
      q = h[(k + 1) * nn + k - 1]!;
      r = notlast ? h[(k + 2) * nn + k - 1]! : 0;
      x = Math.abs(p) + Math.abs(q) + Math.abs(r);
      if (x !== 0) {
        p = p / x;
        q = q / x;
        r = r / x;
      }
    }
    if (x === 0) break;
    let s = Math.sqrt(p * p + q * q + r * r);
    if (p < 0) s = -s;
    if (s === 0) continue;
    if (k !== m) h[k * nn + k - 1] = -s * x;
    else if (l !== m) h[k * nn + k - 1] = -h[k * nn + k - 1]!;
    p = p + s;
    x = p / s;
    y = q / s;
    z = r / s;
    q = q / p;
    r = r / p;
    // Rows k…k+2 up to the block's last column, then columns k…k+2 from the first row (the
    // rows above the block too: a later sweep may find the block's first subdiagonal no longer negligible).
    for (let j = k; j <= n; j++) {
      p = h[k * nn + j]! + q * h[(k + 1) * nn + j]!;
      if (notlast) {
        p = p + r * h[(k + 2) * nn + j]!;
        h[(k + 2) * nn + j] = h[(k + 2) * nn + j]! - p * z;
      }
      h[k * nn + j] = h[k * nn + j]! - p * x;
      h[(k + 1) * nn + j] = h[(k + 1) * nn + j]! - p * y;
    }
    for (let i = 0; i <= Math.min(n, k + 3); i++) {
      p = x * h[i * nn + k]! + y * h[i * nn + k + 1]!;
      if (notlast) {
        p = p + z * h[i * nn + k + 2]!;
        h[i * nn + k + 2] = h[i * nn + k + 2]! - p * r;
      }
      h[i * nn + k] = h[i * nn + k]! - p;
      h[i * nn + k + 1] = h[i * nn + k + 1]! - p * q;
    }
  }
}

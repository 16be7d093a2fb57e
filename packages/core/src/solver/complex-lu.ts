/**
 * LU factorisation with partial pivoting of a complex n×n matrix held as its real and imaginary
 * parts (row-major), after Golub & Van Loan, *Matrix Computations*, Algorithm 3.4.1, in complex
 * arithmetic: half the work of the 2n×2n real form [[A, −B], [B, A]] of A + jB. The caller
 * writes the matrix into `re` and `im`, then factors (in place) and solves.
 */
export class ComplexLu {
  readonly n: number;
  readonly re: Float64Array;
  readonly im: Float64Array;
  private readonly perm: Int32Array;
  /** Each column's largest squared size before elimination. */
  private readonly columnMax: Float64Array;
  private readonly workRe: Float64Array;
  private readonly workIm: Float64Array;
  /** A pivot smaller than this fraction of its column's largest entry (before elimination) counts as zero. */
  pivotTolerance = 1e-13;

  constructor(n: number) {
    this.n = n;
    this.re = new Float64Array(n * n);
    this.im = new Float64Array(n * n);
    this.perm = new Int32Array(n);
    this.columnMax = new Float64Array(n);
    this.workRe = new Float64Array(n);
    this.workIm = new Float64Array(n);
  }

  /** Factors the matrix in `re`, `im` in place; false when a pivot is zero relative to its column. */
  factor(): boolean {
    const { n, re, im, perm, columnMax } = this;
    columnMax.fill(0);
    for (let i = 0; i < n; i++) {
      perm[i] = i;
      for (let j = 0; j < n; j++) {
        const size = re[i * n + j]! ** 2 + im[i * n + j]! ** 2;
        if (size > columnMax[j]!) columnMax[j] = size;
      }
    }
    for (let k = 0; k < n; k++) {
      let pivotRow = k;
      let pivotSize = re[k * n + k]! ** 2 + im[k * n + k]! ** 2;
      for (let i = k + 1; i < n; i++) {
        const size = re[i * n + k]! ** 2 + im[i * n + k]! ** 2;
        if (size > pivotSize) {
          pivotSize = size;
          pivotRow = i;
        }
      }
      if (!(pivotSize > this.pivotTolerance ** 2 * columnMax[k]!) || pivotSize === 0) return false;
      if (pivotRow !== k) {
        for (let j = 0; j < n; j++) {
          const r = re[k * n + j]!;
          re[k * n + j] = re[pivotRow * n + j]!;
          re[pivotRow * n + j] = r;
          const m = im[k * n + j]!;
          im[k * n + j] = im[pivotRow * n + j]!;
          im[pivotRow * n + j] = m;
        }
        const t = perm[k]!;
        perm[k] = perm[pivotRow]!;
        perm[pivotRow] = t;
      }
      // 1/pivot = conj(pivot)/|pivot|²
      const invRe = re[k * n + k]! / pivotSize;
      const invIm = -im[k * n + k]! / pivotSize;
      for (let i = k + 1; i < n; i++) {
        const ar = re[i * n + k]!;
        const ai = im[i * n + k]!;
        if (ar === 0 && ai === 0) continue;
        const mr = ar * invRe - ai * invIm;
        const mi = ar * invIm + ai * invRe;
        re[i * n + k] = mr;
        im[i * n + k] = mi;
        for (let j = k + 1; j < n; j++) {
          const ur = re[k * n + j]!;
          const ui = im[k * n + j]!;
          re[i * n + j] -= mr * ur - mi * ui;
          im[i * n + j] -= mr * ui + mi * ur;
        }
      }
    }
    return true;
  }

  /** Solves A·x = b for the last factored A (parts apart); `b` and `x` may be the same arrays. */
  solve(bRe: Float64Array, bIm: Float64Array, xRe: Float64Array, xIm: Float64Array): void {
    const { n, re, im, perm, workRe: yr, workIm: yi } = this;
    for (let i = 0; i < n; i++) {
      let sr = bRe[perm[i]!]!;
      let si = bIm[perm[i]!]!;
      for (let j = 0; j < i; j++) {
        const lr = re[i * n + j]!;
        const li = im[i * n + j]!;
        sr -= lr * yr[j]! - li * yi[j]!;
        si -= lr * yi[j]! + li * yr[j]!;
      }
      yr[i] = sr;
      yi[i] = si;
    }
    for (let i = n - 1; i >= 0; i--) {
      let sr = yr[i]!;
      let si = yi[i]!;
      for (let j = i + 1; j < n; j++) {
        const ur = re[i * n + j]!;
        const ui = im[i * n + j]!;
        sr -= ur * yr[j]! - ui * yi[j]!;
        si -= ur * yi[j]! + ui * yr[j]!;
      }
      const pr = re[i * n + i]!;
      const pi = im[i * n + i]!;
      const size = pr * pr + pi * pi;
      yr[i] = (sr * pr + si * pi) / size;
      yi[i] = (si * pr - sr * pi) / size;
    }
    xRe.set(yr);
    xIm.set(yi);
  }
}

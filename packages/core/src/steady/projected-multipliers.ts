import { DenseLu } from "../solver/dense-lu.js";
import { eigenvalues } from "../solver/eigenvalues.js";
import type { MnaSystem } from "../solver/system.js";
import { absoluteTolerances, resolveTolerances, type Tolerances } from "../solver/tolerances.js";
import type { Multiplier, PeriodicOrbit } from "./shooting.js";
import { TangentPeriod } from "./tangent-period.js";

/** Multipliers below this die out within a period (rounding zeros, the algebraic unknowns); the rest span the orbit's lasting modes. */
const MEMORYLESS = 1e-10;
/** Inverse iteration's shift lies this share of the distance to the nearest other multiplier off the multiplier (so the matrix is not exactly singular), and it runs this many solves. */
const SHIFT_OFF = 1e-6;
const INVERSE_STEPS = 2;
/**
 * A multiplier more ill-conditioned than this (nearly repeated, its eigenvectors nearly parallel)
 * leaves the projection to the full monodromy: the rounding of M₁, some 1e-16 of its norm, would
 * reach 1e-12 of it in the projection, against bars down to 3e-8 (a Wien clipped hard at its rails).
 */
const CONDITION_LIMIT = 1e4;

/**
 * The halved grid's multipliers that outlive a period, from the run's own grid's (`coarse`) and
 * one tangent pass per such multiplier (two per complex pair) over the halved grid's last shooting
 * period, which the shooting integrated anyway: in place of the halved grid's whole monodromy
 * matrix M½ (a period with n + 1 sensitivity columns), its oblique projection on the run's own
 * grid's lasting modes, (Uᵀ·V)⁻¹·Uᵀ·M½·V, with V and U the right and left invariant subspaces of
 * M₁ for its multipliers above `MEMORYLESS` (inverse iteration; a complex pair by its real and
 * imaginary parts) — a two-sided Rayleigh–Ritz step (Saad, *Numerical Methods for Large
 * Eigenvalue Problems*, 2nd ed., 2011, §4.3 and §7.1). Its eigenvalues are M½'s up to the
 * coupling through the modes left out, which die within a period on either grid (M½ takes them
 * to rounding zeros, as M₁ does). Null where the run's own grid left no monodromy matrix or the
 * halved one no period (a matrix-free shooting), or where a multiplier is repeated or
 * ill-conditioned (see `CONDITION_LIMIT`): the caller then takes the halved grid's own multipliers.
 */
export function projectedMultipliers(system: MnaSystem, coarse: PeriodicOrbit, fine: PeriodicOrbit, tolerances?: Partial<Tolerances>): Multiplier[] | null {
  const { monodromy } = coarse;
  const run = fine.lastPeriod;
  if (!monodromy || !run) return null;
  const n = system.n;
  // D⁻¹·M₁·D in the unknowns scaled by their peaks (a volt and a milliampere alike).
  const d = absoluteTolerances(system.unknowns, resolveTolerances(tolerances), "newton");
  for (const x of coarse.states) for (let i = 0; i < n; i++) d[i] = Math.max(d[i]!, Math.abs(x[i]!));
  const scaled = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) scaled[i * n + j] = (monodromy[i * n + j]! * d[j]!) / d[i]!;
  const right: Float64Array[] = [];
  const left: Float64Array[] = [];
  for (const m of coarse.multipliers) {
    if (m.im < 0 || Math.hypot(m.re, m.im) < MEMORYLESS) continue;
    const gap = gapOf(m, coarse.multipliers);
    if (!(gap > 0)) return null;
    const v = eigenvector(scaled, n, m, gap, false);
    const u = eigenvector(scaled, n, m, gap, true);
    if (!v || !u) return null;
    if (!(conditionOf(u, v) <= CONDITION_LIMIT)) return null;
    right.push(v.re);
    left.push(u.re);
    if (m.im > 0) {
      right.push(v.im);
      left.push(u.im);
    }
  }
  const k = right.length;
  if (k === 0) return [];
  const tangent = new TangentPeriod(system, run);
  const images = right.map(() => new Float64Array(n));
  tangent.applyEach(right.map((v) => Float64Array.from(v, (x, i) => x * d[i]!)), right.map(() => 0), images);
  // Uᵀ·V and Uᵀ·(D⁻¹·M½·D)·V.
  const gram = new Float64Array(k * k);
  const projected = new Float64Array(k * k);
  for (let c = 0; c < k; c++) {
    const image = images[c]!;
    for (let i = 0; i < n; i++) image[i] = image[i]! / d[i]!;
    for (let r = 0; r < k; r++) {
      gram[r * k + c] = dot(left[r]!, right[c]!);
      projected[r * k + c] = dot(left[r]!, image);
    }
  }
  const lu = new DenseLu(k);
  if (!lu.factor(gram)) return null;
  const column = new Float64Array(k);
  const reduced = new Float64Array(k * k);
  for (let c = 0; c < k; c++) {
    for (let r = 0; r < k; r++) column[r] = projected[r * k + c]!;
    lu.solve(column, column);
    for (let r = 0; r < k; r++) reduced[r * k + c] = column[r]!;
  }
  const { re, im } = eigenvalues(reduced, k);
  return Array.from(re, (v, j) => ({ re: v, im: im[j]! }));
}

/**
 * The condition number ‖u‖·‖v‖/|uᵀ·v| of the multiplier with right and left eigenvectors v and u
 * (complex, by parts): how much more than M's own rounding its projection can be off (Wilkinson,
 * *The Algebraic Eigenvalue Problem*, 1965, §2.8).
 */
function conditionOf(u: { re: Float64Array; im: Float64Array }, v: { re: Float64Array; im: Float64Array }): number {
  const re = dot(u.re, v.re) - dot(u.im, v.im);
  const im = dot(u.re, v.im) + dot(u.im, v.re);
  const norm = (w: { re: Float64Array; im: Float64Array }) => Math.sqrt(dot(w.re, w.re) + dot(w.im, w.im));
  return (norm(u) * norm(v)) / Math.hypot(re, im);
}

/** The distance from `m` to the nearest other multiplier (its conjugate included). */
function gapOf(m: Multiplier, all: readonly Multiplier[]): number {
  let gap = Infinity;
  let self = false;
  for (const o of all) {
    const distance = Math.hypot(o.re - m.re, o.im - m.im);
    // (The multiplier itself, once.)
    if (distance === 0 && !self) {
      self = true;
      continue;
    }
    gap = Math.min(gap, distance);
  }
  return gap;
}

function dot(a: Float64Array, b: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < a.length; i++) sum += a[i]! * b[i]!;
  return sum;
}

/**
 * The right (or, `transposed`, left) eigenvector of A (n × n, row-major) for its eigenvalue μ
 * (imaginary part ≥ 0), as real and imaginary parts, by inverse iteration from a fixed start,
 * the shift `SHIFT_OFF`·gap off μ; a complex μ in the real form [[A − a, b], [−b, A − a]] of
 * A − (a + ib). Null where the shifted matrix is singular.
 */
function eigenvector(a: Float64Array, n: number, m: Multiplier, gap: number, transposed: boolean): { re: Float64Array; im: Float64Array } | null {
  const complex = m.im > 0;
  const size = complex ? 2 * n : n;
  const s = m.re + SHIFT_OFF * (Number.isFinite(gap) ? gap : Math.max(1, Math.hypot(m.re, m.im)));
  const matrix = new Float64Array(size * size);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const value = transposed ? a[j * n + i]! : a[i * n + j]!;
      matrix[i * size + j] = value;
      if (complex) matrix[(n + i) * size + n + j] = value;
    }
    matrix[i * size + i] -= s;
    if (complex) {
      matrix[(n + i) * size + n + i] -= s;
      matrix[i * size + n + i] = m.im;
      matrix[(n + i) * size + i] = -m.im;
    }
  }
  const lu = new DenseLu(size);
  lu.pivotTolerance = 0;
  if (!lu.factor(matrix)) return null;
  const x = new Float64Array(size);
  let seed = 0x2545f491;
  for (let i = 0; i < size; i++) {
    seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
    x[i] = seed / 2 ** 32 - 0.5;
  }
  for (let step = 0; step < INVERSE_STEPS; step++) {
    lu.solve(x, x);
    let largest = 0;
    for (let i = 0; i < size; i++) largest = Math.max(largest, Math.abs(x[i]!));
    if (!(largest > 0 && largest < Infinity)) return null;
    for (let i = 0; i < size; i++) x[i] = x[i]! / largest;
  }
  return { re: x.slice(0, n), im: complex ? x.slice(n) : new Float64Array(n) };
}


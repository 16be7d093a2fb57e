import { EigenvalueDecomposition, Matrix } from "ml-matrix";
import { orthogonalise } from "./gmres.js";
import type { Multiplier } from "./shooting.js";
import type { TangentPeriod } from "./tangent-period.js";

/** A Ritz value with its residual ‖M·v − θ·v‖ for its unit Ritz vector v (in the scaled unknowns). */
export interface RitzMultiplier extends Multiplier {
  readonly residual: number;
}

/**
 * Largest number of Arnoldi steps (tangent passes at the orbit) for the multipliers. 200 passes
 * cost about as much as 100 plain periods; 300 sections of an R–C chain (307 unknowns, its
 * multipliers 0.9992, 0.9927, 0.9798, … crowding the trivial 1) need 40. @defaultValue 200
 */
export const MULTIPLIER_PRODUCTS = 200;
/** The largest Ritz values returned even when not converged: an autonomous orbit's trivial one and the largest other. */
const ALWAYS_KEPT = 2;
/** The Ritz pairs are checked every this many steps (each check an eigen-decomposition of the small Hessenberg matrix). */
const CHECK_EVERY = 10;
/** Arnoldi goes on until this many of the largest Ritz values have converged (the report lists four, the trivial one aside)… */
const WANTED = 6;
/** …each to a residual ‖M·v − θ·v‖ at most this (the multiplier is dimensionless; the grid bars on the R–C chains are 1e-7 … 1e-4, and the residual enters them). */
export const RITZ_TOLERANCE = 1e-7;

/**
 * The dominant Floquet multipliers: Ritz values of the scaled monodromy matrix D⁻¹·S_x·D (similar
 * to S_x, so the same eigenvalues) from an Arnoldi run (Saad, *Numerical Methods for Large
 * Eigenvalue Problems*, 2nd ed., §6.2), largest magnitude first, each with its residual. The
 * Arnoldi relation M·V_k = V_k·H_k + h_{k+1,k}·v_{k+1}·e_kᵀ gives a Ritz pair (θ, V_k·y)'s residual
 * for free: |h_{k+1,k}|·|e_kᵀy| for ‖y‖ = 1 (ibid., Proposition 6.8). The run goes on, every
 * `CHECK_EVERY` steps, until the `WANTED` largest Ritz values have residuals within
 * `RITZ_TOLERANCE`, or the subspace is invariant, or `limit` passes are made. Only the largest
 * Ritz values down to the first one not converged are returned, and always the `ALWAYS_KEPT`
 * largest: a Ritz value short of convergence is no measurement, but the largest one (beside an
 * autonomous orbit's trivial one) carries the stability verdict, and with its residual in its bar
 * and in the verdict (see `orbitStability`) it says how far it is known. Gram–Schmidt is run twice
 * (Daniel, Gragg, Kaufman & Stewart 1976), since a long run loses orthogonality and a converged
 * pair would come back as a ghost copy. The start vector is fixed (a seeded sequence), so the
 * result depends on nothing but the orbit.
 */
export function ritzMultipliers(tangent: Pick<TangentPeriod, "n" | "apply">, scale: Float64Array, limit: number, check: (() => void) | undefined): RitzMultiplier[] {
  const n = tangent.n;
  const steps = Math.max(1, Math.min(n, limit));
  const basis: Float64Array[] = [new Float64Array(n)];
  const hessenberg = new Matrix(steps + 1, steps);
  const h = new Float64Array(steps + 1);
  const again = new Float64Array(steps + 1);
  const v = new Float64Array(n);
  const end = new Float64Array(n);
  let seed = 0x2545f491;
  for (let i = 0; i < n; i++) {
    seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
    basis[0]![i] = seed / 2 ** 32 - 0.5;
  }
  const h0 = orthogonalise(basis[0]!, [], 0, h);
  for (let i = 0; i < n; i++) basis[0]![i] = basis[0]![i]! / h0;
  let ritz: RitzMultiplier[] = [];
  for (let j = 0; j < steps; j++) {
    check?.();
    const w = new Float64Array(n);
    for (let i = 0; i < n; i++) v[i] = basis[j]![i]! * scale[i]!;
    tangent.apply(v, 0, end);
    for (let i = 0; i < n; i++) w[i] = end[i]! / scale[i]!;
    orthogonalise(w, basis, j + 1, h);
    const next = orthogonalise(w, basis, j + 1, again);
    let column = 0;
    for (let i = 0; i <= j; i++) {
      hessenberg.set(i, j, h[i]! + again[i]!);
      column = Math.max(column, Math.abs(h[i]! + again[i]!));
    }
    hessenberg.set(j + 1, j, next);
    // (An invariant subspace: its Ritz values are eigenvalues.)
    const invariant = !(next > 1e-12 * Math.max(column, next));
    const size = j + 1;
    if (invariant || size === steps || size % CHECK_EVERY === 0) {
      ritz = ritzPairs(hessenberg, size, next);
      const wanted = Math.min(WANTED, ritz.length);
      if (invariant || ritz.slice(0, wanted).every((m) => m.residual <= RITZ_TOLERANCE)) break;
    }
    for (let i = 0; i < n; i++) w[i] = w[i]! / next;
    basis.push(w);
  }
  const unconverged = ritz.findIndex((m) => !(m.residual <= RITZ_TOLERANCE));
  if (unconverged < 0) return ritz;
  // (A complex pair is one answer: both its values, or neither.)
  let kept = Math.max(ALWAYS_KEPT, unconverged);
  if (kept < ritz.length && ritz[kept]!.im !== 0 && ritz[kept]!.im === -ritz[kept - 1]!.im) kept++;
  return ritz.slice(0, kept);
}

/** The Ritz values of the leading `size` × `size` block of the Hessenberg matrix, largest magnitude first, with residuals |`next`|·|e_kᵀy|. */
function ritzPairs(hessenberg: Matrix, size: number, next: number): RitzMultiplier[] {
  const eig = new EigenvalueDecomposition(hessenberg.subMatrix(0, size - 1, 0, size - 1));
  const vectors = eig.eigenvectorMatrix;
  const re = eig.realEigenvalues;
  const im = eig.imaginaryEigenvalues;
  const pairs: RitzMultiplier[] = [];
  for (let k = 0; k < size; k++) {
    // A complex pair's eigenvector is the columns k and k + 1 (real and imaginary parts) of the first of the two.
    const first = im[k]! !== 0 && k > 0 && im[k - 1] === -im[k]! ? k - 1 : k;
    const columns = im[k]! !== 0 ? [first, first + 1] : [k];
    let square = 0;
    for (let i = 0; i < size; i++) for (const c of columns) square += vectors.get(i, c) ** 2;
    let last = 0;
    for (const c of columns) last += vectors.get(size - 1, c) ** 2;
    pairs.push({ re: re[k]!, im: im[k]!, residual: Math.abs(next) * Math.sqrt(last / Math.max(square, Number.MIN_VALUE)) });
  }
  return pairs.sort((a, b) => Math.hypot(b.re, b.im) - Math.hypot(a.re, a.im));
}

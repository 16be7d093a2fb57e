/** y = A·x for a matrix known only through its products. */
export type LinearOperator = (x: Float64Array, y: Float64Array) => void;

/** Where {@link gmres} stops. */
export interface GmresOptions {
  /** Stop once ‖b − A·x‖₂ is at most this. */
  readonly tolerance: number;
  /** Krylov vectors kept before a restart. */
  readonly restart: number;
  /** Largest number of products with A, restarts' residuals included. */
  readonly maxProducts: number;
}

/**
 * The last cycle's least-squares problem: x = x_c + V·y minimises ‖Ry − g‖² + g_k² (k = V's
 * vectors), with V orthonormal, R upper triangular (k × k, row-major) and g (k + 1 entries) the
 * rotated right-hand side: the linear model of ‖b − A·x‖ on the Krylov subspace.
 */
export interface KrylovModel {
  readonly basis: readonly Float64Array[];
  readonly triangular: Float64Array;
  readonly rotated: Float64Array;
  /** Whether the cycle started from x_c ≠ 0 (after a restart). */
  readonly restarted: boolean;
}

export interface GmresResult {
  readonly x: Float64Array;
  readonly model: KrylovModel;
  /** ‖b − A·x‖₂ (as the least-squares problem tracks it). */
  readonly residual: number;
  readonly products: number;
  readonly converged: boolean;
}

/**
 * Modified Gram–Schmidt: w minus its projections on basis[0..count−1], the coefficients into
 * `h` (h[i] = vᵢ·w); returns ‖w‖ after. The basis is orthonormal, so this is one Arnoldi step's
 * orthogonalisation (Saad, *Iterative Methods for Sparse Linear Systems*, 2nd ed., Algorithm 6.2).
 */
export function orthogonalise(w: Float64Array, basis: readonly Float64Array[], count: number, h: Float64Array): number {
  for (let i = 0; i < count; i++) {
    const v = basis[i]!;
    let dot = 0;
    for (let k = 0; k < w.length; k++) dot += v[k]! * w[k]!;
    h[i] = dot;
    for (let k = 0; k < w.length; k++) w[k] -= dot * v[k]!;
  }
  let square = 0;
  for (let k = 0; k < w.length; k++) square += w[k]! * w[k]!;
  return Math.sqrt(square);
}

/**
 * Restarted GMRES(m) from x = 0 (Saad & Schultz 1986): the x in x₀ + K_m(A, r₀) minimising
 * ‖b − A·x‖₂, the Krylov basis built by Arnoldi with modified Gram–Schmidt and the Hessenberg
 * least-squares problem kept triangular by Givens rotations, so that its residual is known at
 * every product without forming x. A breakdown (the new vector in the span already) means the
 * subspace holds the exact solution.
 */
export function gmres(apply: LinearOperator, b: Float64Array, options: GmresOptions): GmresResult {
  const size = b.length;
  const m = Math.max(1, Math.min(options.restart, size));
  const x = new Float64Array(size);
  const r = Float64Array.from(b);
  const basis = Array.from({ length: m + 1 }, () => new Float64Array(size));
  // Column j of the rotated Hessenberg matrix (the triangular R), j + 2 entries each.
  const columns = Array.from({ length: m }, () => new Float64Array(m + 1));
  const cos = new Float64Array(m);
  const sin = new Float64Array(m);
  const g = new Float64Array(m + 1);
  const y = new Float64Array(m);
  let products = 0;
  let residual = norm(r);
  let model: KrylovModel = { basis: [], triangular: new Float64Array(0), rotated: Float64Array.of(residual), restarted: false };
  let cycles = 0;
  while (residual > options.tolerance && products < options.maxProducts) {
    const beta = residual;
    for (let k = 0; k < size; k++) basis[0]![k] = r[k]! / beta;
    g.fill(0);
    g[0] = beta;
    let used = 0;
    let breakdown = false;
    for (let j = 0; j < m && products < options.maxProducts; j++) {
      const w = basis[j + 1]!;
      apply(basis[j]!, w);
      products++;
      const h = columns[j]!;
      const next = orthogonalise(w, basis, j + 1, h);
      h[j + 1] = next;
      for (let i = 0; i < j; i++) {
        const a = h[i]!;
        const c = h[i + 1]!;
        h[i] = cos[i]! * a + sin[i]! * c;
        h[i + 1] = -sin[i]! * a + cos[i]! * c;
      }
      const radius = Math.hypot(h[j]!, next);
      cos[j] = radius > 0 ? h[j]! / radius : 1;
      sin[j] = radius > 0 ? next / radius : 0;
      h[j] = radius;
      h[j + 1] = 0;
      g[j + 1] = -sin[j]! * g[j]!;
      g[j] = cos[j]! * g[j]!;
      residual = Math.abs(g[j + 1]!);
      used = j + 1;
      // (A new vector this small against the product it came from: the subspace is invariant.)
      breakdown = !(next > 1e-14 * radius);
      if (breakdown || residual <= options.tolerance) break;
      for (let k = 0; k < size; k++) w[k] = w[k]! / next;
    }
    // R·y = g by back substitution, then x += V·y.
    for (let i = used - 1; i >= 0; i--) {
      let sum = g[i]!;
      for (let k = i + 1; k < used; k++) sum -= columns[k]![i]! * y[k]!;
      const pivot = columns[i]![i]!;
      y[i] = pivot !== 0 ? sum / pivot : 0;
    }
    for (let i = 0; i < used; i++) {
      const v = basis[i]!;
      for (let k = 0; k < size; k++) x[k] += y[i]! * v[k]!;
    }
    const triangular = new Float64Array(used * used);
    for (let j = 0; j < used; j++) for (let i = 0; i <= j; i++) triangular[i * used + j] = columns[j]![i]!;
    model = { basis: basis.slice(0, used), triangular, rotated: g.slice(0, used + 1), restarted: cycles++ > 0 };
    if (breakdown || residual <= options.tolerance || products >= options.maxProducts) break;
    // The restart's residual, computed (the tracked one drifts from it in rounding).
    apply(x, r);
    products++;
    for (let k = 0; k < size; k++) r[k] = b[k]! - r[k]!;
    residual = norm(r);
  }
  return { x, model, residual, products, converged: residual <= options.tolerance };
}

function norm(v: Float64Array): number {
  let square = 0;
  for (let k = 0; k < v.length; k++) square += v[k]! * v[k]!;
  return Math.sqrt(square);
}

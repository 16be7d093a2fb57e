import type { SmallSignal } from "./linearize.js";

/**
 * Fills `m` (2n×2n, row-major) with the real form [[A, −ωB], [ωB, A]] of A + jω·B, where A, B
 * are the small-signal G and C, or their transposes (the adjoint system) when `transposed`.
 * Solving it for [Re; Im] solves the complex system.
 */
export function fillPhasorMatrix(ss: SmallSignal, omega: number, m: Float64Array, transposed: boolean): void {
  const { n, G, C } = ss;
  const n2 = 2 * n;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const at = transposed ? j * n + i : i * n + j;
      const g = G[at]!;
      const c = omega * C[at]!;
      m[i * n2 + j] = g;
      m[i * n2 + n + j] = -c;
      m[(n + i) * n2 + j] = c;
      m[(n + i) * n2 + n + j] = g;
    }
  }
}

import type { SmallSignal } from "./linearize.js";

/**
 * Fills `m` (2n×2n, row-major) with the real form [[A, −ωB], [ωB, A]] of A + jω·B, where A, B
 * are the small-signal G + σ·C and C (the pencil at s = σ + jω; σ = 0 on the jω axis), or their
 * transposes (the adjoint system) when `transposed`. Solving it for [Re; Im] solves the complex system.
 */
export function fillPhasorMatrix(ss: SmallSignal, omega: number, m: Float64Array, transposed: boolean, sigma = 0): void {
  const { n, G, C } = ss;
  const n2 = 2 * n;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const at = transposed ? j * n + i : i * n + j;
      const g = sigma === 0 ? G[at]! : G[at]! + sigma * C[at]!;
      const c = omega * C[at]!;
      m[i * n2 + j] = g;
      m[i * n2 + n + j] = -c;
      m[(n + i) * n2 + j] = c;
      m[(n + i) * n2 + n + j] = g;
    }
  }
}

/** The entries of the real form (of the transposes when `transposed`) that may be nonzero, the same at every s; the diagonal always. */
export function phasorPattern(ss: SmallSignal, transposed: boolean): Uint8Array {
  const { n, G, C } = ss;
  const n2 = 2 * n;
  const pattern = new Uint8Array(n2 * n2);
  for (let i = 0; i < n; i++) {
    pattern[i * n2 + i] = 1;
    pattern[(n + i) * n2 + n + i] = 1;
    for (let j = 0; j < n; j++) {
      const at = transposed ? j * n + i : i * n + j;
      if (G[at] === 0 && C[at] === 0) continue;
      pattern[i * n2 + j] = 1;
      pattern[i * n2 + n + j] = 1;
      pattern[(n + i) * n2 + j] = 1;
      pattern[(n + i) * n2 + n + j] = 1;
    }
  }
  return pattern;
}

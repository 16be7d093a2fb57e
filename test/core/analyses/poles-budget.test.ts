// The poles' O(n³) passes (A⁻¹C column by column, the Hessenberg reduction, the QR sweeps) call
// the run's limits along the way: at a couple of thousand unknowns they take tens of seconds, and
// `--time-limit 20` overran to 44 s on a 2010-unknown ladder before they did.
import { describe, expect, test } from "vitest";
import { eigenvalues, pencilPoles } from "@onset/core/engine";

/**
 * An R–C ladder of `n` sections (R from the source end, which is grounded, C from each node to
 * ground, the far end open): G tridiagonal, C diagonal. Closed form (mathematics: the tridiagonal
 * matrix with one Dirichlet and one Neumann end): s_k = −(2 − 2·cos((2k − 1)π/(2n + 1)))/(RC).
 */
function ladder(n: number, r: number, c: number) {
  const G = new Float64Array(n * n);
  const C = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    G[i * n + i] = (i === n - 1 ? 1 : 2) / r;
    if (i > 0) G[i * n + i - 1] = G[(i - 1) * n + i] = -1 / r;
    C[i * n + i] = c;
  }
  return { n, G, C };
}

describe("pencilPoles(ss, check) and eigenvalues(a, n, check)", () => {
  const n = 160;
  const ss = ladder(n, 1e3, 1e-9);

  test("the check is called along the passes (at least every 16 columns) and changes no pole: the ladder's closed form", () => {
    let calls = 0;
    const poles = pencilPoles(ss, () => void calls++);
    expect(calls).toBeGreaterThanOrEqual((2 * n) / 16);
    expect(poles).toEqual(pencilPoles(ss));
    const closed = Array.from({ length: n }, (_, k) => -(2 - 2 * Math.cos(((2 * k + 1) * Math.PI) / (2 * n + 1))) / 1e-6).sort((a, b) => b - a);
    expect(poles).toHaveLength(n);
    poles.forEach((p, k) => {
      expect(Math.abs(p.imag)).toBeLessThan(1e-6 * Math.abs(closed[k]!));
      expect(Math.abs(p.real / closed[k]! - 1)).toBeLessThan(1e-8);
    });
  });

  test("a check that throws stops the pass with its error, inside the reduction and inside the QR sweeps", () => {
    const stop = new Error("limit");
    let calls = 0;
    expect(() => pencilPoles(ss, () => { if (++calls === 12) throw stop; })).toThrow(stop);
    expect(calls).toBe(12);
    // A non-symmetric matrix (the symmetric one goes to the library): count the reduction's calls, then stop in the sweeps.
    const a = Float64Array.from({ length: n * n }, (_, k) => Math.sin(k * 0.7) + (k % (n + 1) === 0 ? 3 : 0));
    let reduction = 0;
    const full = eigenvalues(a, n, () => void reduction++);
    expect(full).toEqual(eigenvalues(a, n));
    const inReduction = Math.ceil((n - 2) / 16);
    expect(reduction).toBeGreaterThan(inReduction);
    let sweeps = 0;
    expect(() => eigenvalues(a, n, () => { if (++sweeps > inReduction) throw stop; })).toThrow(stop);
  });
});

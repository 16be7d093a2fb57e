import type { Multiplier } from "./shooting.js";

/** A multiplier within this of the unit circle is neither attracting nor repelling to the map's accuracy. */
const MARGIN = 1e-6;
/** Multipliers below this are the algebraic unknowns and modes that die out within a period (rounding zeros): not listed. */
const MEMORYLESS = 1e-10;
/** The disturbance left after the reported number of periods. */
const SETTLED_SHARE = 0.01;

/** How an orbit answers a small disturbance: from its largest non-trivial Floquet multiplier. */
export interface OrbitStability {
  /** `stable`: every disturbance dies out; `unstable`: some grows; `marginal`: the largest is on the unit circle to the map's accuracy. */
  readonly verdict: "stable" | "unstable" | "marginal";
  /** The largest non-trivial multiplier, or null when there is none (a one-state circuit's autonomous orbit). */
  readonly largest: Multiplier | null;
  /** 1/s: ln|μ|/T, the disturbance's growth (positive) or decay (negative) rate. */
  readonly rate: number | null;
  /** Periods for a disturbance to shrink to 1 % (stable orbits only). */
  readonly cyclesToSettle: number | null;
}

/**
 * The multipliers that say something about stability: an autonomous orbit's monodromy matrix
 * has the eigenvalue 1 (a shift along the orbit neither grows nor shrinks), so the multiplier
 * nearest 1 is dropped (a driven orbit has no trivial one); so are those below 1e-10, the
 * algebraic unknowns' and the modes that die out within a period.
 */
export function nonTrivialMultipliers(multipliers: readonly Multiplier[], autonomous: boolean): Multiplier[] {
  const telling = (m: Multiplier) => Math.hypot(m.re, m.im) >= MEMORYLESS;
  const trivial = trivialIndex(multipliers, autonomous);
  return multipliers.filter((m, k) => k !== trivial && telling(m));
}

/**
 * An autonomous orbit's trivial multiplier (the one nearest 1, which `nonTrivialMultipliers`
 * leaves out): exactly 1 for the exact orbit, so its distance from 1 shows the grid's error.
 * Null for a driven orbit, which has none.
 */
export function trivialMultiplier(multipliers: readonly Multiplier[], autonomous: boolean): Multiplier | null {
  return multipliers[trivialIndex(multipliers, autonomous)] ?? null;
}

/** The index of the multiplier nearest 1 for an autonomous orbit; −1 for a driven one or none. */
function trivialIndex(multipliers: readonly Multiplier[], autonomous: boolean): number {
  if (!autonomous || multipliers.length === 0) return -1;
  let trivial = 0;
  for (let k = 1; k < multipliers.length; k++) {
    const m = multipliers[k]!;
    const t = multipliers[trivial]!;
    if (Math.hypot(m.re - 1, m.im) < Math.hypot(t.re - 1, t.im)) trivial = k;
  }
  return trivial;
}

/** The orbit's stability from its non-trivial multipliers (largest magnitude first) and its period. */
export function orbitStability(nonTrivial: readonly Multiplier[], period: number): OrbitStability {
  const largest = nonTrivial.reduce<Multiplier | null>((best, m) => (best === null || Math.hypot(m.re, m.im) > Math.hypot(best.re, best.im) ? m : best), null);
  if (largest === null) return { verdict: "stable", largest: null, rate: null, cyclesToSettle: null };
  const size = Math.hypot(largest.re, largest.im);
  // (A Ritz value short of convergence is known only to within its residual.)
  const known = MARGIN + residualOf(largest);
  const verdict = size > 1 + known ? "unstable" : size < 1 - known ? "stable" : "marginal";
  const rate = size > 0 ? Math.log(size) / period : -Infinity;
  const cyclesToSettle = verdict === "stable" ? (size > 0 ? Math.log(SETTLED_SHARE) / Math.log(size) : 0) : null;
  return { verdict, largest, rate: Number.isFinite(rate) ? rate : null, cyclesToSettle };
}

/**
 * Error bars of the run's own grid's multipliers (`reported`, as listed), one each: twice their
 * distance in the complex plane from the nearest of the halved grid's (`finer`). The map's
 * derivative is the product of its steps' derivatives, second order in the step where the orbit
 * is smooth and first order across a corner inside a step (a rail or a diode turning on), so the
 * error shrinks at least as the step: e₁ − e½ ≥ e₁·(1 − 2⁻ᵖ) with p ≥ 1, hence
 * e₁ ≤ |μ₁ − μ½|/(1 − 2⁻ᵖ) ≤ 2·|μ₁ − μ½|; Ritz values (a matrix-free run) add their residuals
 * (see `residualOf`). Null without the finer grid's multipliers (empty
 * when nothing is listed).
 */
export function multiplierBars(reported: readonly Multiplier[], finer: readonly Multiplier[]): number[] | null {
  if (finer.length === 0) return reported.length === 0 ? [] : null;
  return reported.map((m) => {
    let bar = Infinity;
    for (const f of finer) bar = Math.min(bar, 2 * (Math.hypot(f.re - m.re, f.im - m.im) + residualOf(m) + residualOf(f)) + residualOf(m));
    return bar;
  });
}

/**
 * A Ritz value's residual ‖M·v − θ·v‖ (see `ritzMultipliers`); zero for an eigenvalue of the whole
 * monodromy matrix. For a normal matrix it bounds the distance to an eigenvalue (Bauer–Fike); in
 * general it is a backward error, θ being an exact eigenvalue of M + E with ‖E‖ equal to it. In
 * the bars it stands for the distance both ways: each grid's true multiplier within its residual
 * of its Ritz value, so |μ₁ − μ½| ≤ |θ₁ − θ½| + r₁ + r½, and the reported θ₁ within r₁ of μ₁.
 */
function residualOf(m: Multiplier): number {
  return "residual" in m && typeof m.residual === "number" ? m.residual : 0;
}

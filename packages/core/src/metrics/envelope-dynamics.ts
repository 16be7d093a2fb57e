import { envelopeFitAt, fitSecondOrder, type EnvelopeFit } from "./envelope-fit.js";
import { SETTLING_BAND } from "./settling.js";

/**
 * The slow dynamics of a per-cycle envelope after it first reached its final level: the fit of a
 * decaying oscillation (a bounce) or of a creep, and what they say about settling.
 */
export interface EnvelopeDynamics {
  /** Hz: the damped frequency of the envelope's bounce, ω_d/2π; null when it settles without bouncing. */
  readonly bounceFrequency: number | null;
  /** ζ = σ/√(σ² + ω_d²) of the bounce (negative when it grows); null when it settles without bouncing. */
  readonly dampingRatio: number | null;
  /** The fit the figures come from, null when the envelope's structure is lost in its noise or the window is short. */
  readonly fit: EnvelopeFit | null;
  /** Relative: the most the envelope may still move away from the fitted level after the record's end. */
  readonly remaining: number;
  /** 1/s: the slowest fitted decay rate (≤ 0: not decaying), null without a fit. */
  readonly slowestRate: number | null;
  /** The bounce keeps going over the window (at least {@link SUSTAINED_BOUNCES} bounces, losing under {@link SUSTAINED_LOSS}). */
  readonly sustained: boolean;
}

/** Fewest cycles in the fitted window. */
export const MIN_FIT_CYCLES = 12;
/** The window starts where the envelope first reaches this share of its final level… */
const REACHED = 0.9;
/** A bounce counts when its fit leaves under this share of the creep fit's residual… */
const BOUNCE_PREFERENCE = 0.5;
/** …and under this share of the window's variance, and at least half a bounce lies in the window. */
const EXPLAINED = 0.2;
/** A fit leaving more than this share of the variance unexplained says nothing about settling. */
const NOISE_LIKE = 0.5;
/** A bounce is sustained over at least this many bounces… */
export const SUSTAINED_BOUNCES = 3;
/** …if it loses less than this share of its amplitude across the window. */
export const SUSTAINED_LOSS = 0.2;

const NONE: EnvelopeDynamics = { bounceFrequency: null, dampingRatio: null, fit: null, remaining: 0, slowestRate: null, sustained: false };

/**
 * …after the last cycle whose envelope is further than this share from that level (a collapse, a
 * wild overshoot: large-signal swings bounce more slowly than the loop's small-signal bounce).
 */
const FAR = 0.2;

/**
 * Where the fitted window starts: after the last cycle further than {@link FAR} of `level` from
 * it (the growth, a collapse and restart, a wild overshoot: the loop's large-signal part), the
 * first cycle whose envelope reaches 90 % of `level`, or the first peak after it when that peak
 * overshoots the level by more than the settling band (the bounce then starts from the
 * overshoot, not from the end of the growth).
 */
export function fitWindowStart(e: Float64Array, level: number): number {
  const n = e.length;
  let s = n;
  while (s > 0 && Math.abs(e[s - 1] - level) <= FAR * level) s--;
  while (s < n && e[s] < REACHED * level) s++;
  let k = s;
  while (k + 1 < n && e[k + 1] > e[k]) k++;
  return k < n && e[k] > (1 + SETTLING_BAND) * level ? k : s;
}

/** The window ends where the envelope's distance from its level last exceeds this share of the largest… */
const FADED = 1e-3;

/**
 * The fitted window [from, to): from {@link fitWindowStart} to twice as far as the envelope's
 * distance from `level` last exceeds {@link FADED} of its largest in the window (at least
 * {@link MIN_FIT_CYCLES} cycles, at most the record), so a long flat tail does not crowd the
 * bounce out of the fit's grid.
 */
export function fitWindow(e: Float64Array, level: number): [number, number] {
  const n = e.length;
  const from = fitWindowStart(e, level);
  let largest = 0;
  for (let k = from; k < n; k++) largest = Math.max(largest, Math.abs(e[k] - level));
  let last = n - 1;
  while (last > from && !(Math.abs(e[last] - level) > FADED * largest)) last--;
  return [from, Math.min(n, Math.max(from + 2 * (last - from) + 1, from + MIN_FIT_CYCLES))];
}

// The largest |model − level| over the future: the bounce's amplitude at the end, or the creep's
// two terms followed out to ten times its slowest time constant; a creep that does not decay
// (a drift) moves at least as far again as it did over the window.
function remainingAfter(fit: EnvelopeFit, end: number): number {
  if (fit.kind === "bounce") {
    const tau = end - fit.from;
    return Math.hypot(fit.cosine, fit.sine) * Math.exp(-fit.decayRate * tau);
  }
  const slowest = Math.min(fit.rates[0], fit.rates[1]);
  if (!(slowest > 0)) return Math.abs(envelopeFitAt(fit, end) - envelopeFitAt(fit, fit.from));
  let largest = 0;
  for (let k = 0; k <= 64; k++) {
    const t = end + (k * 10) / slowest / 64;
    largest = Math.max(largest, Math.abs(envelopeFitAt(fit, t) - fit.level));
  }
  return largest;
}

/**
 * The envelope's slow dynamics from its per-cycle values `e` at `midTime`, about `level` (its
 * final value, e.g. the mean of the last cycles): {@link fitSecondOrder} over {@link fitWindow}. A bounce is reported when the decaying-oscillation fit
 * explains the window clearly better than two real exponentials and covers half a bounce.
 */
export function envelopeDynamics(midTime: Float64Array, e: Float64Array, level: number): EnvelopeDynamics {
  const n = e.length;
  if (!(level > 0) || n < MIN_FIT_CYCLES) return NONE;
  const [from, to] = fitWindow(e, level);
  if (to - from < MIN_FIT_CYCLES) return NONE;
  const { bounce, creep } = fitSecondOrder(midTime, e, from, to);
  const span = midTime[to - 1] - midTime[from];
  const end = midTime[n - 1];
  if (
    bounce.kind === "bounce" &&
    bounce.unexplained < BOUNCE_PREFERENCE * creep.unexplained &&
    bounce.unexplained < EXPLAINED &&
    bounce.angularFrequency * span >= Math.PI
  ) {
    const w = bounce.angularFrequency;
    const bounces = (w * span) / (2 * Math.PI);
    const kept = Math.exp(-bounce.decayRate * span);
    return {
      bounceFrequency: w / (2 * Math.PI),
      dampingRatio: bounce.decayRate / Math.hypot(bounce.decayRate, w),
      fit: bounce,
      remaining: remainingAfter(bounce, end) / level,
      slowestRate: bounce.decayRate,
      sustained: bounces >= SUSTAINED_BOUNCES && kept > 1 - SUSTAINED_LOSS,
    };
  }
  if (creep.kind !== "creep" || creep.unexplained > NOISE_LIKE) return NONE;
  return {
    ...NONE,
    fit: creep,
    remaining: remainingAfter(creep, end) / level,
    slowestRate: Math.min(creep.rates[0], creep.rates[1]),
  };
}

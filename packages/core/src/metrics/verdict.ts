import type { CycleTable } from "./cycles.js";
import { tailTrend } from "./envelope-trend.js";
import type { TailTrend } from "./envelope-trend.js";
import type { StartupSettings } from "./startup-options.js";
import { alternatingSwing, type AlternatingSwing } from "./period-doubling.js";

/**
 * What the per-cycle envelope alone shows; `bouncing`: its own slow oscillation never settles,
 * or it collapses and restarts again and again as deep (an unstable amplitude loop, see `judgeLoop`).
 */
export type EnvelopeVerdict = "settled" | "growing" | "decaying" | "silent" | "unsettled" | "bouncing";

/**
 * What the start-up record shows: the envelope's verdict, with a steady oscillation told apart
 * as the predicted sine (`settled`), a `relaxation` oscillation or a `parasitic` one, and a
 * record stuck at an amplifier's limit as `latched` (see the start-up analysis).
 */
export type StartupVerdict = EnvelopeVerdict | "relaxation" | "parasitic" | "latched";

/** Fewest complete cycles for anything but `silent`. */
export const MIN_CYCLES = 3;
/** An envelope that never exceeds this multiple of the noise floor is `silent`. */
export const SILENT_RATIO = 2;
/** Share of the tail's cycle-to-cycle changes that must go one way for `growing` or `decaying`. */
export const TREND_CONSISTENCY = 0.8;
/** `decaying` also needs the last envelope at or below this fraction of the largest one… */
export const DECAY_LOSS = 0.5;
/** …or the record never to have grown: no envelope above this multiple of the first one. */
export const NO_GROWTH = 1.1;

/** Why a record is `silent`. */
export type SilentReason =
  | { readonly kind: "too-few-cycles" }
  | { readonly kind: "below-noise-floor"; readonly largest: number };

/**
 * Why an oscillating record got its verdict: its trend; for `unsettled`, also too few cycles to
 * judge settling, a steady fall after the envelope's peak that is not a decay (the recovery
 * from an overshoot), a drifting mean, or an envelope steady from cycle to cycle whose slow
 * dynamics (a bounce, a creep) would still move it by `remaining` (relative) — the amplitude
 * loop has not settled — or one that fell after its peak and grew again by the factor `rise`
 * (recovering from an overshoot that nearly killed it), or one whose collapses and restarts
 * (`count`, each the largest envelope before it and its lowest, 0 for a stop) grow shallower
 * one after the other: a stable loop's large bounce dying away.
 */
export type TrendReason =
  | { readonly kind: "trend" }
  | { readonly kind: "too-short-to-judge" }
  | { readonly kind: "relaxing" }
  | { readonly kind: "drifting"; readonly largest: number }
  | { readonly kind: "loop-moving"; readonly remaining: number }
  | { readonly kind: "recovering"; readonly rise: number }
  | { readonly kind: "collapses-dying"; readonly count: number; readonly peaks: readonly number[]; readonly lows: readonly number[] };

/** Why a record is `bouncing`: its envelope collapsed and restarted, or its bounce does not die away. */
export type BouncingReason = { readonly kind: "collapses"; readonly count: number } | { readonly kind: "sustained" };

/**
 * The largest change of the per-cycle mean between neighbouring cycles over the last `changes`
 * changes, relative to the envelope: a DC level still settling (after a power-on ramp).
 */
export function meanDrift(cycles: CycleTable, changes: number): number {
  const n = cycles.count;
  let largest = 0;
  for (let k = n - changes; k < n; k++) largest = Math.max(largest, Math.abs(cycles.mean[k] - cycles.mean[k - 1]) / cycles.envelope[k]);
  return largest;
}

/**
 * A verdict, why, and the trend over the last min(settleCycles, cycles − 1) changes (absent
 * only when there were too few cycles for one). `steadyOn` says which per-cycle measure was
 * steady when the verdict is `settled`.
 */
export type Judgement =
  | { readonly verdict: "silent"; readonly reason: SilentReason; readonly trend: TailTrend | null }
  | { readonly verdict: "bouncing"; readonly reason: BouncingReason; readonly trend: TailTrend }
  | {
      readonly verdict: Exclude<EnvelopeVerdict, "silent" | "bouncing">;
      readonly reason: TrendReason;
      readonly trend: TailTrend;
      readonly steadyOn?: SteadyMeasure;
      /** A `settled` swing that repeats every second cycle, not every cycle (see `alternatingSwing`). */
      readonly alternating?: AlternatingSwing;
    };

/**
 * The per-cycle measure a settled record was steady on: its peaks (`envelope`), or its power
 * (`strength`, √2 × r.m.s.).
 */
export type SteadyMeasure = "envelope" | "strength";

/**
 * The verdict from the per-cycle envelope E_k, checked in this order:
 * 1. `silent` if there are fewer than {@link MIN_CYCLES} complete cycles;
 * 2. `decaying` if over the tail ln E falls by more than `settleTolerance` per cycle on average,
 *    at least {@link TREND_CONSISTENCY} of those changes are falls, and either the last
 *    envelope is at most {@link DECAY_LOSS} of the largest, or the record never grew (no
 *    envelope above {@link NO_GROWTH} times the first, and that share of all its changes
 *    falls). A ring-down above the hysteresis band is thus `decaying` even when it stays under
 *    twice the noise floor; an amplitude swinging up and down, or an overshoot recovering, is not;
 * 3. `silent` if a noise floor was given and no envelope exceeds {@link SILENT_RATIO} times it;
 * 4. `settled` if each of the last `settleCycles` changes is below `settleTolerance` relative
 *    (which needs `settleCycles + 1` cycles), either of the peak envelope or of the per-cycle
 *    strength (√2 × r.m.s.). Each is fooled by a different numerical artefact and neither by
 *    a real change of amplitude: a sample overshooting at a clip corner moves a cycle's peak
 *    but hardly its power; a sharp corner between samples moves the power's quadrature by a
 *    little but not a flat top's peak. A wandering amplitude moves both. The per-cycle mean
 *    must be steady too, within `settleTolerance` of the envelope per cycle (else `unsettled`,
 *    drifting: the DC levels still settle); or, `alternating`, if the swing repeats every second
 *    cycle (see `alternatingSwing`: a period-doubled steady state);
 * 5. `growing` if ln E rises by more than `settleTolerance` per cycle on average over the tail
 *    with at least {@link TREND_CONSISTENCY} of the changes rises;
 * 6. `unsettled` otherwise: too short to tell, relaxing (the tail falls as in 2 and so do that
 *    share of the changes since the largest envelope), or wandering.
 */
export function judgeEnvelope(cycles: CycleTable, settings: StartupSettings): Judgement {
  const n = cycles.count;
  if (n < MIN_CYCLES) return { verdict: "silent", reason: { kind: "too-few-cycles" }, trend: null };
  const envelope = cycles.envelope;
  const trend = tailTrend(envelope, Math.min(settings.settleCycles, n - 1));
  const tol = settings.settleTolerance;
  let largest = envelope[0];
  let largestAt = 0;
  let falls = 0;
  let fallsSincePeak = 0;
  for (let k = 1; k < n; k++) {
    if (envelope[k] > largest) {
      largest = envelope[k];
      largestAt = k;
      fallsSincePeak = 0;
    }
    if (envelope[k] < envelope[k - 1]) {
      falls++;
      fallsSincePeak++;
    }
  }
  const falling = trend.meanLogChange < -tol && trend.fallingFraction >= TREND_CONSISTENCY;
  const lostMuch = envelope[n - 1] <= DECAY_LOSS * largest;
  const neverGrew = largest <= NO_GROWTH * envelope[0] && falls >= TREND_CONSISTENCY * (n - 1);
  if (falling && (lostMuch || neverGrew)) {
    return { verdict: "decaying", reason: { kind: "trend" }, trend };
  }
  if (settings.noiseFloor > 0 && largest <= SILENT_RATIO * settings.noiseFloor) {
    return { verdict: "silent", reason: { kind: "below-noise-floor", largest }, trend };
  }
  if (n >= settings.settleCycles + 1) {
    const steadyOn = trend.largestChange < tol ? "envelope" : tailTrend(cycles.strength, trend.changes).largestChange < tol ? "strength" : null;
    if (steadyOn) {
      const drift = meanDrift(cycles, trend.changes);
      if (drift < tol) return { verdict: "settled", reason: { kind: "trend" }, trend, steadyOn };
      return { verdict: "unsettled", reason: { kind: "drifting", largest: drift }, trend };
    }
    const alternating = alternatingSwing(cycles, trend.changes, tol);
    if (alternating) return { verdict: "settled", reason: { kind: "trend" }, trend, steadyOn: "envelope", alternating };
  }
  if (trend.meanLogChange > tol && trend.risingFraction >= TREND_CONSISTENCY) {
    return { verdict: "growing", reason: { kind: "trend" }, trend };
  }
  if (n < settings.settleCycles + 1) return { verdict: "unsettled", reason: { kind: "too-short-to-judge" }, trend };
  const relaxing = falling && fallsSincePeak >= TREND_CONSISTENCY * (n - 1 - largestAt);
  return { verdict: "unsettled", reason: { kind: relaxing ? "relaxing" : "trend" }, trend };
}

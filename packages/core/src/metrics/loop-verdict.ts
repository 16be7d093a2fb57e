import { collapses, collapsesDying, collapsesRepeat, type Collapse } from "./collapses.js";
import type { CycleTable } from "./cycles.js";
import { pairAveraged } from "./period-doubling.js";
import { envelopeDynamics, SUSTAINED_BOUNCES, SUSTAINED_LOSS, type EnvelopeDynamics } from "./envelope-dynamics.js";
import type { StartupSettings } from "./startup-options.js";
import { SILENT_RATIO, type Judgement, type TrendReason } from "./verdict.js";

/** Collapses and restarts that make a record `bouncing` (one may be a slow loop's start-up, which then settles). */
const COLLAPSES_TO_BOUNCE = 2;
/**
 * Collapses are dying away when each is shallower than the one before by at least this factor:
 * a bounce keeping more is sustained ({@link SUSTAINED_LOSS} over {@link SUSTAINED_BOUNCES} bounces).
 */
export const DYING_KEEP = (1 - SUSTAINED_LOSS) ** (1 / SUSTAINED_BOUNCES);
/** A falling record that grew again by this factor after its peak is recovering, not decaying. */
const RECOVERY_RISE = 2;

/** The largest rise of the envelope, as a ratio, from a minimum after its largest value to a later value. */
function riseAfterPeak(e: Float64Array): number {
  let peak = 0;
  for (let k = 1; k < e.length; k++) if (e[k] > e[peak]) peak = k;
  let low = Infinity;
  let rise = 1;
  for (let k = peak + 1; k < e.length; k++) {
    low = Math.min(low, e[k]);
    if (low > 0) rise = Math.max(rise, e[k] / low);
  }
  return rise;
}

function dyingReason(series: readonly Collapse[]): TrendReason {
  return { kind: "collapses-dying", count: series.length, peaks: series.map((c) => c.peak), lows: series.map((c) => c.low) };
}

/** The envelope's slow dynamics and the verdict they lead to. */
export interface LoopJudgement {
  readonly judgement: Judgement;
  readonly dynamics: EnvelopeDynamics | null;
  /** s: how much longer the slow dynamics need to die away within the tolerance, when known. */
  readonly extraTime?: number;
  /**
   * A `bouncing` record whose collapses are irregular (see `collapsesRepeat`): they neither die
   * away nor repeat a cycle yet, so a longer run may still settle (until=auto runs on).
   */
  readonly irregular?: { readonly peaks: readonly number[] };
}

/**
 * The amplitude loop's verdict on top of the cycle-to-cycle one (`judgeEnvelope`): an envelope
 * can be steady from one cycle to the next while its own slow dynamics — a bounce over hundreds
 * of cycles, a creep with a long time constant — still move it. The envelope (or, when the
 * record was steady on it, the per-cycle strength; for a period-doubled swing, the means of
 * neighbouring cycles) from its first reaching the final level is fitted (`envelopeDynamics`); then
 * 1. `bouncing` if it collapsed and restarted {@link COLLAPSES_TO_BOUNCE} times and has not settled since,
 *    the collapses not dying away (see `collapsesDying`, with {@link DYING_KEEP}) — dying ones are a
 *    stable loop's large bounce: `unsettled` (`collapses-dying`); `irregular` when they do not repeat
 *    a cycle either (see `collapsesRepeat`, with the same factor); or if its bounce is sustained
 *    (see `EnvelopeDynamics.sustained`) with an amplitude above `settleTolerance` (relative);
 * 2. a `settled` record whose fit would still move the envelope by more than `settleTolerance`
 *    (relative) after the record's end is `unsettled` (`loop-moving`), with the time its slowest
 *    fitted mode needs to bring that within the tolerance.
 * A `decaying` record that grew again by {@link RECOVERY_RISE} after its peak is `unsettled`
 * (`recovering`): a slow loop's overshoot nearly killed it and it is coming back — or
 * (`collapses-dying`) it is falling into the next of collapses that die away. Silent records
 * are left as they are.
 */
export function judgeLoop(cycles: CycleTable, judgement: Judgement, settings: StartupSettings): LoopJudgement {
  const floor = SILENT_RATIO * settings.noiseFloor;
  if (judgement.verdict === "decaying") {
    const rise = riseAfterPeak(cycles.envelope);
    if (rise < RECOVERY_RISE) return { judgement, dynamics: null };
    const series = collapses(cycles, floor);
    const reason = series.length >= COLLAPSES_TO_BOUNCE && collapsesDying(series, DYING_KEEP) ? dyingReason(series) : ({ kind: "recovering", rise } as const);
    return { judgement: { verdict: "unsettled", reason, trend: judgement.trend }, dynamics: null };
  }
  if (judgement.verdict === "silent" || judgement.verdict === "bouncing") return { judgement, dynamics: null };
  const n = cycles.count;
  const steady = judgement.steadyOn === "strength" ? cycles.strength : cycles.envelope;
  const measure = "alternating" in judgement && judgement.alternating ? pairAveraged(steady) : steady;
  const w = Math.min(settings.settleCycles, n);
  let level = 0;
  for (let k = n - w; k < n; k++) level += measure[k] / w;
  const dynamics = envelopeDynamics(cycles.midTime, measure, level);
  const series = collapses(cycles, floor);
  const { trend } = judgement;
  // Collapses the record then steadied from (cycle to cycle, its bounce dying away) were the loop's start-up; the fit below still judges whether it has settled.
  const settledSince = judgement.verdict === "settled" && !dynamics.sustained;
  if (series.length >= COLLAPSES_TO_BOUNCE && !settledSince) {
    if (!collapsesDying(series, DYING_KEEP)) {
      const judged: LoopJudgement = { judgement: { verdict: "bouncing", reason: { kind: "collapses", count: series.length }, trend }, dynamics };
      return collapsesRepeat(series, DYING_KEEP) ? judged : { ...judged, irregular: { peaks: series.map((c) => c.peak) } };
    }
    if (judgement.verdict !== "settled") return { judgement: { verdict: "unsettled", reason: dyingReason(series), trend }, dynamics };
  }
  if (dynamics.sustained && dynamics.remaining > settings.settleTolerance) return { judgement: { verdict: "bouncing", reason: { kind: "sustained" }, trend }, dynamics };
  if (judgement.verdict !== "settled" || !(dynamics.remaining > settings.settleTolerance)) return { judgement, dynamics };
  const rate = dynamics.slowestRate;
  const period = (cycles.start[n] - cycles.start[n - w]) / w;
  const extraTime = rate !== null && rate > 0 ? Math.log(dynamics.remaining / settings.settleTolerance) / rate + settings.settleCycles * period : undefined;
  return {
    judgement: { verdict: "unsettled", reason: { kind: "loop-moving", remaining: dynamics.remaining }, trend },
    dynamics,
    ...(extraTime === undefined ? {} : { extraTime }),
  };
}

import type { CycleTable } from "./cycles.js";
import type { TailTrend } from "./envelope-trend.js";
import { GROWING, REPEATS } from "./collapses.js";
import { formatPercent, formatQuantity, formatRate } from "./format.js";
import type { StartupSettings } from "./startup-options.js";
import type { AlternatingSwing } from "./period-doubling.js";
import type { SteadyReason } from "./oscillation-kind.js";
import { MIN_CYCLES, SILENT_RATIO } from "./verdict.js";
import type { BouncingReason, SilentReason, SteadyMeasure, TrendReason } from "./verdict.js";

/** The bounce figures a line may quote. */
interface Bounce {
  readonly bounceFrequency: number | null;
  readonly dampingRatio: number | null;
}

/** ζ to three decimals, without a "−0.000". */
export function dampingText(zeta: number): string {
  return (Math.abs(zeta) < 5e-4 ? 0 : zeta).toFixed(3);
}

function bounceText(b: Bounce): string {
  return b.bounceFrequency === null ? "" : ` at ${formatQuantity(b.bounceFrequency, "Hz")} (damping ratio ${dampingText(b.dampingRatio!)})`;
}

// One line per verdict for the report; numbers with SI prefixes, changes per cycle in percent.

export function explainSilent(cycles: CycleTable, reason: SilentReason, settings: StartupSettings): string {
  if (reason.kind === "below-noise-floor") {
    return (
      `no oscillation: the envelope never exceeded ${SILENT_RATIO}× the noise floor ` +
      `(largest ${formatQuantity(reason.largest, settings.unit)} peak against ${formatQuantity(settings.noiseFloor, settings.unit)})`
    );
  }
  if (cycles.count === 0) return "no oscillation: the probe makes no complete cycle through its mean";
  const plural = cycles.count === 1 ? "" : "s";
  return `no oscillation: only ${cycles.count} complete cycle${plural} in the record (at least ${MIN_CYCLES} needed)`;
}

export function explainSettled(
  amplitude: number,
  frequency: number,
  startupTime: number | null,
  settings: StartupSettings,
  steadyOn: SteadyMeasure = "envelope",
  driven?: number,
  common = false,
  alternating?: AlternatingSwing,
): string {
  const held = alternating
    ? `the swing repeats every second cycle (period doubled): its peaks alternate between ${formatQuantity(alternating.low, settings.unit)} and ${formatQuantity(alternating.high, settings.unit)}, each within ${formatPercent(settings.settleTolerance)} of the one two cycles before`
    : `${steadyOn === "envelope" ? "envelope steady" : "power per cycle steady (the peaks vary at sharp corners)"} within ${formatPercent(settings.settleTolerance)}/cycle`;
  return (
    `settled at ${formatQuantity(amplitude, settings.unit)} peak and ${formatQuantity(frequency, "Hz")}` +
    (driven === undefined ? "" : common ? ", driven: the sources' common period" : `, driven by a ${formatQuantity(driven, "Hz")} source`) +
    (startupTime === null ? "" : `, 90 % reached at ${formatQuantity(startupTime, "s")}`) +
    `; ${held} over the last ${settings.settleCycles} cycles`
  );
}

/** A steady oscillation that is not the predicted sine: a relaxation or a parasitic oscillation. */
export function explainOther(reason: Exclude<SteadyReason, { kind: "settled" }>, amplitude: number, frequency: number, dutyCycle: number, unit: string): string {
  const size = `${formatQuantity(amplitude, unit)} peak at ${formatQuantity(frequency, "Hz")}`;
  if (reason.kind === "relaxation") {
    const far = reason.predicted === null ? "the bias point predicts no ringing" : `far from the ${formatQuantity(reason.predicted, "Hz")} the poles predict`;
    const why = {
      square: `it switches between two levels with edges far steeper than a sine's, ${far}`,
      triangle: `it ramps between two levels along straight slopes, ${far}`,
      "no-ringing": "the bias point has no growing complex pair but a growing real pole: the loop runs to a limit and recovers instead of ringing",
    }[reason.why];
    return `relaxation oscillation: ${size}, duty cycle ${formatPercent(dutyCycle)}; ${why}`;
  }
  const predicted =
    reason.predicted === null
      ? "the bias point predicts no ringing at all"
      : `far from the ${formatQuantity(reason.predicted, "Hz")} the bias point's poles predict`;
  return `parasitic oscillation: ${size}, ${predicted}; another loop (the amplifier's own poles, a stray path) sets it`;
}

export function explainGrowing(trend: TailTrend, period: number, extraTime: number): string {
  return (
    `still growing at the end: envelope ${formatPercent(Math.expm1(trend.meanLogChange), true)}/cycle ` +
    `(σ ≈ ${formatRate(trend.meanLogChange / period)}); run about ${formatQuantity(extraTime, "s")} longer`
  );
}

export function explainDecaying(trend: TailTrend, growthRate: number | null): string {
  return (
    `no oscillation: the envelope dies away, ${formatPercent(Math.expm1(trend.meanLogChange), true)}/cycle` +
    (growthRate === null ? "" : ` (σ ≈ ${formatRate(growthRate)})`)
  );
}

/** Collapse peaks an explanation lists at most (the last ones). */
const SHOWN_PEAKS = 6;

/**
 * Why a record is `bouncing`; `irregularPeaks`, the collapses' peaks when they neither die away
 * nor repeat a cycle (see `collapsesRepeat`), in `unit`.
 */
export function explainBouncing(reason: BouncingReason, b: Bounce, irregularPeaks?: readonly number[], unit = "V"): string {
  if (reason.kind === "collapses") {
    const times = reason.count === 1 ? "once" : `${reason.count} times`;
    if (irregularPeaks) {
      return (
        `the amplitude loop has not settled: the envelope collapsed and restarted ${times} ` +
        `(${irregularPeaks.length > SHOWN_PEAKS ? `the last ${SHOWN_PEAKS} peaks` : "peaks"} ${irregularPeaks.slice(-SHOWN_PEAKS).map((x) => formatQuantity(x, unit)).join(", ")}), ` +
        `neither dying away nor yet repeating a cycle (${REPEATS} collapses alike, or ${GROWING} each deeper); a longer run may still settle`
      );
    }
    return `the amplitude loop is unstable: the envelope collapsed and restarted ${times}${b.bounceFrequency === null ? "" : `; it bounces${bounceText(b)}`}`;
  }
  return `the amplitude loop is unstable: the envelope bounces${bounceText(b)} and does not die away`;
}

export function explainUnsettled(cycles: CycleTable, reason: TrendReason, trend: TailTrend, settings: StartupSettings, b?: Bounce, extraTime?: number): string {
  if (reason.kind === "recovering") {
    return `the envelope fell after its peak and grew again ${reason.rise.toFixed(1)}× from its lowest: the amplitude loop is recovering from its overshoot; run longer`;
  }
  if (reason.kind === "collapses-dying") {
    const volts = (values: readonly number[]) => values.map((x) => (x > 0 ? formatQuantity(x, settings.unit) : "0 (stopped)")).join(", ");
    return (
      `the amplitude loop is settling: the envelope collapsed and restarted ${reason.count} times, each collapse shallower than the one before ` +
      `(peaks ${volts(reason.peaks)}; lowest ${volts(reason.lows)}); run longer`
    );
  }
  if (reason.kind === "loop-moving") {
    const how = b?.bounceFrequency ? `still bounces${bounceText(b)}` : "still creeps";
    const longer = extraTime === undefined ? "run longer" : `run about ${formatQuantity(extraTime, "s")} longer`;
    return (
      `steady from cycle to cycle, but the amplitude loop has not settled: the envelope ${how} and would still move by ` +
      `${formatPercent(reason.remaining)} (settled needs under ${formatPercent(settings.settleTolerance)}); ${longer}`
    );
  }
  if (reason.kind === "too-short-to-judge") {
    return `only ${cycles.count} cycles: too few to judge settling (need ${settings.settleCycles + 1}); run longer`;
  }
  const limit = `settled needs under ${formatPercent(settings.settleTolerance)}`;
  if (reason.kind === "drifting") {
    return (
      `the amplitude is steady but the mean level still drifts, up to ${formatPercent(reason.largest)} of the amplitude per cycle ` +
      `over the last ${trend.changes} cycles (${limit}): the DC levels are still settling; run longer`
    );
  }
  if (reason.kind === "relaxing") {
    return (
      `amplitude still relaxing after its peak: envelope ${formatPercent(Math.expm1(trend.meanLogChange), true)}/cycle ` +
      `over the last ${trend.changes} cycles (${limit}); run longer`
    );
  }
  return (
    `amplitude still wandering: envelope changes up to ${formatPercent(trend.largestChange)}/cycle ` +
    `over the last ${trend.changes} cycles (${limit})`
  );
}

import { centreLevel } from "./centre-level.js";
import { findRisingCrossings } from "./crossings.js";
import { cyclesBetween } from "./cycles.js";
import type { CycleTable } from "./cycles.js";
import { startupMoment } from "./excursion.js";
import type { EnvelopeFit } from "./envelope-fit.js";
import { explainBouncing, explainDecaying, explainGrowing, explainOther, explainSettled, explainSilent, explainUnsettled } from "./explanation.js";
import { startupGrowthRate } from "./growth-rate.js";
import { analyseCycles } from "./harmonic-analysis.js";
import { steadyKind } from "./oscillation-kind.js";
import { crossingsPerPeriod, periodCrossings } from "./period-grouping.js";
import { lastHalfStatistics } from "./record-statistics.js";
import type { RecordStatistics } from "./record-statistics.js";
import { extraRunCycles } from "./run-longer.js";
import { settlingTime } from "./settling.js";
import type { Harmonic } from "./spectrum.js";
import { resolveStartupOptions } from "./startup-options.js";
import type { StartupMetricsOptions, StartupSettings } from "./startup-options.js";
import { judgeLoop } from "./loop-verdict.js";
import { judgeEnvelope } from "./verdict.js";
import { diedBurst, explainDiedBurst, type DiedBurst } from "./died-burst.js";
import type { AlternatingSwing } from "./period-doubling.js";
import type { StartupVerdict } from "./verdict.js";
import { checkWaveform } from "./waveform-check.js";
import { waveformShape } from "./waveform-shape.js";

/** The start-up report's numbers and verdict for one probe waveform (SI units throughout). */
export interface StartupMetrics {
  readonly verdict: StartupVerdict;
  /** One line for the report. */
  readonly explanation: string;
  /** Hz: mean of 1/period over the measured cycles. */
  readonly frequency: number | null;
  /** Hz: sample standard deviation of 1/period over the same cycles. */
  readonly frequencySpread: number | null;
  /** V peak: the settled envelope; otherwise the last cycle's envelope. */
  readonly amplitude: number | null;
  /** V: largest cycle maximum minus smallest cycle minimum over the measured cycles. */
  readonly peakToPeak: number | null;
  /** V: r.m.s. over the measured cycles, the offset included. */
  readonly rms: number | null;
  /** V: mean over the measured cycles. */
  readonly offset: number | null;
  /** s: first time |v − offset| reaches 90 % of the settled amplitude (steady oscillations only). */
  readonly startupTime: number | null;
  /** s: time after which the per-cycle envelope stays within ±1 % of it (steady oscillations only). */
  readonly settlingTime: number | null;
  /** Fraction of the period above the offset (relaxation oscillations only). */
  readonly dutyCycle: number | null;
  /** 1/s: exponential growth rate σ of the small-signal envelope (negative when decaying). */
  readonly growthRate: number | null;
  /** THD_F over harmonics 2 … maxOrder, a fraction (steady oscillations only). */
  readonly thd: number | null;
  /**
   * THD+N of the measured cycles of the record (settled only): everything in the band up to
   * harmonic maxOrder but the fundamental, over it — the harmonics and the noise the run carries.
   */
  readonly thdPlusNoise: number | null;
  /** Harmonics 1 … maxOrder of the settled cycles; empty unless steady. */
  readonly harmonics: Harmonic[];
  /** Complete cycles in the whole record. */
  readonly cycles: number;
  /** s: roughly how much longer to run a `growing` record before it can settle. */
  readonly suggestedExtraTime?: number;
  /** Per-cycle envelope against cycle mid-time (for plots), and its slow dynamics. */
  readonly envelope: StartupEnvelope;
  /** A `decaying` record too short in cycles to measure: the burst that grew and died (see `diedBurst`). */
  readonly burst?: DiedBurst;
  /**
   * A `settled` swing that repeats every second cycle (period doubled, see `alternatingSwing`):
   * the mean peaks of its lower and higher cycles, in the probe's unit.
   */
  readonly periodDoubled?: AlternatingSwing;
}

/**
 * The per-cycle envelope and the fit of its slow dynamics after it first reached its final level
 * (see `judgeLoop`): the bounce's frequency and damping ratio, null when it settles without
 * bouncing (or is too short, or lost in its noise).
 */
export interface StartupEnvelope {
  readonly time: Float64Array;
  readonly value: Float64Array;
  /** Hz: the damped frequency ω_d/2π of the envelope's own oscillation (the amplitude loop's bounce). */
  readonly bounceFrequency: number | null;
  /** ζ = σ/√(σ² + ω_d²) of that bounce; negative when it grows. */
  readonly dampingRatio: number | null;
  /** The fitted model (a bounce or a creep about the final level), for plots; null without one. */
  readonly fit: EnvelopeFit | null;
}

/** Fraction of the settled amplitude that marks start-up. */
const STARTUP_FRACTION = 0.9;
/** Default hysteresis parts, relative to the late half swing and to the largest |v|. */
const RELATIVE_HYSTERESIS = 1e-3;
const ROUNDING_HYSTERESIS = 1e-9;

function hysteresisFor(v: Float64Array, tail: RecordStatistics, settings: StartupSettings): number {
  if (settings.hysteresis !== undefined) return settings.hysteresis;
  let largest = 0;
  for (let i = 0; i < v.length; i++) largest = Math.max(largest, Math.abs(v[i]));
  return Math.max(
    settings.noiseFloor,
    RELATIVE_HYSTERESIS * 0.5 * (tail.maximum - tail.minimum),
    ROUNDING_HYSTERESIS * largest,
  );
}

// Whole periods: crossing-to-crossing cycles, regrouped when a period holds several crossings.
function periodsThrough(t: Float64Array, v: Float64Array, level: number, hysteresis: number, window: number): CycleTable {
  const crossings = findRisingCrossings(t, v, level, hysteresis);
  const cycles = cyclesBetween(t, v, crossings);
  const m = crossingsPerPeriod(cycles, window);
  return m === 1 ? cycles : cyclesBetween(t, v, periodCrossings(crossings, m, window));
}

// Periods through the centre of the last (up to) settleCycles periods: a first pass through the
// mean of the record's last half finds those periods, a second pass uses their centre level
// (their mean when the envelope is steady). Over whole periods that level does not depend on
// where they start, so a further pass would not move it.
function measuredCycles(t: Float64Array, v: Float64Array, tail: RecordStatistics, hysteresis: number, window: number): CycleTable {
  const first = periodsThrough(t, v, tail.mean, hysteresis, window);
  if (first.count === 0) return first;
  const level = centreLevel(t, v, first, Math.min(window, first.count));
  return periodsThrough(t, v, level, hysteresis, window);
}

/** Frequency, its spread and extremes over cycles `from … count − 1`. */
function windowFigures(cycles: CycleTable, from: number) {
  const n = cycles.count;
  const w = n - from;
  let sum = 0;
  let envelopeSum = 0;
  let maximum = -Infinity;
  let minimum = Infinity;
  for (let k = from; k < n; k++) {
    sum += 1 / (cycles.start[k + 1] - cycles.start[k]);
    envelopeSum += cycles.envelope[k];
    maximum = Math.max(maximum, cycles.maximum[k]);
    minimum = Math.min(minimum, cycles.minimum[k]);
  }
  const frequency = sum / w;
  let deviations = 0;
  for (let k = from; k < n; k++) deviations += (1 / (cycles.start[k + 1] - cycles.start[k]) - frequency) ** 2;
  return {
    frequency,
    frequencySpread: w > 1 ? Math.sqrt(deviations / (w - 1)) : 0,
    meanEnvelope: envelopeSum / w,
    peakToPeak: maximum - minimum,
  };
}

/**
 * Start-up metrics of one probe waveform sampled at the solver's accepted time points
 * (strictly increasing, any spacing, about 30 or more samples per period).
 *
 * Cycles are delimited by rising crossings through the mean of the last `settleCycles` cycles
 * (weighted by the inverse envelope while it grows or decays, see `centreLevel`), with a
 * hysteresis band (see {@link StartupMetricsOptions.hysteresis}); when the waveform's tail
 * shows a period holding m > 1 such crossings, every m-th one delimits a cycle (see
 * `crossingsPerPeriod`). Crossing times and cycle extremes come from the local cubic through
 * four samples. The verdict follows
 * `judgeEnvelope`. The measured cycles are the last `settleCycles` (fewer if the record has
 * fewer): frequency, spread, peak-to-peak, r.m.s. and offset come from them whatever the
 * verdict; THD, harmonics, start-up and settling times only when `settled`. A `silent` record
 * reports only the trapezoidal offset, r.m.s. and peak-to-peak of its last half.
 *
 * Growth rate: see `startupGrowthRate` (a least-squares line through ln(envelope) between
 * max(10·noiseFloor, 10⁻³·final) and 30 % of the final envelope). "Final" is the settled
 * amplitude, the mean envelope of the measured cycles when `unsettled`, or the largest
 * envelope when `growing`.
 *
 * Start-up time is resolved on the signal itself (the first moment |v − c| reaches
 * 0.9·amplitude, c the centre of the first cycle whose envelope reaches it, see
 * `startupMoment`); settling time on the per-cycle envelope (see `settlingTime`).
 */
export function measureStartup(t: Float64Array, v: Float64Array, options: StartupMetricsOptions = {}): StartupMetrics {
  return judgeStartup(t, v, options).metrics;
}

/**
 * A waveform's start-up metrics (see {@link measureStartup}) and the cycles they were judged on:
 * every complete cycle, and the first of the measured ones (`from`, the window of the figures).
 */
export interface StartupJudgement {
  readonly metrics: StartupMetrics;
  readonly cycles: CycleTable;
  readonly from: number;
  /** A `bouncing` record whose collapses neither die away nor repeat a cycle yet (a longer run may settle). */
  readonly irregular: boolean;
}

/** {@link measureStartup}, with the cycles its verdict and figures came from. */
export function judgeStartup(t: Float64Array, v: Float64Array, options: StartupMetricsOptions = {}): StartupJudgement {
  checkWaveform("measureStartup", t, v);
  const settings = resolveStartupOptions(options);
  const tail = lastHalfStatistics(t, v);
  const cycles = measuredCycles(t, v, tail, hysteresisFor(v, tail, settings), settings.settleCycles);
  const loop = judgeLoop(cycles, judgeEnvelope(cycles, settings), settings);
  const judgement = loop.judgement;
  const d = loop.dynamics;
  const envelope: StartupEnvelope = {
    time: cycles.midTime,
    value: cycles.envelope,
    bounceFrequency: d?.bounceFrequency ?? null,
    dampingRatio: d?.dampingRatio ?? null,
    fit: d?.fit ?? null,
  };
  const n = cycles.count;

  // Too few cycles, yet far above the noise on both sides: an oscillation that grew and died away.
  const burst = judgement.verdict === "silent" && judgement.reason.kind === "too-few-cycles" ? diedBurst(t, v, tail, settings.noiseFloor, settings.searchFrom) : null;
  if (judgement.verdict === "silent") {
    const metrics: StartupMetrics = {
      verdict: burst ? "decaying" : "silent",
      explanation: burst ? explainDiedBurst(burst, cycles.count, settings.unit) : explainSilent(cycles, judgement.reason, settings),
      frequency: null,
      frequencySpread: null,
      amplitude: null,
      peakToPeak: tail.maximum - tail.minimum,
      rms: tail.rms,
      offset: tail.mean,
      startupTime: null,
      settlingTime: null,
      dutyCycle: null,
      growthRate: null,
      thd: null,
      thdPlusNoise: null,
      harmonics: [],
      cycles: n,
      envelope,
      ...(burst ? { burst } : {}),
    };
    return { metrics, cycles, from: n, irregular: false };
  }

  const { trend } = judgement;
  let verdict: StartupVerdict = judgement.verdict;
  const from = n - Math.min(settings.settleCycles, n);
  const figures = windowFigures(cycles, from);
  const analysis = analyseCycles(t, v, cycles.start[from], cycles.start[n], n - from, settings.maxOrder, figures.frequency);
  const settled = verdict === "settled";
  let largest = 0;
  for (let k = 0; k < n; k++) largest = Math.max(largest, cycles.envelope[k]);
  const amplitude = settled ? figures.meanEnvelope : cycles.envelope[n - 1];
  const growthRate = startupGrowthRate(cycles, verdict, verdict === "growing" ? largest : figures.meanEnvelope, settings, analysis.offset);
  const period = 1 / figures.frequency;

  let explanation: string;
  let startupTime: number | null = null;
  let settling: number | null = null;
  let dutyCycle: number | null = null;
  let suggestedExtraTime: number | undefined;
  switch (judgement.verdict) {
    case "settled": {
      startupTime = startupMoment(t, v, cycles, analysis.offset, STARTUP_FRACTION * amplitude, settings.searchFrom);
      const steadyOn = judgement.steadyOn ?? "envelope";
      const measure = steadyOn === "envelope" ? cycles.envelope : cycles.strength;
      let level = 0;
      for (let k = from; k < n; k++) level += measure[k] / (n - from);
      settling = settlingTime(cycles.midTime, measure, level);
      const shape = waveformShape(t, v, cycles.start[from], cycles.start[n], analysis.offset);
      const kind = steadyKind(shape, figures.frequency, settings.prediction, settings.drives);
      verdict = kind.kind;
      if (kind.kind === "settled") explanation = explainSettled(amplitude, figures.frequency, startupTime, settings, steadyOn, kind.driven, kind.common, judgement.alternating);
      else {
        if (kind.kind === "relaxation") dutyCycle = shape.dutyCycle;
        explanation = explainOther(kind, amplitude, figures.frequency, shape.dutyCycle, settings.unit);
      }
      break;
    }
    case "growing":
      suggestedExtraTime = extraRunCycles(cycles.envelope, trend, settings) * period;
      explanation = explainGrowing(trend, period, suggestedExtraTime);
      break;
    case "decaying":
      explanation = explainDecaying(trend, growthRate);
      break;
    case "unsettled":
      suggestedExtraTime = loop.extraTime;
      explanation = explainUnsettled(cycles, judgement.reason, trend, settings, envelope, suggestedExtraTime);
      break;
    case "bouncing":
      explanation = explainBouncing(judgement.reason, envelope, loop.irregular?.peaks, settings.unit);
      break;
  }

  const result: StartupMetrics = {
    verdict,
    explanation,
    frequency: figures.frequency,
    frequencySpread: figures.frequencySpread,
    amplitude,
    peakToPeak: figures.peakToPeak,
    rms: analysis.rms,
    offset: analysis.offset,
    startupTime,
    settlingTime: settling,
    growthRate,
    dutyCycle,
    thd: settled ? analysis.thd : null,
    thdPlusNoise: settled ? analysis.thdPlusNoise : null,
    harmonics: settled ? analysis.harmonics : [],
    cycles: n,
    envelope,
  };
  const alternating = verdict === "settled" && judgement.verdict === "settled" ? judgement.alternating : undefined;
  const metrics = { ...result, ...(suggestedExtraTime === undefined ? {} : { suggestedExtraTime }), ...(alternating ? { periodDoubled: alternating } : {}) };
  return { metrics, cycles, from, irregular: loop.irregular !== undefined };
}

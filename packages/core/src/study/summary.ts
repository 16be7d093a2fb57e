import type { SpecCriterion } from "../circuit/circuit.js";
import { judgedValue, meets, metricValue, sampleCriteria } from "../spec/evaluate.js";
import { summarize, type PercentileSummary } from "../stats/percentiles.js";
import { wilsonInterval, type Interval } from "../stats/wilson.js";
import type { NumericalError } from "../steady/refine.js";
import { SAMPLE_METRICS, type SampleOutcome } from "./sample.js";

/** One finished Monte Carlo sample. */
export interface ToleranceSample extends SampleOutcome {
  readonly index: number;
  /** The values drawn, by override name. */
  readonly drawn: Readonly<Record<string, number>>;
}

/** The fraction of samples that pass, with its 95 % Wilson interval. */
export interface YieldSummary {
  readonly passed: number;
  readonly runs: number;
  readonly value: number;
  /** 95 % Wilson score interval (docs/references.md §6). */
  readonly interval: Interval;
}

/** One criterion of the spec over the samples: the fraction that meets it, with its interval. */
export interface CriterionYield extends YieldSummary {
  readonly criterion: SpecCriterion;
}

/** A tolerance study summed up: verdict counts, metric percentiles, the yield and each criterion's own yield. */
export interface ToleranceSummary {
  readonly runs: number;
  readonly verdicts: Readonly<Record<string, number>>;
  readonly percentiles: Readonly<Partial<Record<(typeof SAMPLE_METRICS)[number], PercentileSummary>>>;
  /** The fraction of samples that settle and meet every criterion (the study's yield). */
  readonly yield: YieldSummary;
  /** Each criterion but `yield` on its own, in the spec's order. */
  readonly criteria: readonly CriterionYield[];
  /** The yield criterion from the spec, if any, and whether the yield met it. */
  readonly yieldCriterion: { readonly criterion: SpecCriterion; readonly pass: boolean } | null;
  /** The worst samples first: failures by how far they miss, then the tightest passes. */
  readonly worst: readonly number[];
  /**
   * The largest numerical error of each settled figure over the samples: a spread narrower than
   * it is not resolved. Null when no sample carries error bars.
   */
  readonly numericalError: NumericalError | null;
}

/** The largest error bar of each figure over the samples that have bars. */
function largestError(samples: readonly ToleranceSample[]): NumericalError | null {
  // Results files written before samples carried bars have none: `?? null` reads them too.
  let most: NumericalError | null = null;
  for (const s of samples) {
    const e = s.metrics?.numericalError ?? null;
    if (e === null) continue;
    most = most === null ? { ...e } : {
      frequency: Math.max(most.frequency, e.frequency),
      amplitude: Math.max(most.amplitude, e.amplitude),
      rms: Math.max(most.rms, e.rms),
      thd: Math.max(most.thd, e.thd),
    };
  }
  return most;
}

/** Normalised margin of a sample against the criteria: negative when it fails. */
function margin(sample: ToleranceSample, criteria: readonly SpecCriterion[]): number {
  if (!sample.metrics || sample.metrics.verdict !== "settled") return -Infinity;
  let worst = Infinity;
  for (const c of sampleCriteria(criteria)) {
    const v = metricValue(sample.metrics, c.metric);
    if (typeof v !== "number") return -Infinity;
    if (c.test === "within") {
      const half = (c.high - c.low) / 2 || Math.abs(c.high) || 1;
      worst = Math.min(worst, (half - Math.abs(v - (c.low + c.high) / 2)) / half);
    } else {
      const scale = Math.abs(c.limit) || 1;
      worst = Math.min(worst, c.test === "below" ? (c.limit - v) / scale : (v - c.limit) / scale);
    }
  }
  return worst;
}

/**
 * Summarises samples (in any order): percentiles, verdict counts, the yield and each criterion's
 * own yield with their 95 % Wilson intervals, worst cases.
 */
export function summarizeSamples(samples: readonly ToleranceSample[], criteria: readonly SpecCriterion[], worstCount = 5): ToleranceSummary {
  const ordered = [...samples].sort((a, b) => a.index - b.index);
  const verdicts: Record<string, number> = {};
  for (const s of ordered) {
    const v = s.metrics?.verdict ?? "failed";
    verdicts[v] = (verdicts[v] ?? 0) + 1;
  }
  const percentiles: Partial<Record<(typeof SAMPLE_METRICS)[number], PercentileSummary>> = {};
  for (const key of SAMPLE_METRICS) {
    const values = ordered.flatMap((s) => (s.metrics && typeof s.metrics[key] === "number" ? [s.metrics[key] as number] : []));
    const summary = summarize(values);
    if (summary) percentiles[key] = summary;
  }
  const runs = ordered.length;
  const yieldOf = (passed: number): YieldSummary => ({ passed, runs, value: runs > 0 ? passed / runs : 0, interval: wilsonInterval(passed, runs) });
  const overall = yieldOf(ordered.filter((s) => s.pass).length);
  const perCriterion = sampleCriteria(criteria).map((criterion) => ({
    criterion,
    ...yieldOf(ordered.filter((s) => s.metrics !== null && meets(criterion, judgedValue(s.metrics, criterion))).length),
  }));
  const yieldCriterion = criteria.find((c) => c.metric === "yield");
  const yieldPass = yieldCriterion === undefined ? null : meets(yieldCriterion, overall.value);
  const scored = ordered.map((s) => ({ index: s.index, score: margin(s, criteria) }));
  scored.sort((a, b) => a.score - b.score || a.index - b.index);
  return {
    runs,
    verdicts,
    percentiles,
    yield: overall,
    criteria: perCriterion,
    yieldCriterion: yieldCriterion ? { criterion: yieldCriterion, pass: yieldPass! } : null,
    worst: scored.slice(0, worstCount).map((s) => s.index),
    numericalError: largestError(ordered),
  };
}

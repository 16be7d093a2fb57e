import { meets, requiredYield as requiredYieldOf, summarizeSamples, shardIndices, widestPassingRange, type ToleranceSummary, type YieldSummary } from "@onset/core";
import type { SpecChecks } from "../report/spec.js";
import type { StoredSample, StudyHeader } from "./header.js";

/** A tolerance study's report: the samples in index order, their summary and the yield check. */
export interface ToleranceReport {
  readonly kind: "tolerance";
  readonly header: StudyHeader;
  readonly samples: readonly StoredSample[];
  readonly summary: ToleranceSummary;
  readonly spec: SpecChecks | null;
  /** Indices of this study (or shard) that have no sample yet. */
  readonly missing: readonly number[];
}

/** One setting of a design window. */
export interface WindowPointReport {
  readonly value: number;
  readonly samples: readonly StoredSample[];
  readonly summary: ToleranceSummary;
  readonly pass: boolean;
}

/** Sweep × tolerance: the yield at each setting and the widest run of settings that meet it. */
export interface WindowReport {
  readonly kind: "window";
  readonly header: StudyHeader;
  readonly points: readonly WindowPointReport[];
  readonly window: { readonly from: number; readonly to: number } | null;
  readonly spec: SpecChecks | null;
  readonly missing: readonly number[];
}

export type StudyReport = ToleranceReport | WindowReport;

/** The yield required of a design window (core's rule: the spec's `yield>` limit, else 99 %). */
export function requiredYield(header: Pick<StudyHeader, "criteria">): number {
  return requiredYieldOf(header.criteria);
}

function byIndex(samples: readonly StoredSample[]): StoredSample[] {
  return [...samples].sort((a, b) => a.index - b.index);
}

function missingOf(header: StudyHeader, samples: readonly StoredSample[]): number[] {
  const have = new Set(samples.map((s) => s.index));
  return shardIndices(header.runs, header.shard ?? undefined).filter((i) => !have.has(i));
}

/**
 * The spec of a tolerance study: each criterion with its own yield (the fraction of samples that
 * meet it, with its 95 % interval), then the study's yield — samples that settle and meet every
 * criterion — against the `yield>` criterion, or against 100 % when the spec has none. A
 * criterion passes when its own yield would meet that requirement.
 */
function toleranceSpec(header: StudyHeader, summary: ToleranceSummary): SpecChecks | null {
  if (header.criteria.length === 0) return null;
  const yc = header.criteria.find((c) => c.metric === "yield");
  const enough = (y: YieldSummary) => (yc ? meets(yc, y.value) : y.runs > 0 && y.passed === y.runs);
  const row = (text: string, y: YieldSummary) => ({ text, metric: "yield", measured: y.value, unit: "1", passed: y.passed, runs: y.runs, interval: { ...y.interval }, pass: enough(y) });
  const overall = { ...row(yc?.text ?? "every sample", summary.yield), combined: true };
  return {
    pass: overall.pass,
    on: `the yield of ${summary.runs} ${summary.runs === 1 ? "sample" : "samples"}`,
    criteria: [...summary.criteria.map((c) => row(c.criterion.text, c)), overall],
  };
}

/** Builds the tolerance report from a header and samples, whichever order they finished in. */
export function toleranceReport(header: StudyHeader, samples: readonly StoredSample[]): ToleranceReport {
  const ordered = byIndex(samples);
  const summary = summarizeSamples(ordered, header.criteria);
  return { kind: "tolerance", header, samples: ordered, summary, spec: toleranceSpec(header, summary), missing: missingOf(header, ordered) };
}

/** Builds the design-window report: one summary per setting and the widest passing range. */
export function windowReport(header: StudyHeader, samples: readonly StoredSample[]): WindowReport {
  const sweep = header.sweep!;
  const required = sweep.required;
  const points = sweep.values.map((value, k) => {
    const mine = byIndex(samples.filter((s) => (s.point ?? 0) === k));
    const summary = summarizeSamples(mine, header.criteria);
    return { value, samples: mine, summary, pass: summary.runs > 0 && summary.yield.value >= required };
  });
  const best = widestPassingRange(points);
  const yc = header.criteria.find((c) => c.metric === "yield");
  const bestYield = Math.max(0, ...points.map((p) => p.summary.yield.value));
  const spec: SpecChecks | null =
    header.criteria.length === 0
      ? null
      : {
          pass: best !== null,
          on: `the yield at each setting of ${sweep.target}`,
          criteria: [{ text: `${yc?.text ?? `yield>${required * 100}%`} at some setting`, metric: "yield", measured: bestYield, unit: "1", pass: best !== null }],
        };
  const missing = points.flatMap((p, k) => missingOf(header, p.samples).map((i) => k * header.runs + i));
  return { kind: "window", header, points, window: best, spec, missing };
}

/** The report of a study, tolerance or design window, from its header and samples. */
export function studyReport(header: StudyHeader, samples: readonly StoredSample[]): StudyReport {
  return header.sweep ? windowReport(header, samples) : toleranceReport(header, samples);
}

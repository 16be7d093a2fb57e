import type { ToleranceSummary, YieldSummary } from "@onset/core";
import type { StoredSample, StudyHeader } from "../study/header.js";
import { reproduceCommand } from "../study/reproduce.js";
import type { StudyReport } from "../study/study-report.js";
import type { Json } from "./results.js";

/** A sample as the study's JSON lists it (also the study's figures of `--sample I`). */
export function sampleJson(s: StoredSample): Json {
  return { index: s.index, drawn: { ...s.drawn }, pass: s.pass, failures: [...s.failures], error: s.error, metrics: s.metrics ? { ...s.metrics, numericalError: s.metrics.numericalError ? { ...s.metrics.numericalError } : null } : null };
}

function yieldJson(y: YieldSummary): Record<string, Json> {
  return { passed: y.passed, runs: y.runs, value: y.value, interval: { low: y.interval.low, high: y.interval.high } };
}

function summaryJson(summary: ToleranceSummary): Json {
  return {
    runs: summary.runs,
    verdicts: { ...summary.verdicts },
    percentiles: JSON.parse(JSON.stringify(summary.percentiles)) as Json,
    yield: yieldJson(summary.yield),
    criteria: summary.criteria.map((c) => ({ text: c.criterion.text, metric: c.criterion.metric, ...yieldJson(c) })),
    yieldCriterion: summary.yieldCriterion ? { text: summary.yieldCriterion.criterion.text, pass: summary.yieldCriterion.pass } : null,
    worst: [...summary.worst],
    numericalError: summary.numericalError ? { ...summary.numericalError } : null,
  };
}

function studyCommon(h: StudyHeader): Record<string, Json> {
  return {
    runs: h.runs,
    seed: h.seed,
    dist: h.dist,
    // the samples' startupTime is then the poles' prediction, not a run's
    ...(h.measure === "steady" ? { measure: "steady" } : {}),
    // the unit of the samples' amplitude, offset, rms and peak-to-peak: the probe's
    probeUnit: h.probeUnit ?? "V",
    shard: h.shard ? { ...h.shard } : null,
    tolerances: h.tolerances.map((t) => ({ ...t })),
  };
}

/** A study result for the JSON document: every sample (index, drawn values, metrics) and the summaries. */
export function studyJson(r: StudyReport): Json {
  if (r.kind === "tolerance") {
    return {
      analysis: "tolerance",
      ...studyCommon(r.header),
      samples: r.samples.map(sampleJson),
      summary: summaryJson(r.summary),
      reproduce: r.summary.worst.map((index) => ({ index, command: reproduceCommand(r.header, index) })),
      missing: [...r.missing],
    };
  }
  const sweep = r.header.sweep!;
  return {
    analysis: "window",
    target: sweep.target,
    unit: sweep.unit,
    log: sweep.log,
    required: sweep.required,
    ...studyCommon(r.header),
    points: r.points.map((p) => ({ value: p.value, pass: p.pass, summary: summaryJson(p.summary), samples: p.samples.map(sampleJson) })),
    window: r.window ? { ...r.window } : null,
    missing: [...r.missing],
  };
}

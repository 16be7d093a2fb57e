import { judgedValue, meets, SAMPLE_METRICS, sampleCriteria } from "@onset/core";
import type { StoredSample, StudyHeader } from "../study/header.js";
import type { StudyReport } from "../study/study-report.js";
import { csvDocument, csvField, csvNumber, ERROR_COLUMNS, errorCells } from "./csv.js";

const METRIC_COLUMNS = [...SAMPLE_METRICS, "rms", "peakToPeak", "predictedGrowthRate"] as const;

function sampleCells(h: StudyHeader, s: StoredSample): string[] {
  const metrics = s.metrics as Record<string, unknown> | null;
  return [
    String(s.index),
    ...h.tolerances.map((t) => csvNumber(s.drawn[t.target])),
    metrics ? csvField(String(metrics.verdict)) : "failed",
    ...METRIC_COLUMNS.map((k) => csvNumber(typeof metrics?.[k] === "number" ? (metrics[k] as number) : null)),
    ...errorCells(s.metrics?.numericalError),
    ...sampleCriteria(h.criteria).map((c) => (s.metrics !== null && meets(c, judgedValue(s.metrics, c)) ? "1" : "0")),
    s.pass ? "1" : "0",
  ];
}

/**
 * The CSV of a study: one row per sample with `index`, the drawn values (one column per
 * toleranced name), `verdict`, the metrics, their error bars (`frequencyError` …, empty where a
 * sample has none; under `measure=steady` the start-up time's column is `predictedStartupTime`), one column per spec criterion (named `pass ` and the
 * criterion as written: 1 when the sample meets it) and `pass` (1 when it settles and meets
 * them all). A design window puts the setting first, in a column named after the swept target.
 */
export function studyCsv(r: StudyReport): string {
  const h = r.header;
  // Under measure=steady the start-up time is the poles' prediction, never simulated: the column says so, as the sweep's does.
  const metricNames = METRIC_COLUMNS.map((k) => (k === "startupTime" && h.measure === "steady" ? "predictedStartupTime" : k));
  const header = ["index", ...h.tolerances.map((t) => t.target), "verdict", ...metricNames, ...ERROR_COLUMNS, ...sampleCriteria(h.criteria).map((c) => `pass ${c.text}`), "pass"];
  if (r.kind === "tolerance") return csvDocument(header, r.samples.map((s) => sampleCells(h, s)));
  const rows = r.points.flatMap((p) => p.samples.map((s) => [csvNumber(p.value), ...sampleCells(h, s)]));
  return csvDocument([h.sweep!.target, ...header], rows);
}

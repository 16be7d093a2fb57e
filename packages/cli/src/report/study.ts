import { SAMPLE_METRICS } from "@onset/core";
import type { Paint } from "../color.js";
import type { StoredSample } from "../study/header.js";
import { reproduceCommand } from "../study/reproduce.js";
import type { StudyReport, ToleranceReport, WindowReport } from "../study/study-report.js";
import { table } from "./table.js";
import { METRIC_LABELS, metric, percent, si } from "./values.js";

/** How many worst samples the report lists. */
const WORST_SHOWN = 5;

function studyLine(r: StudyReport): string {
  const h = r.header;
  const dist = h.dist === "normal" ? "normal, σ = tolerance/3, cut at ±tolerance" : "uniform over ±tolerance";
  const shard = h.shard ? `, shard ${h.shard.index}/${h.shard.count}` : "";
  const measure = h.measure === "steady" ? "; each sample's periodic steady state (measure=steady): start-up time predicted from the poles' growth rate, no settling time" : "";
  return `${h.runs} runs, seed ${h.seed}, ${dist}${shard}${measure}`;
}

function drawnText(r: StudyReport, s: StoredSample): string {
  return r.header.tolerances.map((t) => `${t.target} = ${si(s.drawn[t.target], t.unit)}`).join(", ");
}

function verdictCounts(summary: ToleranceReport["summary"]): string {
  return Object.entries(summary.verdicts)
    .map(([verdict, count]) => `${verdict} ${count}`)
    .join(", ");
}

/** Under measure=steady a sample's start-up time is the poles' prediction, and its label says so. */
function startupLabel(r: StudyReport): string {
  return r.header.measure === "steady" ? "start-up time (predicted)" : (METRIC_LABELS.startupTime ?? "start-up time");
}

/**
 * Percentiles of each metric; with error bars, a last column gives the largest numerical error
 * of the settled figures over the samples (a spread narrower than it is not resolved).
 */
function percentileTable(summary: ToleranceReport["summary"], startup: string, probeUnit: string | undefined): string[] {
  const names = ["min", "p1", "p5", "median", "p95", "p99", "max"] as const;
  const bars = summary.numericalError;
  const barOf = (key: string) => (bars && key in bars ? `± ${metric(key, bars[key as keyof typeof bars], probeUnit)}` : "");
  const rows = SAMPLE_METRICS.flatMap((key) => {
    const p = summary.percentiles[key];
    return p ? [[key === "startupTime" ? startup : (METRIC_LABELS[key] ?? key), ...names.map((n) => metric(key, p[n], probeUnit)), ...(bars ? [barOf(key)] : [])]] : [];
  });
  const columns = [{ header: "metric" }, ...names.map((n) => ({ header: n, align: "right" as const }))];
  return table(bars ? [...columns, { header: "numerical error", align: "right" as const }] : columns, rows);
}

function missingLine(r: StudyReport, p: Paint): string[] {
  if (r.missing.length === 0) return [];
  return [p.yellow(`  ${r.missing.length} samples are not done yet: rerun with --resume to finish them`)];
}

function toleranceText(r: ToleranceReport, p: Paint): string[] {
  const { summary, header } = r;
  const lines = [p.bold("Monte Carlo tolerance study") + p.dim(`  (${studyLine(r)})`)];
  lines.push(`  ${summary.runs} samples done; verdicts: ${verdictCounts(summary) || "none"}`, ...missingLine(r, p), "");
  lines.push(...percentileTable(summary, startupLabel(r), header.probeUnit), "");
  const y = summary.yield;
  lines.push(
    `  yield ${percent(y.value)} (${y.passed} of ${y.runs} pass), 95 % Wilson interval ${percent(y.interval.low)} to ${percent(y.interval.high)}`,
  );
  const worst = summary.worst.slice(0, WORST_SHOWN).map((i) => r.samples.find((s) => s.index === i)!);
  if (worst.length > 0) {
    lines.push("", "  worst samples");
    for (const s of worst) {
      const outcome = s.pass ? p.green("passes") : p.red(`fails: ${s.failures.join(", ")}`);
      const extra = s.error ? ` (${s.error})` : "";
      lines.push(`    #${s.index}  ${outcome}${extra}`);
      lines.push(`         f ${metric("frequency", s.metrics?.frequency)}, amplitude ${metric("amplitude", s.metrics?.amplitude, header.probeUnit)}, THD ${metric("thd", s.metrics?.thd)}, start-up ${metric("startupTime", s.metrics?.startupTime)}${r.header.measure === "steady" && s.metrics?.startupTime != null ? " (predicted)" : ""}`);
      if (header.tolerances.length > 0) lines.push(`         drawn ${drawnText(r, s)}`);
      lines.push(p.dim(`         reproduce: ${reproduceCommand(header, s.index)}`));
    }
  }
  return lines;
}

function windowText(r: WindowReport, p: Paint): string[] {
  const sweep = r.header.sweep!;
  const lines = [
    p.bold(`design window over ${sweep.target}`) + p.dim(`  (${studyLine(r)} at each of ${sweep.values.length} settings; required yield ${percent(sweep.required)})`),
    ...missingLine(r, p),
  ];
  lines.push(
    ...table(
      [{ header: sweep.target }, { header: "yield", align: "right" }, { header: "95 % interval", align: "right" }, { header: "median f", align: "right" }, { header: "median amplitude", align: "right" }, { header: "" }],
      r.points.map((pt) => [
        si(pt.value, sweep.unit),
        percent(pt.summary.yield.value),
        `${percent(pt.summary.yield.interval.low, 3)} to ${percent(pt.summary.yield.interval.high, 3)}`,
        metric("frequency", pt.summary.percentiles.frequency?.median),
        metric("amplitude", pt.summary.percentiles.amplitude?.median, r.header.probeUnit),
        pt.pass ? p.green("meets") : p.red("short"),
      ]),
    ),
  );
  lines.push(
    r.window
      ? `  window: ${sweep.target} from ${si(r.window.from, sweep.unit)} to ${si(r.window.to, sweep.unit)} meets the required yield`
      : p.red(`  no setting of ${sweep.target} reaches the required yield`),
  );
  const worstPoint = [...r.points].sort((a, b) => a.summary.yield.value - b.summary.yield.value)[0];
  const worstIndex = worstPoint?.summary.worst[0];
  if (worstPoint && worstIndex !== undefined && !worstPoint.pass) {
    lines.push(p.dim(`  worst sample at the weakest setting: ${reproduceCommand(r.header, worstIndex, worstPoint.value)}`));
  }
  return lines;
}

/** The text report of a study. */
export function studyText(r: StudyReport, p: Paint): string[] {
  return r.kind === "tolerance" ? toleranceText(r, p) : windowText(r, p);
}

import type { SpecCriterion, YieldSummary } from "@onset/core";
import { formatPercent, formatPlain, formatSI } from "../format/index.js";
import { toleranceFigure, type Figure, type SpecLimit } from "../plot/index.js";
import type { StoredSample } from "../study/header.js";
import type { StudyReport } from "../study/study-report.js";

/** A spec's limits on one metric, labelled in words ("at least 2.4 kHz"), not in the file's syntax. */
function limitOf(criteria: readonly SpecCriterion[], metric: SpecCriterion["metric"], unit: string, scale: number, met: YieldSummary | undefined): SpecLimit | undefined {
  const c = criteria.find((x) => x.metric === metric);
  if (!c) return undefined;
  const value = (v: number) => (unit === "%" ? `${formatPlain(v * scale, 4)} %` : formatSI(v * scale, unit));
  const yieldText = met ? { yieldText: `${formatPercent(met.value, 4)} of samples meet the limit` } : {};
  if (c.test === "within") return { min: c.low, max: c.high, minLabel: `lowest allowed ${value(c.low)}`, maxLabel: `highest allowed ${value(c.high)}`, ...yieldText };
  return c.test === "below" ? { max: c.limit, maxLabel: `at most ${value(c.limit)}`, ...yieldText } : { min: c.limit, minLabel: `at least ${value(c.limit)}`, ...yieldText };
}

const column = (samples: readonly StoredSample[], key: "frequency" | "amplitude" | "thd" | "startupTime") =>
  Float64Array.from(samples, (s) => (typeof s.metrics?.[key] === "number" ? (s.metrics[key] as number) : Number.NaN));

/** A tolerance study's histograms with the spec limits; a design window's yield against the setting. */
export function studyFigure(r: StudyReport, title: string): Figure {
  const h = r.header;
  if (r.kind === "tolerance") {
    const limits: Record<string, SpecLimit> = {};
    const amplitudeUnit = h.probeUnit ?? "V";
    for (const [key, metric, unit, scale] of [["frequency", "frequency", "Hz", 1], ["amplitude", "amplitude", amplitudeUnit, 1], ["thd", "thd", "%", 100], ["startupTime", "startup", "s", 1]] as const) {
      const met = r.summary.criteria.find((c) => c.criterion.metric === metric);
      const l = limitOf(h.criteria, metric, unit, scale, met);
      if (l) limits[key] = l;
    }
    const y = r.summary.yield;
    return toleranceFigure({
      title: `${title} \u2014 tolerance, yield ${formatPercent(y.value, 4)} (${y.passed} of ${y.runs})`,
      frequency: column(r.samples, "frequency"),
      amplitude: column(r.samples, "amplitude"),
      amplitudeUnit,
      thd: column(r.samples, "thd"),
      startupTime: column(r.samples, "startupTime"),
      limits,
    });
  }
  const sweep = h.sweep!;
  const x = sweep.values;
  const markers = r.window
    ? [
        { x: r.window.from, label: "window from" },
        { x: r.window.to, label: "window to" },
      ]
    : [];
  return {
    title: `${title} \u2014 design window over ${sweep.target}`,
    sharedX: true,
    panels: [
      {
        xLabel: sweep.target,
        xUnit: sweep.unit,
        xLog: sweep.log,
        yLabel: "yield",
        yUnit: "%",
        yRange: [0, 100],
        markers,
        series: [
          { name: "yield", x, y: r.points.map((p) => p.summary.yield.value * 100), dots: true, tone: 0, style: "line" },
          { name: "95 % interval low", x, y: r.points.map((p) => p.summary.yield.interval.low * 100), tone: 1, style: "dotted" },
          { name: "required", x, y: x.map(() => sweep.required * 100), tone: 3, style: "dashed" },
        ],
      },
    ],
  };
}

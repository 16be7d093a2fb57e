import type { AnalysisResult, SpecReport } from "@onset/core";
import type { Paint } from "../color.js";
import { table } from "./table.js";
import { metric, metricUnit, percent } from "./values.js";

/** One criterion as reported: as written, what it reads, what was measured, and the outcome. */
export interface CriterionCheck {
  readonly text: string;
  readonly metric: string;
  readonly measured: number | null;
  /** The unit of `measured` (`1` for a fraction): Hz, s, or the probe's unit for the swing's figures. A study's yield rows: `1`. */
  readonly unit?: string;
  readonly pass: boolean;
  /** In a tolerance study: how many samples met it, of how many, and the 95 % Wilson interval of that yield. */
  readonly passed?: number;
  readonly runs?: number;
  readonly interval?: { readonly low: number; readonly high: number };
  /** The study's yield: samples that settle and meet every criterion together. */
  readonly combined?: boolean;
}

/** The checks of a whole spec and whether all of them passed. */
export interface SpecChecks {
  readonly pass: boolean;
  readonly criteria: readonly CriterionCheck[];
  /** Where the criteria were checked: the first start-up, or the tolerance study's yield. */
  readonly on: string;
}

/** The unit of the probe a spec is checked on: the first start-up's, else the first steady state's (a sweep's under measure=steady), else volts. */
export function judgedProbeUnit(results: readonly AnalysisResult[]): string {
  const judged = results.find((r) => r.analysis === "startup") ?? results.find((r) => r.analysis === "steady");
  return judged && (judged.analysis === "startup" || judged.analysis === "steady") ? judged.unit : "V";
}

/** The spec report of the engine in the form reports and JSON share; the swing's figures are in `probeUnit`, the unit of the probe it was checked on. */
export function specChecks(report: SpecReport, on: string, probeUnit: string): SpecChecks {
  return {
    pass: report.pass,
    on,
    criteria: report.criteria.map((c) => ({ text: c.criterion.text, metric: c.criterion.metric, measured: c.measured, unit: metricUnit(c.criterion.metric, probeUnit), pass: c.pass })),
  };
}

function outcomeWord(spec: SpecChecks, p: Paint): string {
  return spec.pass ? p.green("met") : p.red("NOT met");
}

/** A study's spec: each criterion's own yield with its interval, then all of them together. */
function yieldReport(spec: SpecChecks, overall: CriterionCheck, p: Paint): string[] {
  const own = spec.criteria.filter((c) => !c.combined);
  const meetAll = own.length === 0 ? "settle" : `settle and meet ${own.length === 1 ? "the criterion" : `all ${own.length} criteria`}`;
  const lines = [
    `${p.bold("spec")} ${outcomeWord(spec, p)}: ${overall.passed} of ${overall.runs} samples ${meetAll} (yield ${percent(overall.measured)}, required: ${overall.text})`,
  ];
  lines.push(
    ...table(
      [{ header: "criterion" }, { header: "yield", align: "right" }, { header: "95 % interval", align: "right" }, { header: "samples", align: "right" }, { header: "result" }],
      spec.criteria.map((c) => [
        c.combined ? `all together (${c.text})` : c.text,
        percent(c.measured),
        c.interval ? `${percent(c.interval.low)} to ${percent(c.interval.high)}` : "",
        c.passed === undefined ? "" : `${c.passed} of ${c.runs}`,
        c.pass ? p.green("pass") : p.red("FAIL"),
      ]),
    ),
  );
  return lines;
}

/** The spec: each criterion with its measured value (or its yield in a study) and pass/fail, and the overall outcome. */
export function specReport(spec: SpecChecks, p: Paint): string[] {
  const overall = spec.criteria.find((c) => c.combined);
  if (overall) return yieldReport(spec, overall, p);
  const met = spec.criteria.filter((c) => c.pass).length;
  const lines = [`${p.bold("spec")} ${outcomeWord(spec, p)}: ${met} of ${spec.criteria.length} criteria pass` + p.dim(` (checked on ${spec.on})`)];
  lines.push(
    ...table(
      [{ header: "criterion" }, { header: "measured", align: "right" }, { header: "result" }],
      spec.criteria.map((c) => [c.text, metric(c.metric, c.measured, c.unit), c.pass ? p.green("pass") : p.red("FAIL")]),
    ),
  );
  return lines;
}

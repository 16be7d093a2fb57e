import type { SpecReport } from "@onset/core";
import type { Paint } from "../color.js";
import { table } from "./table.js";
import { metric } from "./values.js";

/** One criterion as reported: as written, what it reads, what was measured, and the outcome. */
export interface CriterionCheck {
  readonly text: string;
  readonly metric: string;
  readonly measured: number | null;
  readonly pass: boolean;
}

/** The checks of a whole spec and whether all of them passed. */
export interface SpecChecks {
  readonly pass: boolean;
  readonly criteria: readonly CriterionCheck[];
  /** Where the criteria were checked: the first start-up, or the tolerance study's yield. */
  readonly on: string;
}

/** The spec report of the engine in the form reports and JSON share. */
export function specChecks(report: SpecReport, on: string): SpecChecks {
  return {
    pass: report.pass,
    on,
    criteria: report.criteria.map((c) => ({ text: c.criterion.text, metric: c.criterion.metric, measured: c.measured, pass: c.pass })),
  };
}

/** The spec: each criterion with its measured value and pass/fail, and the overall outcome. */
export function specReport(spec: SpecChecks, p: Paint): string[] {
  const met = spec.criteria.filter((c) => c.pass).length;
  const outcome = spec.pass ? p.green("met") : p.red("NOT met");
  const lines = [`${p.bold("spec")} ${outcome}: ${met} of ${spec.criteria.length} criteria pass` + p.dim(` (checked on ${spec.on})`)];
  lines.push(
    ...table(
      [{ header: "criterion" }, { header: "measured", align: "right" }, { header: "result" }],
      spec.criteria.map((c) => [c.text, metric(c.metric, c.measured), c.pass ? p.green("pass") : p.red("FAIL")]),
    ),
  );
  return lines;
}

import { writersOf } from "../analyses/registry.js";
import type { Paint } from "../color.js";
import { specReport } from "../report/spec.js";
import { studySampleText } from "../report/study-sample.js";
import { studyText } from "../report/study.js";
import { sweepText } from "../report/sweep.js";
import type { Outcome, ReportSubject } from "./outcome.js";

function plainSections(outcome: Extract<Outcome, { kind: "plain" }>, p: Paint): string[][] {
  return outcome.runs.map((run) => writersOf(run.result.analysis).text(run, outcome.runs, p));
}

/** The unit of the first start-up or steady analysis's probe (the one a steady study measures), else volts. */
function probeUnit(outcome: Extract<Outcome, { kind: "plain" }>): string {
  for (const { result } of outcome.runs) if (result.analysis === "steady" || result.analysis === "startup") return result.unit;
  return "V";
}

/** `--sample I` under measure=steady: the study's own figures for the sample (see `studySampleText`), or null. */
export function studySampleLines(outcome: Extract<Outcome, { kind: "plain" }>, p: Paint): string[] | null {
  return outcome.sample?.study ? studySampleText(outcome.sample.index, outcome.sample.study, probeUnit(outcome), p) : null;
}

/** The readable report: a heading, one section per analysis (or the study), then the spec. */
export function outcomeText(subject: ReportSubject, outcome: Outcome, p: Paint): string {
  const heading = subject.title ? `${p.bold(subject.title)}  ${p.dim(subject.file)}` : p.bold(subject.file);
  const head = [heading];
  const sets = Object.entries(subject.overrides);
  if (sets.length > 0) head.push(p.dim(`set ${sets.map(([k, v]) => `${k}=${v}`).join(", ")}`));
  if (outcome.kind === "plain" && outcome.sample) {
    const drawn = Object.entries(outcome.sample.drawn).map(([k, v]) => `${k} = ${v.toPrecision(6)}`);
    head.push(p.dim(`tolerance sample #${outcome.sample.index}: ${drawn.join(", ") || "nothing drawn"}`));
  }
  const sections: string[][] = [head];
  if (outcome.kind === "plain") {
    const study = studySampleLines(outcome, p);
    if (study) sections.push(study);
    sections.push(...plainSections(outcome, p));
    if (outcome.runs.length === 0) sections.push(["no analyses to run: add one such as: startup probe=o"]);
    if (outcome.spec) sections.push(specReport(outcome.spec, p));
  } else if (outcome.kind === "study") {
    sections.push(studyText(outcome.report, p));
    if (outcome.report.spec) {
      const spec = specReport(outcome.report.spec, p);
      if (outcome.report.header.shard) spec.push(p.dim("  (one shard only: merge every shard with onset merge to judge the spec)"));
      sections.push(spec);
    }
  } else {
    sections.push(sweepText(outcome.report, p));
    if (outcome.report.spec) sections.push(specReport(outcome.report.spec, p));
  }
  return `${sections.map((s) => s.join("\n")).join("\n\n")}\n`;
}

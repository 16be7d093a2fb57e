import { paint } from "../color.js";
import type { Json } from "../json/results.js";
import { outcomeDocument } from "../output/document.js";
import type { Outcome, ReportSubject } from "../output/outcome.js";
import { outcomeText, studySampleLines } from "../output/text.js";
import { studyFigure } from "../svg/study.js";
import { sweepSvgFigure } from "../svg/sweep.js";
import { tag, textTag } from "./markup.js";
import { htmlPage } from "./page.js";
import { plainSection } from "./plain-sections.js";
import { plotMarkup, type PagePlot } from "./plots.js";
import { resultPlots } from "./result-plots.js";
import { specSection, sweepSection, toleranceSection, windowSection } from "./study-sections.js";
import { field, list, str } from "./tables.js";

const WIDE = 1320;

function plotsMarkup(plots: readonly PagePlot[]): string {
  if (plots.length === 0) return "";
  return tag("div", { class: "plots" }, plots.map(plotMarkup).join(""));
}

function section(kind: string, id: string, content: string): string {
  return tag("section", { class: "analysis", id, "data-analysis": kind }, textTag("h2", {}, kind) + content);
}

function heading(subject: ReportSubject, doc: Json, exit: number): string {
  const sets = Object.entries(subject.overrides).map(([k, v]) => `${k}=${v}`);
  const sample = field(doc, "sample");
  const lines = [textTag("h1", {}, subject.title ?? subject.file), textTag("div", { class: "file" }, subject.file)];
  if (sets.length > 0) lines.push(textTag("div", { class: "file" }, `set ${sets.join(", ")}`));
  if (sample) lines.push(textTag("div", { class: "file" }, `tolerance sample #${String(field(sample, "index"))}`));
  const spec = field(doc, "spec");
  if (spec !== null && spec !== undefined) {
    const pass = field(spec, "pass") === true;
    lines.push(tag("div", { class: "outcome" }, `spec ${textTag("span", { class: `verdict ${pass ? "good" : "bad"}` }, pass ? "met" : "NOT met")} ${textTag("span", { class: "muted" }, `exit status ${exit}`)}`));
  }
  return tag("header", { class: "page" }, lines.join(""));
}

function bodySections(outcome: Outcome, doc: Json): string[] {
  const results = list(doc, "results");
  switch (outcome.kind) {
    case "plain": {
      // --sample I under measure=steady: the study's own figures first, as the terminal gives them.
      const lines = studySampleLines(outcome, paint(false));
      const study = lines ? [section("study sample", "a0-study", textTag("pre", {}, lines.join("\n")))] : [];
      if (outcome.runs.length === 0) return [section("no analyses", "a0", textTag("p", { class: "explanation" }, "no analyses to run: add one such as: startup probe=o"))];
      const analyses = outcome.runs.map((run, k) => {
        const d = results[k] ?? null;
        const key = `a${k + 1}`;
        return section(str(d, "analysis") ?? run.result.analysis, key, plainSection(d) + plotsMarkup(resultPlots(run, key)));
      });
      return [...study, ...analyses];
    }
    case "study": {
      const d = results[0] ?? null;
      const figure = { ...studyFigure(outcome.report, "samples"), width: WIDE };
      const text = outcome.report.kind === "tolerance" ? toleranceSection(d) : windowSection(d);
      return [section(outcome.report.kind === "tolerance" ? "tolerance" : "design window", "a1", text + plotsMarkup([{ id: "a1-study", figure }]))];
    }
    case "sweep": {
      const d = results[0] ?? null;
      const figure = { ...sweepSvgFigure(outcome.report, ""), title: `amplitude, frequency and THD against ${outcome.report.result.target}${outcome.report.result.measure === "steady" ? " (periodic steady state)" : ""}`, width: WIDE };
      return [section("sweep", "a1", sweepSection(d) + plotsMarkup([{ id: "a1-sweep", figure }]))];
    }
  }
}

/**
 * The HTML report of an outcome: the same document `--json` prints (see `outcomeDocument`)
 * laid out as tables with the verdicts and their explanations, the plots of every analysis
 * (zoomable on time axes, values on hover), the spec, and the text report as the terminal
 * shows it. One self-contained file: nothing is fetched when it opens.
 */
export function outcomeHtml(subject: ReportSubject, outcome: Outcome, exit: number): string {
  const doc = outcomeDocument(subject, outcome, exit);
  const sections = bodySections(outcome, doc);
  const spec = field(doc, "spec");
  if (spec !== null && spec !== undefined) sections.push(section("spec", "spec", specSection(spec)));
  const terminal = tag("details", { class: "terminal" }, textTag("summary", {}, "the report as printed on the terminal") + textTag("pre", {}, outcomeText(subject, outcome, paint(false))));
  const body = heading(subject, doc, exit) + tag("main", {}, sections.join("") + terminal) + textTag("footer", {}, "written by onset");
  return htmlPage(subject.title ?? subject.file, body);
}

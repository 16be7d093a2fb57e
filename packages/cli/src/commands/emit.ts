import { outcomeHtml } from "../html/report.js";
import { outcomeDocument } from "../output/document.js";
import { outcomeCsvs, svgDocuments, writeDocuments } from "../output/files.js";
import { outcomeExit, type Outcome, type ReportSubject } from "../output/outcome.js";
import type { OutputTarget } from "../output/target.js";
import { outcomeText } from "../output/text.js";
import type { CommandContext } from "./context.js";

/** The data files a command writes besides its report, classified and checked before the work. */
export interface OutcomeOutputs {
  readonly csv: OutputTarget | null;
  readonly svg: OutputTarget | null;
  /** The one HTML report (`--html`). */
  readonly html?: OutputTarget | null;
  /** The results file already written, if any: when it went to stdout, the report moves too. */
  readonly results?: OutputTarget | null;
}

/**
 * Writes what an outcome produced: the CSV and SVG documents (see `writeDocuments`) and the
 * HTML report, then the
 * report: the one JSON document on stdout, or the text on stdout — on stderr when a document
 * took stdout (`--csv -`), so stdout stays parseable. Returns the exit status (1 when a spec failed).
 */
export function emitOutcome(ctx: CommandContext, outputs: OutcomeOutputs, subject: ReportSubject, outcome: Outcome): number {
  const exit = outcomeExit(outcome);
  const title = subject.title ?? subject.file;
  const written: OutputTarget[] = [];
  const { cwd, stdout } = ctx.io;
  if (outputs.csv) {
    const docs = outcomeCsvs(outcome);
    if (docs.length === 0) ctx.note("--csv: no analysis in this file has a CSV");
    written.push(...writeDocuments(outputs.csv, docs, cwd, "CSV tables", stdout));
  }
  if (outputs.svg) {
    const docs = svgDocuments(outcome, title);
    if (docs.length === 0) ctx.note("--svg: no analysis in this file has a plot (bias and poles are tables)");
    written.push(...writeDocuments(outputs.svg, docs, cwd, "plots", stdout));
  }
  if (outputs.html) written.push(...writeDocuments(outputs.html, [outcomeHtml(subject, outcome, exit)], cwd, "reports", stdout));
  const stdoutTaken = [outputs.csv, outputs.svg, outputs.html, outputs.results].some((t) => t?.kind === "stdout");
  if (ctx.json) stdout(`${JSON.stringify(outcomeDocument(subject, outcome, exit), null, 2)}\n`);
  else if (!ctx.quiet && stdoutTaken) ctx.io.stderr(outcomeText(subject, outcome, ctx.paintErr));
  else if (!ctx.quiet) stdout(outcomeText(subject, outcome, ctx.paintOut));
  for (const t of written) if (t.kind !== "stdout") ctx.note(`wrote ${t.shown}`);
  return exit;
}

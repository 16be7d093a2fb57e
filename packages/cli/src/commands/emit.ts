import type { ParsedArgs } from "../args.js";
import { valueOf } from "../args.js";
import { outcomeDocument } from "../output/document.js";
import { outcomeCsvs, svgDocuments, writeNumbered } from "../output/files.js";
import { outcomeSpec, type Outcome, type ReportSubject } from "../output/outcome.js";
import { outcomeText } from "../output/text.js";
import { EXIT } from "../exit.js";
import type { CommandContext } from "./context.js";

/**
 * Writes what an outcome produced: CSV and SVG files (each atomically), then the report on
 * stdout (text, or the one JSON document); returns the exit status (1 when a spec failed).
 */
export function emitOutcome(ctx: CommandContext, args: ParsedArgs, subject: ReportSubject, outcome: Outcome): number {
  const spec = outcomeSpec(outcome);
  const exit = spec && !spec.pass ? EXIT.specFailed : EXIT.ok;
  const title = subject.title ?? subject.file;
  const written: string[] = [];
  const csv = valueOf(args, "csv");
  if (csv !== undefined) {
    const docs = outcomeCsvs(outcome);
    if (docs.length === 0) ctx.note("--csv: no analysis in this file has a CSV");
    written.push(...writeNumbered(csv, ctx.io.cwd, docs));
  }
  const svg = valueOf(args, "svg");
  if (svg !== undefined) {
    const docs = svgDocuments(outcome, title);
    if (docs.length === 0) ctx.note("--svg: no analysis in this file has a plot (bias and poles are tables)");
    written.push(...writeNumbered(svg, ctx.io.cwd, docs));
  }
  if (ctx.json) ctx.io.stdout(`${JSON.stringify(outcomeDocument(subject, outcome, exit), null, 2)}\n`);
  else if (!ctx.quiet) ctx.io.stdout(outcomeText(subject, outcome, ctx.paintOut));
  for (const name of written) ctx.note(`wrote ${name}`);
  return exit;
}

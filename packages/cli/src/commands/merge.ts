import { resolve } from "node:path";
import type { ParsedArgs } from "../args.js";
import { usageError } from "../cli-error.js";
import { sampleKey, type StoredSample, type StudyHeader } from "../study/header.js";
import { headerDifferences } from "../study/header.js";
import { checkOutputs, refuseInputs } from "../output/plan.js";
import { writeOutput } from "../output/write.js";
import { cutSample, readResults } from "../study/results-file.js";
import { studyReport } from "../study/study-report.js";
import { verifyRecords } from "../study/verify-records.js";
import type { CommandContext } from "./context.js";
import { emitOutcome } from "./emit.js";
import { optionTarget } from "./output-options.js";

/** Shards named in a list of results files that cover none of the missing samples. */
function missingShards(headers: readonly StudyHeader[]): string {
  const count = headers.find((h) => h.shard)?.shard?.count;
  if (count === undefined) return "";
  const have = new Set(headers.map((h) => h.shard?.index));
  const absent = Array.from({ length: count }, (_, k) => k).filter((k) => !have.has(k));
  return absent.length > 0 ? ` (shards ${absent.map((k) => `${k}/${count}`).join(", ")} not given)` : "";
}

/**
 * `onset merge RESULTS...`: combines the results files of one study (shards, resumed runs)
 * into the report a single run gives, byte for byte. Every sample of the study must be there.
 * A file whose last line was cut off (an interrupted run) is merged without that line, with a
 * warning naming file:line; the merge still refuses to report unless every sample is present,
 * so a cut-off line never leaves a sample out of the report silently.
 */
export function mergeCommand(ctx: CommandContext, args: ParsedArgs): number {
  const files = args.positionals;
  const outputs = { csv: optionTarget(ctx, args, "csv"), svg: optionTarget(ctx, args, "svg"), html: optionTarget(ctx, args, "html") };
  const out = optionTarget(ctx, args, "results");
  checkOutputs([outputs.csv, outputs.svg, outputs.html, out], ctx.json);
  // The merged results may replace one of the files merged (they are all read first); a CSV or plot may not.
  refuseInputs([outputs.csv, outputs.svg, outputs.html], files, ctx.io.cwd);
  const contents = files.map((f) => ({ file: f, content: readResults(resolve(ctx.io.cwd, f), f) }));
  for (const { file, content } of contents) verifyRecords(file, content.header, content.samples, content.lines);
  const first = contents[0]!;
  for (const { file, content } of contents.slice(1)) {
    const differences = headerDifferences(first.content.header, content.header, true);
    if (differences.length > 0) {
      throw usageError("results-mismatch", `${file} belongs to another study than ${first.file} (${differences.join(", ")} differ)`, "merge only the results of one file, run with the same --set values and seed");
    }
  }
  const counts = new Set(contents.map((c) => c.content.header.shard?.count ?? 1));
  if (counts.size > 1) throw usageError("results-mismatch", "the results files split the study into different numbers of shards", "merge shards of one split (all k/n with the same n)");
  const samples = new Map<string, StoredSample>();
  const cuts: string[] = [];
  for (const { file, content } of contents) {
    const cut = content.truncated;
    if (cut) {
      ctx.warn(`${file}:${cut.line}`, `the last line was cut off (an interrupted run): ${cutSample(cut)} is left out`);
      cuts.push(`${file}:${cut.line}`);
    }
    for (const sample of content.samples) {
      const key = sampleKey(sample);
      const before = samples.get(key);
      if (before && JSON.stringify(before) !== JSON.stringify(sample)) {
        throw usageError("results-conflict", `sample ${sample.index} differs between the results files`, "the files were run with different settings; run the study again");
      }
      samples.set(key, sample);
    }
  }
  const header: StudyHeader = { ...first.content.header, shard: null };
  const report = studyReport(header, [...samples.values()]);
  if (report.missing.length > 0) {
    const shown = report.missing.slice(0, 8).join(", ");
    throw usageError(
      "incomplete-results",
      `the results files hold ${samples.size} of the study's samples; ${report.missing.length} ${report.missing.length === 1 ? "is" : "are"} missing${missingShards(contents.map((c) => c.content.header))}${cuts.length > 0 ? ` (a line was cut off at ${cuts.join(", ")})` : ""}`,
      `missing sample indices: ${shown}${report.missing.length > 8 ? ", …" : ""}; finish them with onset run ${header.file} --shard k/n --resume`,
    );
  }
  if (out !== null) {
    const ordered = [...samples.values()].sort((a, b) => (a.point ?? 0) - (b.point ?? 0) || a.index - b.index);
    writeOutput(out, [header, ...ordered].map((line) => `${JSON.stringify(line)}\n`).join(""), ctx.io.stdout);
    if (out.kind !== "stdout") ctx.note(`wrote ${out.shown}`);
  }
  return emitOutcome(ctx, { ...outputs, results: out }, { file: header.file, title: header.title, overrides: header.overrides }, { kind: "study", report });
}

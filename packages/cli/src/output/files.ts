import type { SimulatingKind } from "@onset/core";
import { hasCsv, resultCsv } from "../csv/plain.js";
import { studyCsv } from "../csv/study.js";
import { sweepCsv } from "../csv/sweep.js";
import { renderFigure, type Figure } from "../plot/index.js";
import { hasFigure, resultFigure } from "../svg/plain.js";
import { studyFigure } from "../svg/study.js";
import { sweepSvgFigure } from "../svg/sweep.js";
import type { Outcome } from "./outcome.js";
import { documentTargets } from "./plan.js";
import { isStream, type OutputTarget } from "./target.js";
import { writeOutput, type StdoutWriter } from "./write.js";

/** The CSV documents of an outcome, in file order (analyses without one are skipped). */
export function outcomeCsvs(outcome: Outcome): string[] {
  switch (outcome.kind) {
    case "plain":
      return outcome.runs.flatMap((r) => {
        const csv = resultCsv(r.result);
        return csv === null ? [] : [csv];
      });
    case "study":
      return [studyCsv(outcome.report)];
    case "sweep":
      return [sweepCsv(outcome.report)];
  }
}

/**
 * How many CSV and SVG documents an outcome makes, known before simulating: one each for a
 * study or a sweep; for plain runs a CSV and a plot per analysis that has one.
 */
export function documentCounts(plainKinds: readonly SimulatingKind[] | null): { csv: number; svg: number } {
  if (plainKinds === null) return { csv: 1, svg: 1 };
  return { csv: plainKinds.filter(hasCsv).length, svg: plainKinds.filter(hasFigure).length };
}

/** The figures of an outcome, in file order (bias and poles have none). */
export function outcomeFigures(outcome: Outcome, title: string): Figure[] {
  switch (outcome.kind) {
    case "plain":
      return outcome.runs.flatMap((r) => {
        const f = resultFigure(r, title);
        return f === null ? [] : [f];
      });
    case "study":
      return [studyFigure(outcome.report, title)];
    case "sweep":
      return [sweepSvgFigure(outcome.report, title)];
  }
}

/**
 * Writes the documents of one option to its target: a file name takes them as `FILE`,
 * `FILE-2`, … (see `documentTargets`), a stream takes the one document. Returns the targets
 * written. A stream is written even with no document, so a reader waiting on it sees its end.
 */
export function writeDocuments(target: OutputTarget, documents: readonly string[], cwd: string, what: string, stdout: StdoutWriter): OutputTarget[] {
  const targets = documentTargets(target, documents.length, cwd, what);
  if (isStream(target) && documents.length === 0) writeOutput(target, "", stdout);
  targets.forEach((t, k) => writeOutput(t, documents[k]!, stdout));
  return targets;
}

export function svgDocuments(outcome: Outcome, title: string): string[] {
  return outcomeFigures(outcome, title).map(renderFigure);
}

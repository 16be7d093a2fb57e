import { resolve } from "node:path";
import { writeFileAtomic } from "../atomic.js";
import { resultCsv } from "../csv/plain.js";
import { studyCsv } from "../csv/study.js";
import { sweepCsv } from "../csv/sweep.js";
import { numberedPath } from "../output-files.js";
import { renderFigure, type Figure } from "../plot/index.js";
import { resultFigure } from "../svg/plain.js";
import { studyFigure } from "../svg/study.js";
import { sweepSvgFigure } from "../svg/sweep.js";
import type { Outcome } from "./outcome.js";

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
 * Writes the documents to `path`, `path-2`, `path-3`, … (see `numberedPath`), each replaced
 * atomically; returns the names written.
 */
export function writeNumbered(path: string, cwd: string, documents: readonly string[]): string[] {
  return documents.map((text, k) => {
    const name = numberedPath(path, k);
    writeFileAtomic(resolve(cwd, name), text);
    return name;
  });
}

export function svgDocuments(outcome: Outcome, title: string): string[] {
  return outcomeFigures(outcome, title).map(renderFigure);
}

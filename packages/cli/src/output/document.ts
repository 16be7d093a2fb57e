import { resultsJson, type Json } from "../json/results.js";
import { studyJson } from "../json/study.js";
import { sweepJson } from "../json/sweep.js";
import type { Outcome, ReportSubject } from "./outcome.js";

/**
 * The one JSON document of `--json`: `{ file, title, overrides, results, spec, exit }`, numbers
 * in SI base units, no waveform arrays and no timing, so the same study gives the same bytes.
 */
export function outcomeDocument(subject: ReportSubject, outcome: Outcome, exit: number): Json {
  let results: Json[];
  let spec: Json = null;
  let sample: Json | undefined;
  switch (outcome.kind) {
    case "plain":
      results = resultsJson(outcome.runs);
      spec = outcome.spec as unknown as Json;
      sample = outcome.sample ? { index: outcome.sample.index, drawn: { ...outcome.sample.drawn } } : undefined;
      break;
    case "study":
      results = [studyJson(outcome.report)];
      spec = outcome.report.spec as unknown as Json;
      break;
    case "sweep":
      results = [sweepJson(outcome.report, outcome.analyses)];
      spec = outcome.report.spec as unknown as Json;
      break;
  }
  return { file: subject.file, title: subject.title, overrides: { ...subject.overrides }, sample, results, spec, exit };
}

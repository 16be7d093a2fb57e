import { resultsJson, type Json } from "../json/results.js";
import { sampleJson, studyJson } from "../json/study.js";
import { sweepJson } from "../json/sweep.js";
import type { Outcome, ReportSubject, SampleRerun } from "./outcome.js";

/** `--sample I`: the index, the drawn values and, under measure=steady, the study's own figures for the sample (`study`, as the study's JSON lists it). */
function sampleRerunJson(s: SampleRerun): Json {
  const study = s.study ? { study: { measure: "steady", ...(s.study.setting ? { setting: { ...s.study.setting } } : {}), ...(sampleJson(s.study.sample) as Record<string, Json>) } } : {};
  return { index: s.index, drawn: { ...s.drawn }, ...study };
}

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
      sample = outcome.sample ? sampleRerunJson(outcome.sample) : undefined;
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

import type { SimulatingAnalysis } from "@onset/core";
import { EXIT, type ExitStatus } from "../exit.js";
import type { AnalysisRun } from "../report/plain-types.js";
import type { SpecChecks } from "../report/spec.js";
import type { StudySample } from "../study/study-sample.js";
import type { StudyReport } from "../study/study-report.js";
import type { SweepReport } from "../study/sweep-report.js";

/** What the report is about: the file, its title and the `--set` overrides. */
export interface ReportSubject {
  readonly file: string;
  readonly title: string | null;
  readonly overrides: Readonly<Record<string, string>>;
}

/** A sample of a tolerance study rerun on its own (`--sample I`). */
export interface SampleRerun {
  readonly index: number;
  readonly drawn: Readonly<Record<string, number>>;
  /** Under measure=steady: the sample as the study ran it (its figures differ from a full steady analysis by the single grid's error). */
  readonly study?: StudySample;
}

/** What one `onset run` (or `onset merge`) produced. */
export type Outcome =
  | { readonly kind: "plain"; readonly runs: readonly AnalysisRun[]; readonly spec: SpecChecks | null; readonly sample?: SampleRerun }
  | { readonly kind: "study"; readonly report: StudyReport }
  | { readonly kind: "sweep"; readonly report: SweepReport; readonly analyses: readonly SimulatingAnalysis[] };

/** The spec outcome the exit status follows; a shard alone judges nothing (its yield is partial). */
export function outcomeSpec(outcome: Outcome): SpecChecks | null {
  switch (outcome.kind) {
    case "plain":
      return outcome.spec;
    case "study":
      return outcome.report.header.shard ? null : outcome.report.spec;
    case "sweep":
      return outcome.report.spec;
  }
}

/**
 * The exit status of a finished outcome: 1 when its spec is not met, else 0. `--sample I` under
 * measure=steady reproduces the study's sample, so it follows the study's verdict on that
 * sample (when the study has a spec to judge it by), not the fresh full analysis printed after it.
 */
export function outcomeExit(outcome: Outcome): ExitStatus {
  const study = outcome.kind === "plain" ? outcome.sample?.study : undefined;
  if (study) return study.judged && !study.sample.pass ? EXIT.specFailed : EXIT.ok;
  const spec = outcomeSpec(outcome);
  return spec && !spec.pass ? EXIT.specFailed : EXIT.ok;
}

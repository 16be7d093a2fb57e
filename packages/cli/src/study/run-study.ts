import { basename, dirname, extname, join } from "node:path";
import {
  runToleranceStudy,
  shardIndices,
  specCriteria,
  sweepValues,
  type Circuit,
  type Shard,
  type SweepAnalysis,
  type ToleranceAnalysis,
  type ToleranceSpec,
} from "@onset/core";
import { usageError } from "../cli-error.js";
import { elaborateSource, STDIN_NAME, type LoadedSource } from "../input/source.js";
import type { Progress } from "../progress.js";
import { headerDifferences, sampleKey, throughJson, type StoredSample, type StudyHeader } from "./header.js";
import { readResults, ResultsWriter, resultsExist } from "./results-file.js";
import { requiredYield, studyReport, type StudyReport } from "./study-report.js";
import { shownUnit, targetInfo } from "./target.js";

/** Everything a tolerance study (or design window) run needs. */
export interface StudySettings {
  readonly source: LoadedSource;
  readonly overrides: Readonly<Record<string, string>>;
  /** The circuit elaborated with the overrides (its tolerances and analyses). */
  readonly circuit: Circuit;
  readonly tolerance: ToleranceAnalysis;
  /** With a sweep, the study is a design window. */
  readonly sweep?: SweepAnalysis;
  readonly jobs: number;
  readonly shard: Shard | null;
  readonly resume: boolean;
  /** Where samples are appended; null writes none. */
  readonly resultsPath: string | null;
  /** The results file as the user named it, for messages. */
  readonly resultsName?: string;
  readonly progress: Progress;
  /** A note for standard error (dropped under --quiet). */
  readonly note: (text: string) => void;
}

/**
 * The results file a study writes by default: beside the circuit, `NAME.results.jsonl`, or
 * `NAME.shard-K-of-N.results.jsonl` for a shard; none for standard input.
 */
export function defaultResultsPath(file: string, shard: Shard | null): string | null {
  if (file === STDIN_NAME) return null;
  const ext = extname(file);
  const stem = basename(file, ext);
  const tail = shard ? `.shard-${shard.index}-of-${shard.count}` : "";
  return join(dirname(file), `${stem}${tail}.results.jsonl`);
}

/** The values a study draws: every tolerance except a swept one (the trimmer is set, not drawn). */
export function drawnTolerances(circuit: Circuit, sweep: SweepAnalysis | undefined): ToleranceSpec[] {
  return circuit.tolerances.filter((t) => !sweep || t.target !== sweep.target);
}

/** The header that identifies a study and carries what its report needs. */
export function studyHeader(s: Pick<StudySettings, "source" | "overrides" | "circuit" | "tolerance" | "sweep" | "shard">): StudyHeader {
  const criteria = specCriteria(s.circuit).map(({ span: _span, ...c }) => c);
  const sweep = s.sweep
    ? {
        target: s.sweep.target,
        unit: targetInfo(s.circuit, s.source.program, s.sweep.target, s.overrides).unit,
        log: s.sweep.log,
        values: sweepValues(s.sweep),
        required: requiredYield({ criteria }),
      }
    : null;
  return throughJson({
    onset: "tolerance-results",
    version: 1,
    file: s.source.file,
    title: s.circuit.title ?? null,
    hash: s.source.hash,
    overrides: { ...s.overrides },
    runs: s.tolerance.runs,
    seed: s.tolerance.seed,
    dist: s.tolerance.dist,
    shard: s.shard ? { index: s.shard.index, count: s.shard.count } : null,
    tolerances: drawnTolerances(s.circuit, s.sweep).map(({ span: _span, target, unit, ...t }) => ({
      target,
      unit: unit === undefined ? targetInfo(s.circuit, s.source.program, target, s.overrides).unit : shownUnit(unit),
      ...t,
    })),
    criteria,
    sweep,
  });
}

/** Samples kept from an earlier, interrupted run of the same study (`--resume`). */
function resumed(s: StudySettings, header: StudyHeader, path: string): StoredSample[] {
  const name = s.resultsName ?? path;
  if (!resultsExist(path)) {
    s.note(`no results file ${name} yet: starting the study`);
    return [];
  }
  const content = readResults(path, name);
  const differences = headerDifferences(content.header, header);
  if (differences.length > 0) {
    throw usageError(
      "results-mismatch",
      `cannot resume from ${name}: it holds a different study (${differences.join(", ")} differ)`,
      "run without --resume to start afresh, or give the same file, --set values and --shard as before",
    );
  }
  if (content.truncated) s.note(`${name}: the last line was cut off (interrupted run); that sample runs again`);
  const seen = new Set<string>();
  return content.samples.filter((sample) => {
    const key = sampleKey(sample);
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

/**
 * Runs the Monte Carlo samples of the study (every sweep setting of a design window in turn),
 * appending each finished sample to the results file, and reports on all of them.
 */
export async function runStudy(s: StudySettings): Promise<StudyReport> {
  const header = studyHeader(s);
  if (s.resume && !s.resultsPath) throw usageError("no-results-file", "--resume needs a results file", "give --results FILE (standard input has no default results file)");
  const kept = s.resultsPath && s.resume ? resumed(s, header, s.resultsPath) : [];
  const writer = s.resultsPath ? new ResultsWriter(s.resultsPath) : null;
  writer?.start(header, kept);
  const samples: StoredSample[] = [...kept];
  const settings = header.sweep ? header.sweep.values : [null];
  const indices = shardIndices(header.runs, s.shard ?? undefined);
  const total = settings.length * indices.length - kept.length;
  let done = 0;
  const tick = s.progress.counter("samples", total);
  const build = (values: Readonly<Record<string, number>>) => elaborateSource(s.source, { ...s.overrides, ...values }).circuit;
  const tolerances = drawnTolerances(s.circuit, s.sweep);
  const criteria = specCriteria(s.circuit);
  try {
    for (let k = 0; k < settings.length; k++) {
      const value = settings[k];
      const point = value === null ? {} : { point: k };
      const already = new Set(kept.filter((x) => (x.point ?? 0) === k).map((x) => x.index));
      await runToleranceStudy(build, tolerances, s.tolerance, criteria, {
        jobs: s.jobs,
        ...(s.shard ? { shard: s.shard } : {}),
        done: already,
        ...(value === null ? {} : { fixed: { [s.sweep!.target]: value } }),
        onSample: (sample) => {
          const stored = throughJson<StoredSample>({ ...point, ...sample });
          writer?.append(stored);
          samples.push(stored);
          tick(++done);
        },
      });
    }
  } finally {
    writer?.close();
    s.progress.stop();
  }
  return studyReport(header, samples);
}

import { basename, dirname, extname, join } from "node:path";
import {
  RunBudget,
  runToleranceStudy,
  shardIndices,
  specCriteria,
  studyProbeUnit,
  sweepValues,
  type Circuit,
  type PortableBuilder,
  type RunLimits,
  type Shard,
  type SweepAnalysis,
  type ToleranceAnalysis,
  type ToleranceSpec,
} from "@onset/core";
import { workerPool } from "@onset/core/node";
import { usageError } from "../cli-error.js";
import { elaborateSource, STDIN_NAME, type LoadedSource } from "../input/source.js";
import type { OutputTarget } from "../output/target.js";
import type { StdoutWriter } from "../output/write.js";
import type { Progress } from "../progress.js";
import { headerDifferences, sampleKey, throughJson, type StoredSample, type StudyHeader } from "./header.js";
import { cutSample, readResults, ResultsWriter } from "./results-file.js";
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
  /** Limits of each sample's run, and of the whole study (wall time, signal). */
  readonly limits: RunLimits;
  readonly shard: Shard | null;
  readonly resume: boolean;
  /** Where samples are appended (classified and checked before the study); null writes none. */
  readonly results: OutputTarget | null;
  /** Where a results target of `-` goes. */
  readonly stdout: StdoutWriter;
  readonly progress: Progress;
  /** A note for standard error (dropped under --quiet). */
  readonly note: (text: string) => void;
  /** A warning for standard error at a place (`file:line`): something was wrong and is dealt with. */
  readonly warn: (place: string, message: string) => void;
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

/** The measured probe's unit, when it is not a voltage (a results file of a voltage probe keeps its old header). */
function probeUnitField(circuit: Circuit, measure: ToleranceAnalysis["measure"]): { probeUnit?: string } {
  const unit = studyProbeUnit(circuit, measure);
  return unit === "V" ? {} : { probeUnit: unit };
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
    ...(s.tolerance.measure === "steady" ? { measure: "steady" } : {}),
    ...probeUnitField(s.circuit, s.tolerance.measure),
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

/**
 * Samples kept from an earlier, interrupted run of the same study (`--resume`). A cut-off last
 * line is named (file:line) and its sample is not kept, so it runs again.
 */
function resumed(s: StudySettings, header: StudyHeader, target: OutputTarget): StoredSample[] {
  if (target.kind !== "file") {
    throw usageError("bad-option", `--resume reads the results file back, but ${target.label} ${target.shown} is not a file`, "give --results the file of the interrupted run");
  }
  if (target.existing === null) {
    s.note(`no results file ${target.shown} yet: starting the study`);
    return [];
  }
  const content = readResults(target.path, target.shown);
  const differences = headerDifferences(content.header, header);
  if (differences.length > 0) {
    throw usageError(
      "results-mismatch",
      `cannot resume from ${target.shown}: it holds a different study (${differences.join(", ")} differ)`,
      "run without --resume to start afresh, or give the same file, --set values and --shard as before",
    );
  }
  const cut = content.truncated;
  if (cut) s.warn(`${target.shown}:${cut.line}`, `the last line was cut off (an interrupted run): ${cutSample(cut)} is not counted as done and runs again`);
  const seen = new Set<string>();
  return content.samples.filter((sample) => {
    const key = sampleKey(sample);
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

/**
 * The study's builder as worker threads make it for themselves (the language package's
 * `programBuilder` on the program and the `--set` values); none where that package cannot be
 * located, and the circuits are then built here and posted.
 */
function portableBuilder(s: StudySettings): PortableBuilder | undefined {
  try {
    return { module: import.meta.resolve("@onset/netlist-parser"), name: "programBuilder", data: { program: s.source.program, overrides: s.overrides } };
  } catch {
    return undefined;
  }
}

/**
 * Runs the Monte Carlo samples of the study (every sweep setting of a design window in turn),
 * appending each finished sample to the results file, and reports on all of them.
 */
export async function runStudy(s: StudySettings): Promise<StudyReport> {
  const header = studyHeader(s);
  if (s.resume && !s.results) throw usageError("no-results-file", "--resume needs a results file", "give --results FILE (standard input has no default results file)");
  const kept = s.results && s.resume ? resumed(s, header, s.results) : [];
  const writer = s.results ? new ResultsWriter(s.results, s.stdout) : null;
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
  const budget = new RunBudget(s.limits);
  const pool = workerPool(s.jobs);
  const portable = portableBuilder(s);
  try {
    for (let k = 0; k < settings.length; k++) {
      const value = settings[k];
      const point = value === null ? {} : { point: k };
      const already = new Set(kept.filter((x) => (x.point ?? 0) === k).map((x) => x.index));
      await runToleranceStudy(build, tolerances, s.tolerance, criteria, {
        pool,
        budget,
        ...(portable ? { portable } : {}),
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

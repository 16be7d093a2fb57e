import { resolve } from "node:path";
import { checkTopology, drawSample, isSimulating, runCircuitInParallel, runSweep, sweepValues, type Circuit, type SweepAnalysis, type ToleranceAnalysis } from "@onset/core";
import { valueOf, type ParsedArgs } from "../args.js";
import { CliError, usageError } from "../cli-error.js";
import { elaborateSource, loadSource, type LoadedSource } from "../input/source.js";
import type { Outcome, ReportSubject } from "../output/outcome.js";
import { specChecks } from "../report/spec.js";
import { defaultResultsPath, drawnTolerances, runStudy } from "../study/run-study.js";
import { sweepReport } from "../study/sweep-report.js";
import { targetInfo } from "../study/target.js";
import type { CommandContext } from "./context.js";
import { emitOutcome } from "./emit.js";
import { renderWarnings } from "./problems.js";
import { jobsOf, overridesOf, sampleOf, shardOf } from "./run-options.js";

/** The file's plain analyses; the further seeds of `startup seeds=N` run on `jobs` workers. */
async function plainOutcome(ctx: CommandContext, circuit: Circuit, jobs: number, sample?: { index: number; drawn: Record<string, number> }): Promise<Outcome> {
  const run = await runCircuitInParallel(circuit, { onProgress: ctx.progress.simulation("simulating"), jobs });
  ctx.progress.stop();
  const analyses = circuit.analyses.filter(isSimulating);
  return {
    kind: "plain",
    runs: run.results.map((result, k) => ({ analysis: analyses[k]!, result })),
    spec: run.spec ? specChecks(run.spec, "the first start-up") : null,
    ...(sample ? { sample } : {}),
  };
}

function sweepOutcome(ctx: CommandContext, source: LoadedSource, sets: Record<string, string>, circuit: Circuit, sweep: SweepAnalysis): Outcome {
  const info = targetInfo(circuit, source.program, sweep.target, sets);
  const tick = ctx.progress.counter("settings", sweepValues(sweep).length);
  const build = (values: Readonly<Record<string, number>>) => elaborateSource(source, { ...sets, ...values }).circuit;
  const result = runSweep(build, sweep, {
    ...(info.nominal === null ? {} : { nominal: info.nominal }),
    onPoint: (_point, done) => tick(done),
  });
  ctx.progress.stop();
  const hasSpec = circuit.analyses.some((a) => a.kind === "spec");
  return { kind: "sweep", report: sweepReport(result, info.unit, hasSpec), analyses: circuit.analyses.filter(isSimulating) };
}

function sampleRerun(ctx: CommandContext, source: LoadedSource, sets: Record<string, string>, circuit: Circuit, index: number, jobs: number): Promise<Outcome> {
  const tolerance = circuit.analyses.find((a): a is ToleranceAnalysis => a.kind === "tolerance");
  if (!tolerance) throw usageError("no-tolerance", "--sample needs a file with a tolerance analysis", "add a line such as: tolerance runs=200");
  if (index >= tolerance.runs) throw usageError("bad-option", `--sample ${index} is past the study's ${tolerance.runs} runs`, `give an index from 0 to ${tolerance.runs - 1}`);
  const sweep = circuit.analyses.find((a): a is SweepAnalysis => a.kind === "sweep");
  const drawn = drawSample(drawnTolerances(circuit, sweep), tolerance.seed, index, tolerance.dist);
  const sampled = elaborateSource(source, { ...sets, ...drawn }).circuit;
  return plainOutcome(ctx, sampled, jobs, { index, drawn });
}

/** --shard and --resume need a tolerance study to act on; --results without one is only noted. */
function refuseStudyOptions(ctx: CommandContext, given: readonly string[], hasTolerance: boolean): void {
  if (hasTolerance) return;
  const refused = given.filter((o) => o !== "results");
  if (refused.length > 0) throw usageError("no-tolerance", `--${refused[0]} needs a file with a tolerance analysis`, "add a line such as: tolerance runs=200");
  if (given.includes("results")) ctx.note("--results: this file has no tolerance study, so no results file is written");
}

/**
 * `onset run FILE`: every analysis of the file and its spec. A `tolerance` analysis makes it a
 * Monte Carlo study, a `sweep` a sweep, both a design window; `--nominal` runs the file's
 * plain analyses once instead, `--sample I` reruns one sample of the study.
 */
export async function runCommand(ctx: CommandContext, args: ParsedArgs): Promise<number> {
  const path = args.positionals[0]!;
  const sets = overridesOf(args);
  const jobs = jobsOf(args);
  const shard = shardOf(args, ctx.io.env);
  const sample = sampleOf(args);
  const source = loadSource(path, ctx.io);
  ctx.sources = source.sources;
  renderWarnings(ctx, source.warnings);
  const { circuit, warnings } = elaborateSource(source, sets);
  // Wiring faults (a floating node, a loop of sources) are the file's fault: exit 2, not 3.
  const wiring = checkTopology(circuit);
  renderWarnings(ctx, [...warnings, ...wiring.filter((d) => d.severity !== "error")]);
  const faults = wiring.filter((d) => d.severity === "error");
  if (faults.length > 0) throw new CliError(faults, source.sources);
  const subject: ReportSubject = { file: source.file, title: circuit.title ?? null, overrides: sets };
  const tolerance = circuit.analyses.find((a): a is ToleranceAnalysis => a.kind === "tolerance");
  const sweeps = circuit.analyses.filter((a): a is SweepAnalysis => a.kind === "sweep");
  const studyOnly = ["shard", "resume", "results"].filter((o) => args.values.has(o) || args.flags.has(o));
  let outcome: Outcome;
  if (sample !== undefined) outcome = await sampleRerun(ctx, source, sets, circuit, sample, jobs);
  else if (args.flags.has("nominal") || (!tolerance && sweeps.length === 0)) {
    refuseStudyOptions(ctx, studyOnly, tolerance !== undefined);
    outcome = await plainOutcome(ctx, circuit, jobs);
  } else {
    if (sweeps.length > 1) ctx.note(`only the first sweep (of ${sweeps[0]!.target}) runs; the file has ${sweeps.length}`);
    if (tolerance) {
      const given = valueOf(args, "results");
      const resultsPath = given ?? defaultResultsPath(source.file, shard);
      const report = await runStudy({
        source,
        overrides: sets,
        circuit,
        tolerance,
        ...(sweeps[0] ? { sweep: sweeps[0] } : {}),
        jobs,
        shard,
        resume: args.flags.has("resume"),
        resultsPath: resultsPath === null ? null : resolve(ctx.io.cwd, resultsPath),
        ...(resultsPath === null ? {} : { resultsName: resultsPath }),
        progress: ctx.progress,
        note: ctx.note,
      });
      outcome = { kind: "study", report };
      if (resultsPath !== null) ctx.note(`samples in ${resultsPath}`);
    } else {
      refuseStudyOptions(ctx, studyOnly, false);
      outcome = sweepOutcome(ctx, source, sets, circuit, sweeps[0]!);
    }
  }
  return emitOutcome(ctx, args, subject, outcome);
}

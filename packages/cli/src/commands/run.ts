import { checkTopology, drawSample, refuseStudy, isRunLimitError, isSimulating, runCircuitInParallel, runSweepInParallel, steadyAnalysisOf, sweepValues, type Circuit, type RunLimits, type SweepAnalysis, type ToleranceAnalysis } from "@onset/core";
import { workerPool } from "@onset/core/node";
import type { ParsedArgs } from "../args.js";
import { CliError, usageError } from "../cli-error.js";
import { includeRootsOf, limitsOf } from "../input/limits.js";
import { elaborateSource, loadSource, STDIN_NAME, type LoadedSource } from "../input/source.js";
import { documentCounts } from "../output/files.js";
import { checkOutputs, documentTargets, refuseInputs } from "../output/plan.js";
import { outputTarget } from "../output/target.js";
import type { Outcome, ReportSubject, SampleRerun } from "../output/outcome.js";
import { judgedProbeUnit, specChecks } from "../report/spec.js";
import { defaultResultsPath, drawnTolerances, runStudy } from "../study/run-study.js";
import { studySample } from "../study/study-sample.js";
import { sweepReport } from "../study/sweep-report.js";
import { targetInfo } from "../study/target.js";
import type { CommandContext } from "./context.js";
import { emitOutcome } from "./emit.js";
import { optionTarget } from "./output-options.js";
import { renderWarnings } from "./problems.js";
import { jobsOf, overridesOf, sampleOf, shardOf } from "./run-options.js";
import { watchCommand } from "./watch.js";

/** The file's plain analyses; the further seeds of `startup seeds=N` run on `jobs` workers. */
async function plainOutcome(ctx: CommandContext, circuit: Circuit, limits: RunLimits, jobs: number, sample?: SampleRerun): Promise<Outcome> {
  const run = await runCircuitInParallel(circuit, { onProgress: ctx.progress.simulation("simulating"), limits, pool: workerPool(jobs) });
  ctx.progress.stop();
  const analyses = circuit.analyses.filter(isSimulating);
  return {
    kind: "plain",
    runs: run.results.map((result, k) => ({ analysis: analyses[k]!, result })),
    spec: run.spec ? specChecks(run.spec, run.results.some((r) => r.analysis === "startup") ? "the first start-up" : "the steady state", judgedProbeUnit(run.results)) : null,
    ...(sample ? { sample } : {}),
  };
}

/** A sweep without tolerances; under measure=steady its settings run on `jobs` workers and each holds its steady state only. */
async function sweepOutcome(ctx: CommandContext, source: LoadedSource, sets: Record<string, string>, circuit: Circuit, sweep: SweepAnalysis, limits: RunLimits, jobs: number): Promise<Outcome> {
  const info = targetInfo(circuit, source.program, sweep.target, sets);
  const tick = ctx.progress.counter("settings", sweepValues(sweep).length);
  const build = (values: Readonly<Record<string, number>>) => elaborateSource(source, { ...sets, ...values }).circuit;
  const result = await runSweepInParallel(build, sweep, {
    ...(info.nominal === null ? {} : { nominal: info.nominal }),
    onPoint: (_point, done) => tick(done),
    limits,
    pool: workerPool(jobs),
  });
  ctx.progress.stop();
  const hasSpec = circuit.analyses.some((a) => a.kind === "spec");
  const steady = sweep.measure === "steady" ? steadyAnalysisOf(circuit) : undefined;
  return { kind: "sweep", report: sweepReport(result, info.unit, hasSpec), analyses: steady ? [steady] : circuit.analyses.filter(isSimulating) };
}

/**
 * `--sample I`: the file's analyses with sample I's drawn values; under measure=steady also the
 * sample as the study ran it (see `studySample`), whose figures are the study's own.
 */
async function sampleRerun(ctx: CommandContext, source: LoadedSource, sets: Record<string, string>, circuit: Circuit, index: number, limits: RunLimits, jobs: number): Promise<Outcome> {
  const tolerance = circuit.analyses.find((a): a is ToleranceAnalysis => a.kind === "tolerance");
  if (!tolerance) throw usageError("no-tolerance", "--sample needs a file with a tolerance analysis", "add a line such as: tolerance runs=200");
  if (index >= tolerance.runs) throw usageError("bad-option", `--sample ${index} is past the study's ${tolerance.runs} runs`, `give an index from 0 to ${tolerance.runs - 1}`);
  const sweep = circuit.analyses.find((a): a is SweepAnalysis => a.kind === "sweep");
  const drawn = drawSample(drawnTolerances(circuit, sweep), tolerance.seed, index, tolerance.dist);
  const study = tolerance.measure === "steady" ? await studySample(source, sets, circuit, tolerance, sweep, index, limits) : undefined;
  const sampled = elaborateSource(source, { ...sets, ...drawn }).circuit;
  return plainOutcome(ctx, sampled, limits, jobs, { index, drawn, ...(study ? { study } : {}) });
}

/** --shard and --resume need a tolerance study to act on; --results without one is only noted. */
function refuseStudyOptions(ctx: CommandContext, given: readonly string[], hasTolerance: boolean): void {
  if (hasTolerance) return;
  const refused = given.filter((o) => o !== "results");
  if (refused.length > 0) throw usageError("no-tolerance", `--${refused[0]} needs a file with a tolerance analysis`, "add a line such as: tolerance runs=200");
  if (given.includes("results")) ctx.note("--results: this file has no tolerance study, so no results file is written");
}

/** The files a run reads (the circuit and its includes), which no output may overwrite. */
function inputFiles(source: LoadedSource): string[] {
  return [...source.sources.keys()].filter((f) => f !== STDIN_NAME);
}

/**
 * `onset run FILE`: every analysis of the file and its spec. A `tolerance` analysis makes it a
 * Monte Carlo study, a `sweep` a sweep, both a design window; `--nominal` runs the file's
 * plain analyses once instead, `--sample I` reruns one sample of the study. Every output is
 * checked before the simulation starts (see `outputTarget`), so a bad path costs no time.
 */
export function runCommand(ctx: CommandContext, args: ParsedArgs): Promise<number> {
  return args.flags.has("watch") ? watchCommand(ctx, args, runOnce) : runOnce(ctx, args);
}

/** One run of `onset run FILE`; `signal` stops a study (`--watch` aborts one when a file changes). */
async function runOnce(ctx: CommandContext, args: ParsedArgs, signal?: AbortSignal): Promise<number> {
  const path = args.positionals[0]!;
  const sets = overridesOf(args);
  const given = limitsOf(args);
  const limits: RunLimits = signal ? { ...given.run, signal } : given.run;
  const jobs = jobsOf(args);
  const shard = shardOf(args, ctx.io.env);
  const sample = sampleOf(args);
  const outputs = { csv: optionTarget(ctx, args, "csv"), svg: optionTarget(ctx, args, "svg"), html: optionTarget(ctx, args, "html") };
  const givenResults = optionTarget(ctx, args, "results");
  checkOutputs([outputs.csv, outputs.svg, outputs.html, givenResults], ctx.json);
  const source = loadSource(path, ctx.io, { limits: given.source, roots: includeRootsOf(args) });
  ctx.sources = source.sources;
  renderWarnings(ctx, source.warnings);
  const { circuit, warnings } = elaborateSource(source, sets);
  // Wiring faults (a floating node, a loop of sources) are the file's fault: exit 2, not 3.
  const wiring = checkTopology(circuit);
  renderWarnings(ctx, [...warnings, ...wiring.filter((d) => d.severity !== "error")]);
  const faults = wiring.filter((d) => d.severity === "error");
  if (faults.length > 0) throw new CliError(faults, source.sources);
  if (!args.flags.has("nominal") && sample === undefined) refuseStudy(circuit, { limits });
  const subject: ReportSubject = { file: source.file, title: circuit.title ?? null, overrides: sets };
  const tolerance = circuit.analyses.find((a): a is ToleranceAnalysis => a.kind === "tolerance");
  const sweeps = circuit.analyses.filter((a): a is SweepAnalysis => a.kind === "sweep");
  const studyOnly = ["shard", "resume", "results"].filter((o) => args.values.has(o) || args.flags.has(o));
  const plain = sample !== undefined || args.flags.has("nominal") || (!tolerance && sweeps.length === 0);
  if (plain && sample === undefined) refuseStudyOptions(ctx, studyOnly, tolerance !== undefined);
  const study = !plain && tolerance !== undefined;
  const defaultResults = defaultResultsPath(source.file, shard);
  const results = !study ? null : (givenResults ?? (defaultResults === null ? null : outputTarget(defaultResults, ctx.io.cwd, "the results file")));
  // The checks that need the file: how many documents each output gets, and no input overwritten.
  const counts = documentCounts(plain ? circuit.analyses.filter(isSimulating).map((a) => a.kind) : null);
  if (outputs.csv) documentTargets(outputs.csv, counts.csv, ctx.io.cwd, "CSV tables");
  if (outputs.svg) documentTargets(outputs.svg, counts.svg, ctx.io.cwd, "plots");
  checkOutputs([outputs.csv, outputs.svg, outputs.html, results], ctx.json);
  refuseInputs([outputs.csv, outputs.svg, outputs.html, results], inputFiles(source), ctx.io.cwd);
  let outcome: Outcome;
  if (sample !== undefined) outcome = await sampleRerun(ctx, source, sets, circuit, sample, limits, jobs);
  else if (plain) outcome = await plainOutcome(ctx, circuit, limits, jobs);
  else {
    if (sweeps.length > 1) ctx.note(`only the first sweep (of ${sweeps[0]!.target}) runs; the file has ${sweeps.length}`);
    if (tolerance) {
      if (sweeps[0]?.measure === "steady" && tolerance.measure !== "steady") {
        ctx.note("the sweep's measure=steady does not apply to a design window: each sample is measured by its start-up run (write tolerance … measure=steady to measure the samples by their steady state)");
      }
      const report = await runStudy({
        source,
        overrides: sets,
        circuit,
        tolerance,
        ...(sweeps[0] ? { sweep: sweeps[0] } : {}),
        jobs,
        limits,
        shard,
        resume: args.flags.has("resume"),
        results,
        stdout: ctx.io.stdout,
        progress: ctx.progress,
        note: ctx.note,
        warn: ctx.warn,
      }).catch((error: unknown) => {
        // What finished is kept: say how to go on from it.
        if (isRunLimitError(error) && results?.kind === "file") ctx.note(`the samples finished so far are in ${results.shown}: --resume continues the study`);
        throw error;
      });
      outcome = { kind: "study", report };
      if (results !== null && results.kind !== "stdout") ctx.note(`samples in ${results.shown}`);
    } else {
      refuseStudyOptions(ctx, studyOnly, false);
      outcome = await sweepOutcome(ctx, source, sets, circuit, sweeps[0]!, limits, jobs);
    }
  }
  return emitOutcome(ctx, { ...outputs, results }, subject, outcome);
}

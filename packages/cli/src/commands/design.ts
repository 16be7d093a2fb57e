import { AMPLITUDE_LIMITS, designOscillator, didYouMean, isSeriesName, runStartup, startupAnalysisOf, type AmplitudeLimit, type DesignedFile, type DesignRequest, type DesignResult, type Topology } from "@onset/core";
import { elaborate, parseQuantity, parseText, printDesignedFile } from "@onset/netlist-parser";
import { valueOf, type ParsedArgs } from "../args.js";
import { CliError, usageError } from "../cli-error.js";
import { EXIT } from "../exit.js";
import { checkOutputs } from "../output/plan.js";
import { writeOutput } from "../output/write.js";
import type { CommandContext } from "./context.js";
import { optionTarget } from "./output-options.js";

/** The topologies `onset design` knows. */
export const DESIGN_TOPOLOGIES: readonly Topology[] = ["wien", "twin-t", "phase-shift"];

function quantity(text: string, unit: "Hz" | "F" | "s", option: string): number {
  const value = parseQuantity(text, unit, option);
  if (typeof value !== "number") throw new CliError([value]);
  if (!(value > 0)) throw usageError("out-of-range", `${option} must be above zero, got ${text}`);
  return value;
}

/** Runs the start-up analysis of a designed file, printed and read back exactly as `onset run` would (nominal values). */
function simulateDesign(file: DesignedFile) {
  const parsed = parseText(printDesignedFile(file), "design.onset");
  const { circuit, diagnostics } = elaborate(parsed.program);
  const analysis = circuit && startupAnalysisOf(circuit);
  if (!analysis) throw new CliError([...parsed.diagnostics, ...diagnostics]);
  return runStartup(circuit, analysis);
}

/** One line for standard error: what the designed file settles at, and what the poles predicted. */
function designSummary(r: DesignResult): string {
  const pct = (x: number) => `${x >= 0 ? "+" : "−"}${Math.abs(x * 100).toFixed(2)} %`;
  const poles = `small-signal poles ${r.predicted.frequency.toFixed(2)} Hz (${pct(r.error)})`;
  const sim = r.simulated;
  if (!sim || sim.frequency === null || sim.error === null) return `design: simulated start-up ${sim?.verdict ?? "not run"}; ${poles}`;
  return `design: simulated start-up settles at ${sim.frequency.toFixed(2)} Hz (${pct(sim.error)} from the target); ${poles}`;
}

/**
 * `onset design TOPOLOGY --freq F [--cap C] [--series E24] [--preset NAME] [--startup T] [--limit KIND]`:
 * a ready-to-run circuit file from the engine's design API, on stdout or in `--output FILE`
 * (checked before the design work; `-` is stdout).
 */
export function designCommand(ctx: CommandContext, args: ParsedArgs): number {
  const topology = args.positionals[0]!;
  const output = optionTarget(ctx, args, "output");
  checkOutputs([output], ctx.json);
  if (!(DESIGN_TOPOLOGIES as readonly string[]).includes(topology)) {
    throw usageError("bad-topology", `design: unknown topology '${topology}'${didYouMean(topology, DESIGN_TOPOLOGIES)}`, `choose one of: ${DESIGN_TOPOLOGIES.join(", ")}`);
  }
  const freq = valueOf(args, "freq");
  if (freq === undefined) throw usageError("missing-option", "design needs --freq", "write for example: onset design wien --freq 1k");
  const cap = valueOf(args, "cap");
  const series = valueOf(args, "series");
  if (series !== undefined && !isSeriesName(series)) throw usageError("bad-series", `design: unknown series '${series}'${didYouMean(series, ["E12", "E24", "E96"])}`, "choose E12, E24 or E96");
  const preset = valueOf(args, "preset");
  const startup = valueOf(args, "startup");
  const limit = valueOf(args, "limit");
  if (limit !== undefined && !(AMPLITUDE_LIMITS as readonly string[]).includes(limit)) {
    throw usageError("bad-limit", `design: unknown amplitude limit '${limit}'${didYouMean(limit, AMPLITUDE_LIMITS)}`, `choose one of: ${AMPLITUDE_LIMITS.join(", ")}`);
  }
  if (limit !== undefined && limit !== "diodes" && topology !== "wien") {
    throw usageError("bad-limit", `design: --limit ${limit} is for the Wien bridge`, `write onset design wien --limit ${limit}, or leave --limit out for ${topology}`);
  }
  const request: DesignRequest = {
    topology: topology as Topology,
    frequency: quantity(freq, "Hz", "--freq"),
    ...(cap === undefined ? {} : { capacitor: quantity(cap, "F", "--cap") }),
    ...(series === undefined ? {} : { series }),
    ...(preset === undefined ? {} : { preset }),
    ...(startup === undefined ? {} : { startupTime: quantity(startup, "s", "--startup") }),
    ...(limit === undefined ? {} : { limit: limit as AmplitudeLimit }),
  };
  const result = designOscillator(request, { simulate: simulateDesign });
  const text = printDesignedFile(result.file);
  ctx.note(designSummary(result));
  if (output !== null) {
    writeOutput(output, text, ctx.io.stdout);
    if (output.kind !== "stdout") ctx.note(`wrote ${output.shown}`);
  }
  if (ctx.json) ctx.io.stdout(`${JSON.stringify({ ...result, text, exit: EXIT.ok }, null, 2)}\n`);
  else if (output === null) ctx.io.stdout(text);
  return EXIT.ok;
}

import { checkProgram } from "@onset/netlist-parser";
import type { ParsedArgs } from "../args.js";
import { CliError } from "../cli-error.js";
import { EXIT } from "../exit.js";
import { includeRootsOf, limitsOf } from "../input/limits.js";
import { elaborateSource, loadSource } from "../input/source.js";
import type { CommandContext } from "./context.js";
import { renderWarnings } from "./problems.js";
import { overridesOf } from "./run-options.js";

/** `onset check FILE`: parse, elaborate and check the topology; nothing is simulated. */
export function checkCommand(ctx: CommandContext, args: ParsedArgs): number {
  const sets = overridesOf(args);
  const source = loadSource(args.positionals[0]!, ctx.io, { limits: limitsOf(args).source, roots: includeRootsOf(args) });
  ctx.sources = source.sources;
  const diagnostics = [...source.warnings, ...checkProgram(source.program, { overrides: sets })];
  const errors = diagnostics.filter((d) => d.severity === "error");
  const warnings = diagnostics.filter((d) => d.severity !== "error");
  renderWarnings(ctx, warnings);
  if (errors.length > 0) throw new CliError(errors, source.sources);
  const { circuit } = elaborateSource(source, sets);
  const kinds = circuit.analyses.map((a) => a.kind);
  if (ctx.json) {
    const document = {
      file: source.file,
      title: circuit.title ?? null,
      ok: true,
      parts: circuit.parts.length,
      analyses: kinds,
      tolerances: circuit.tolerances.length,
      warnings: warnings.map((w) => ({ code: w.code, message: w.message })),
      exit: EXIT.ok,
    };
    ctx.io.stdout(`${JSON.stringify(document, null, 2)}\n`);
  } else if (!ctx.quiet) {
    const counts = `${circuit.parts.length} parts, ${kinds.length === 0 ? "no analyses" : `analyses: ${kinds.join(", ")}`}`;
    const tail = warnings.length > 0 ? `, ${warnings.length} ${warnings.length === 1 ? "warning" : "warnings"}` : "";
    ctx.io.stdout(`${source.file}: ${ctx.paintOut.green("ok")} (${counts}${tail})\n`);
  }
  return EXIT.ok;
}

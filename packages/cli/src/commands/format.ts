import { resolve } from "node:path";
import { formatText } from "@onset/netlist-parser";
import type { ParsedArgs } from "../args.js";
import { CliError, usageError } from "../cli-error.js";
import { EXIT } from "../exit.js";
import { sourceLimits } from "@onset/netlist-parser";
import { limitsOf } from "../input/limits.js";
import { readSourceText, STDIN_NAME } from "../input/source.js";
import { outputTarget } from "../output/target.js";
import { writeOutput } from "../output/write.js";
import type { CommandContext } from "./context.js";

/**
 * `onset format FILE`: the canonical layout on stdout, or with `--write` the file replaced
 * atomically (through a symlink, the real file; the link stays). Only a file can be rewritten:
 * a pipe or a device is refused before anything is read from it.
 */
export function formatCommand(ctx: CommandContext, args: ParsedArgs): number {
  const path = args.positionals[0]!;
  const write = args.flags.has("write");
  if (write && path === "-") throw usageError("bad-option", "format --write cannot rewrite standard input", "give a file name, or drop --write to print the result");
  const name = path === "-" ? STDIN_NAME : path;
  const absolute = resolve(ctx.io.cwd, path);
  const target = write ? outputTarget(path, ctx.io.cwd, "--write") : null;
  if (target && target.kind !== "file") {
    throw usageError("bad-option", `format --write rewrites a circuit file, and '${path}' is not one (it is a pipe, a device or a descriptor)`, "drop --write to print the canonical layout");
  }
  const text = readSourceText(path, absolute, ctx.io, sourceLimits(limitsOf(args).source).maxSourceBytes);
  ctx.sources = new Map([[name, text]]);
  const result = formatText(text, name);
  const errors = result.diagnostics.filter((d) => d.severity === "error");
  if (result.text === undefined || errors.length > 0) throw new CliError(errors.length > 0 ? errors : result.diagnostics, ctx.sources);
  if (!target) {
    ctx.io.stdout(result.text);
    return EXIT.ok;
  }
  if (result.text === text) ctx.note(`${path}: already in the canonical layout`);
  else {
    writeOutput(target, result.text, ctx.io.stdout);
    ctx.note(`${path}: formatted`);
  }
  return EXIT.ok;
}

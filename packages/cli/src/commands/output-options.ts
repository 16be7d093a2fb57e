import { valueOf, type ParsedArgs } from "../args.js";
import { outputTarget, type OutputTarget } from "../output/target.js";
import type { CommandContext } from "./context.js";

/** The classified target of an output option (`--csv FILE`), or null when it was not given. */
export function optionTarget(ctx: CommandContext, args: ParsedArgs, name: string): OutputTarget | null {
  const given = valueOf(args, name);
  return given === undefined ? null : outputTarget(given, ctx.io.cwd, `--${name}`);
}

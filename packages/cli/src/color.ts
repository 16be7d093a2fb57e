import pc from "picocolors";
import type { CliIo } from "./io.js";

/** The colour functions the reports use; identity functions when colour is off. */
export type Paint = ReturnType<typeof pc.createColors>;

/**
 * Colour goes only to a terminal, and never when `--no-color` is given or `NO_COLOR` is set to
 * anything non-empty (the convention at no-color.org). Reports on stdout stay plain when
 * stdout is redirected, since the decision is made per stream.
 */
export function colorWanted(io: CliIo, noColor: boolean, isTerminal: boolean): boolean {
  if (noColor) return false;
  const flag = io.env.NO_COLOR;
  if (flag !== undefined && flag !== "") return false;
  return isTerminal;
}

export function paint(enabled: boolean): Paint {
  return pc.createColors(enabled);
}

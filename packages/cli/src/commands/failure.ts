import { isOnsetError } from "@onset/core";
import { CliError, usageError } from "../cli-error.js";
import { EXIT } from "../exit.js";
import { errnoReason, isSystemError } from "../output/write-error.js";
import type { CommandContext } from "./context.js";
import { errorDocument, exitOf, renderError } from "./problems.js";

/** Reports a failure on stderr (and as JSON on stdout under --json); returns its exit status. */
export function reportFailure(error: unknown, ctx: CommandContext, debug: boolean): number {
  let problem: CliError;
  let exit: number;
  if (error instanceof CliError) {
    problem = error;
    exit = exitOf(error);
  } else if (isOnsetError(error)) {
    problem = new CliError([error.diagnostic]);
    exit = exitOf(problem);
  } else if (isSystemError(error)) {
    // The machine refused something (a file vanished, the disk filled up): not a bug in onset.
    problem = usageError("system-error", `${error.syscall ?? "a system call"}${error.path ? ` '${error.path}'` : ""} failed: ${errnoReason(error)}`);
    exit = EXIT.badInput;
  } else {
    const message = error instanceof Error ? error.message : String(error);
    problem = new CliError([
      {
        severity: "error",
        stage: "simulation",
        code: "internal",
        message: `internal error: ${message}`,
        hint: debug ? "this is a bug in onset; please report it with the file that caused it" : "run again with --debug to see where it happened",
      },
    ]);
    exit = EXIT.simulationFailed;
  }
  ctx.progress.stop();
  ctx.io.stderr(renderError(problem, ctx));
  if (debug && error instanceof Error && error.stack) ctx.io.stderr(`${error.stack}\n`);
  if (ctx.json) ctx.io.stdout(`${JSON.stringify(errorDocument(problem, ctx, exit), null, 2)}\n`);
  return exit;
}


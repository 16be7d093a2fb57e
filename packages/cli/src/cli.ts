import { didYouMean, isOnsetError } from "@onset/core";
import { parseArgs, type ParsedArgs } from "./args.js";
import { CliError, usageError } from "./cli-error.js";
import { colorWanted, paint } from "./color.js";
import type { CommandContext } from "./commands/context.js";
import { commandHelp, generalHelp } from "./commands/help.js";
import { errorDocument, exitOf, renderError } from "./commands/problems.js";
import { COMMANDS, commandNamed, type CommandSpec } from "./commands/table.js";
import { EXIT } from "./exit.js";
import { processIo, type CliIo } from "./io.js";
import { errnoReason, isSystemError } from "./output/write-error.js";
import { Progress } from "./progress.js";
import { cliVersion } from "./version.js";

function contextFor(io: CliIo, args: ParsedArgs | undefined): CommandContext {
  const noColor = args?.flags.has("no-color") ?? false;
  const quiet = args?.flags.has("quiet") ?? false;
  const paintErr = paint(colorWanted(io, noColor, io.stderrIsTerminal));
  return {
    io,
    json: args?.flags.has("json") ?? false,
    quiet,
    paintOut: paint(colorWanted(io, noColor, io.stdoutIsTerminal)),
    paintErr,
    progress: new Progress(quiet ? undefined : io.progressStream),
    note: (text) => {
      if (!quiet) io.stderr(`${paintErr.dim(text)}\n`);
    },
    warn: (place, message) => {
      if (!quiet) io.stderr(`${paintErr.bold(place)}: ${paintErr.yellow("warning")}: ${message}\n`);
    },
    sources: new Map(),
  };
}

/** Reports a failure on stderr (and as JSON on stdout under --json); returns its exit status. */
function fail(error: unknown, ctx: CommandContext, debug: boolean): number {
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

function checkPositionals(command: CommandSpec, args: ParsedArgs): void {
  const n = args.positionals.length;
  const { min, max, name } = command.positionals;
  if (n < min) throw usageError("missing-argument", `${command.name} needs ${name}`, `usage: ${command.usage}`);
  if (n > max) throw usageError("extra-argument", `${command.name} takes one ${name}, got ${n}: ${args.positionals.join(" ")}`, `usage: ${command.usage}`);
}

/**
 * Runs the `onset` command line on `argv` (without the node and script words) and returns the
 * exit status; nothing here calls `process.exit`, so it can run inside tests.
 */
export async function runCli(argv: readonly string[], io: CliIo = processIo()): Promise<number> {
  const [first, ...rest] = argv;
  const bare = contextFor(io, undefined);
  if (first === undefined) {
    io.stderr(generalHelp(cliVersion()));
    return EXIT.badInput;
  }
  if (first === "--help" || first === "-h") {
    io.stdout(generalHelp(cliVersion()));
    return EXIT.ok;
  }
  if (first === "--version" || first === "-V") {
    io.stdout(`onset ${cliVersion()}\n`);
    return EXIT.ok;
  }
  if (first === "help") {
    const topic = rest[0];
    if (topic === undefined) {
      io.stdout(generalHelp(cliVersion()));
      return EXIT.ok;
    }
    const command = commandNamed(topic);
    if (!command) return fail(unknownCommand(topic), bare, false);
    io.stdout(commandHelp(command));
    return EXIT.ok;
  }
  const command = commandNamed(first);
  if (!command) return fail(unknownCommand(first), bare, false);
  let args: ParsedArgs;
  try {
    args = parseArgs(rest, command.options, command.name);
  } catch (error) {
    // The flags are not known yet; still honour --json so scripts get a document.
    return fail(error, { ...bare, json: rest.includes("--json") }, rest.includes("--debug"));
  }
  const ctx = contextFor(io, args);
  if (args.flags.has("help")) {
    io.stdout(commandHelp(command));
    return EXIT.ok;
  }
  try {
    checkPositionals(command, args);
    return await command.action(ctx, args);
  } catch (error) {
    return fail(error, ctx, args.flags.has("debug"));
  }
}

function unknownCommand(word: string): CliError {
  return usageError(
    "unknown-command",
    `unknown command '${word}'${didYouMean(word, [...COMMANDS.map((c) => c.name), "help"])}`,
    `commands: ${COMMANDS.map((c) => c.name).join(", ")}, help`,
  );
}

import { didYouMean } from "@onset/core";
import { parseArgs, type ParsedArgs } from "./args.js";
import { CliError, usageError } from "./cli-error.js";
import { colorWanted, paint } from "./color.js";
import type { CommandContext } from "./commands/context.js";
import { commandHelp, generalHelp } from "./commands/help.js";
import { reportFailure as fail } from "./commands/failure.js";
import { COMMANDS, commandNamed, type CommandSpec } from "./commands/table.js";
import { EXIT } from "./exit.js";
import { processIo, type CliIo } from "./io.js";
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

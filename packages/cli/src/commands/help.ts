import type { OptionSpec } from "../args.js";
import { COMMANDS, type CommandSpec } from "./table.js";

function optionLines(options: readonly OptionSpec[]): string[] {
  const labels = options.map((o) => `${o.short ? `-${o.short}, ` : "    "}--${o.name}${o.value ? ` ${o.value}` : ""}`);
  const width = Math.max(...labels.map((l) => l.length));
  return options.map((o, i) => `  ${labels[i]!.padEnd(width)}  ${o.summary}`);
}

/** The overview: what onset does and its commands. */
export function generalHelp(version: string): string {
  const width = Math.max(...COMMANDS.map((c) => c.name.length));
  return [
    `onset ${version}: time-domain start-up of RC oscillators`,
    "",
    "usage: onset COMMAND [options]",
    "",
    "commands:",
    ...COMMANDS.map((c) => `  ${c.name.padEnd(width)}  ${c.summary}`),
    `  ${"help".padEnd(width)}  show help on a command: onset help run`,
    "",
    "  -h, --help     show this help",
    "  -V, --version  print the version",
    "",
    "Run `onset help COMMAND` for its options.",
    "",
  ].join("\n");
}

/** Help on one command: usage, what it does, every option. */
export function commandHelp(command: CommandSpec): string {
  return [`usage: ${command.usage}`, "", command.summary, ...(command.details.length > 0 ? ["", ...command.details] : []), "", "options:", ...optionLines(command.options), ""].join("\n");
}

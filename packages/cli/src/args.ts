import { didYouMean } from "@onset/core";
import { usageError } from "./cli-error.js";

/** One option a command accepts. */
export interface OptionSpec {
  /** Long name without dashes: `csv` for `--csv`. */
  readonly name: string;
  /** One-letter alias without the dash. */
  readonly short?: string;
  /** Placeholder of the value (`FILE`, `N`); absent for a flag. */
  readonly value?: string;
  /** The option may be given several times; every value is kept. */
  readonly repeat?: boolean;
  readonly summary: string;
}

/** A parsed command line: positional words, option values (last wins unless repeatable) and flags. */
export interface ParsedArgs {
  readonly positionals: readonly string[];
  readonly values: ReadonlyMap<string, readonly string[]>;
  readonly flags: ReadonlySet<string>;
}

/** The last value of an option, or undefined. */
export function valueOf(args: ParsedArgs, name: string): string | undefined {
  const all = args.values.get(name);
  return all === undefined ? undefined : all[all.length - 1];
}

function optionByName(options: readonly OptionSpec[], name: string, command: string): OptionSpec {
  const found = options.find((o) => o.name === name);
  if (found) return found;
  throw usageError(
    "unknown-option",
    `${command}: unknown option '--${name}'${didYouMean(name, options.map((o) => o.name), (n) => `--${n}`)}`,
    `see: onset help ${command}`,
  );
}

/** For a long name written after one dash (`-json`): the long option meant. Single letters get no guess (each is one edit from every other). */
function longSpelling(word: string, options: readonly OptionSpec[]): string {
  if (word.length < 2) return "";
  const names = options.map((o) => o.name);
  return names.includes(word) ? ` (did you mean '--${word}'?)` : didYouMean(word, names, (n) => `--${n}`);
}

/**
 * Reads `argv` against a command's options: `--name value`, `--name=value`, `-x`, flags, and
 * `--` ending the options. A lone `-` is a positional (standard input).
 */
export function parseArgs(argv: readonly string[], options: readonly OptionSpec[], command: string): ParsedArgs {
  const positionals: string[] = [];
  const values = new Map<string, string[]>();
  const flags = new Set<string>();
  let onlyPositionals = false;
  for (let i = 0; i < argv.length; i++) {
    const word = argv[i]!;
    if (onlyPositionals || word === "-" || !word.startsWith("-")) {
      positionals.push(word);
      continue;
    }
    if (word === "--") {
      onlyPositionals = true;
      continue;
    }
    let spec: OptionSpec;
    let inline: string | undefined;
    if (word.startsWith("--")) {
      const eq = word.indexOf("=");
      const name = eq < 0 ? word.slice(2) : word.slice(2, eq);
      inline = eq < 0 ? undefined : word.slice(eq + 1);
      spec = optionByName(options, name, command);
    } else {
      const letter = word.slice(1);
      const found = options.find((o) => o.short === letter);
      if (!found) throw usageError("unknown-option", `${command}: unknown option '${word}'${longSpelling(letter, options)}`, `see: onset help ${command}`);
      spec = found;
    }
    if (spec.value === undefined) {
      if (inline !== undefined) throw usageError("bad-option", `${command}: --${spec.name} takes no value`, `write just --${spec.name}`);
      flags.add(spec.name);
      continue;
    }
    let value = inline;
    if (value === undefined) {
      const next = argv[i + 1];
      if (next === undefined || (next.startsWith("--") && next.length > 2)) {
        throw usageError("missing-value", `${command}: --${spec.name} needs a value`, `write --${spec.name} ${spec.value}`);
      }
      value = next;
      i++;
    }
    const list = values.get(spec.name) ?? [];
    if (spec.repeat) list.push(value);
    else list.splice(0, list.length, value);
    values.set(spec.name, list);
  }
  return { positionals, values, flags };
}

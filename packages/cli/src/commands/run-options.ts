import type { Shard } from "@onset/core";
import { defaultJobs } from "@onset/core/node";
import { valueOf, type ParsedArgs } from "../args.js";
import { usageError } from "../cli-error.js";

/** `--set NAME=VALUE` options as overrides; the last value for a name wins. */
export function overridesOf(args: ParsedArgs): Record<string, string> {
  const out: Record<string, string> = {};
  for (const item of args.values.get("set") ?? []) {
    const eq = item.indexOf("=");
    const name = eq < 0 ? "" : item.slice(0, eq).trim();
    const value = eq < 0 ? "" : item.slice(eq + 1).trim();
    if (name === "" || value === "") throw usageError("bad-set", `--set '${item}' is not NAME=VALUE`, "write for example --set R=10.7k or --set P1.at=0.4");
    out[name] = value;
  }
  return out;
}

function wholeNumber(text: string, option: string, min: number): number {
  const n = /^\d+$/.test(text) ? Number(text) : NaN;
  if (!(Number.isSafeInteger(n) && n >= min)) throw usageError("bad-option", `${option} '${text}' must be a whole number of at least ${min}`);
  return n;
}

/** `--jobs N` (at least 1), by default the machine's cores. */
export function jobsOf(args: ParsedArgs): number {
  const text = valueOf(args, "jobs");
  return text === undefined ? defaultJobs() : wholeNumber(text, "--jobs", 1);
}

/** `--sample I`, a sample index of the tolerance study, or undefined. */
export function sampleOf(args: ParsedArgs): number | undefined {
  const text = valueOf(args, "sample");
  return text === undefined ? undefined : wholeNumber(text, "--sample", 0);
}

/**
 * `--shard k/n` (k from 0) or `--shard env:NAME/n`, where a batch engine puts k in the
 * environment variable NAME.
 */
export function shardOf(args: ParsedArgs, env: Readonly<Record<string, string | undefined>>): Shard | null {
  const text = valueOf(args, "shard");
  if (text === undefined) return null;
  const match = /^(?:env:([A-Za-z_][A-Za-z0-9_]*)|(\d+))\/(\d+)$/.exec(text);
  if (!match) throw usageError("bad-shard", `--shard '${text}' is not k/n or env:NAME/n`, "write --shard 0/4 (the first of four), or --shard env:TASK_INDEX/4");
  const count = wholeNumber(match[3]!, "the shard count", 1);
  let indexText: string | undefined = match[2];
  if (match[1] !== undefined) {
    indexText = env[match[1]];
    if (indexText === undefined || indexText === "") {
      throw usageError("bad-shard", `--shard ${text}: the environment variable ${match[1]} is not set`, "set it to this shard's index, from 0");
    }
  }
  const index = wholeNumber(indexText!, "the shard index", 0);
  if (index >= count) throw usageError("bad-shard", `--shard ${text}: index ${index} is not below the count ${count}`, "shards are numbered from 0 to n − 1");
  return { index, count };
}

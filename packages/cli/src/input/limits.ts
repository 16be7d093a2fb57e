import { didYouMean, RUN_LIMIT_FLAGS, RUN_LIMITS, type RunLimits } from "@onset/core";
import { parseQuantity, SOURCE_LIMIT_FLAGS, SOURCE_LIMITS, type SourceLimits } from "@onset/netlist-parser";
import { valueOf, type ParsedArgs } from "../args.js";
import { usageError } from "../cli-error.js";

/** One limit `--limit NAME=VALUE` can set: where it goes and how its value is read. */
interface LimitFlag {
  readonly name: string;
  readonly key: keyof SourceLimits | keyof typeof RUN_LIMIT_FLAGS;
  readonly read: (text: string, flag: string) => number;
}

/** A count: `250000`, `250k`, `4M` (k, M, G multiply by powers of ten), or `inf`. */
function count(text: string, flag: string): number {
  const match = /^(\d+(?:\.\d+)?)([kMG]?)$/.exec(text);
  const value = text === "inf" ? Infinity : match ? Number(match[1]) * { "": 1, k: 1e3, M: 1e6, G: 1e9 }[match[2] as "" | "k" | "M" | "G"] : NaN;
  if (!(value === Infinity || (Number.isSafeInteger(value) && value > 0))) {
    throw usageError("bad-limit", `${flag}: '${text}' is not a whole number above 0`, "write for example 250000, 250k, 4M or inf");
  }
  return value;
}

/** Seconds in the circuit language's syntax (`10`, `500m`, `2.5s`), above 0. */
function duration(text: string, flag: string): number {
  const value = parseQuantity(text, "s", flag);
  if (typeof value !== "number" || !(value > 0)) throw usageError("bad-limit", `${flag}: '${text}' is not a time above 0`, "write seconds, for example 10, 500m or 2.5s");
  return value;
}

/** Every limit `--limit` sets, in the order help lists them. */
export const LIMIT_FLAGS: readonly LimitFlag[] = [
  ...(Object.keys(SOURCE_LIMIT_FLAGS) as Array<keyof SourceLimits>).map((key) => ({ name: SOURCE_LIMIT_FLAGS[key], key, read: count })),
  ...(Object.keys(RUN_LIMIT_FLAGS) as Array<keyof typeof RUN_LIMIT_FLAGS>).map((key) => ({
    name: RUN_LIMIT_FLAGS[key],
    key,
    read: key === "maxSimulatedTime" ? duration : count,
  })),
];

function defaultOf(key: LimitFlag["key"]): string {
  if (key in SOURCE_LIMITS) return String(SOURCE_LIMITS[key as keyof SourceLimits]);
  return key in RUN_LIMITS ? String(RUN_LIMITS[key as keyof typeof RUN_LIMITS]) : "none";
}

/** The help line listing the limits with their defaults. */
export const LIMIT_HELP = `raise or set a limit (repeatable): ${LIMIT_FLAGS.map((l) => `${l.name}=${defaultOf(l.key)}`).join(", ")}`;

/** The limits the command line sets. */
export interface CommandLimits {
  readonly source: SourceLimits;
  readonly run: RunLimits;
}

/** Reads `--limit NAME=VALUE` (repeatable; the last value for a name wins) and `--time-limit SECONDS`. */
export function limitsOf(args: ParsedArgs): CommandLimits {
  const source: Record<string, number> = {};
  const run: Record<string, number> = {};
  for (const item of args.values.get("limit") ?? []) {
    const eq = item.indexOf("=");
    const name = eq < 0 ? item : item.slice(0, eq);
    const flag = LIMIT_FLAGS.find((l) => l.name === name);
    if (!flag) {
      const names = LIMIT_FLAGS.map((l) => l.name);
      throw usageError("bad-limit", `--limit: unknown limit '${name}'${didYouMean(name, names)}`, `limits: ${names.join(", ")}`);
    }
    if (eq < 0) throw usageError("bad-limit", `--limit '${item}' is not NAME=VALUE`, `write for example --limit ${flag.name}=${flag.key === "maxSimulatedTime" ? "10" : "250k"}`);
    const value = flag.read(item.slice(eq + 1), `--limit ${name}`);
    (flag.key in SOURCE_LIMITS ? source : run)[flag.key] = value;
  }
  const time = valueOf(args, "time-limit");
  if (time !== undefined) run.maxWallTime = duration(time, "--time-limit");
  return { source, run };
}

/** `--include-root DIR` values: folders includes may read besides the file's own. */
export function includeRootsOf(args: ParsedArgs): string[] {
  return [...(args.values.get("include-root") ?? [])];
}

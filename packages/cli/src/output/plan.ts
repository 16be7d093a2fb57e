import { statSync } from "node:fs";
import { resolve } from "node:path";
import { usageError } from "../cli-error.js";
import { numberedPath } from "../output-files.js";
import { isStream, outputTarget, type OutputTarget } from "./target.js";

const STREAM_NAMES: Readonly<Record<Exclude<OutputTarget["kind"], "file">, string>> = {
  stdout: "standard output",
  descriptor: "an open descriptor",
  device: "a device",
};

function streamName(target: OutputTarget): string {
  if (target.kind === "device") return `a ${target.what}`;
  return target.kind === "file" ? "a file" : STREAM_NAMES[target.kind];
}

/**
 * The checks a command's outputs pass together, before any work: at most one document on
 * standard output (`--json` counts as one), and no two outputs naming the same file.
 */
export function checkOutputs(targets: readonly (OutputTarget | null)[], json: boolean): void {
  const given = targets.filter((t): t is OutputTarget => t !== null);
  const onStdout = given.filter((t) => t.kind === "stdout");
  if (json && onStdout.length > 0) {
    const t = onStdout[0]!;
    throw usageError("stdout-taken", `--json prints its document on standard output, and so would ${t.label} ${t.shown}`, `give ${t.label} a file name, or drop --json`);
  }
  if (onStdout.length > 1) {
    throw usageError("stdout-taken", `${onStdout[0]!.label} and ${onStdout[1]!.label} both write to standard output`, "standard output takes one document: give one of them a file name");
  }
  const seen = new Map<string, OutputTarget>();
  for (const t of given) {
    const key = t.kind === "file" || t.kind === "device" ? t.path : t.kind === "descriptor" ? `fd:${t.fd}` : null;
    if (key === null) continue;
    const before = seen.get(key);
    if (before) throw usageError("same-output", `${before.label} '${before.shown}' and ${t.label} '${t.shown}' are the same output`, "give each output its own file");
    seen.set(key, t);
  }
}

/**
 * Refuses an output that would overwrite one of the command's input files (named as the user
 * named them, relative to `cwd`), compared by identity, so a link or another spelling counts.
 */
export function refuseInputs(targets: readonly (OutputTarget | null)[], inputs: readonly string[], cwd: string): void {
  const byIdentity = new Map<string, string>();
  for (const input of inputs) {
    try {
      const s = statSync(resolve(cwd, input));
      byIdentity.set(`${s.dev}:${s.ino}`, input);
    } catch {
      // An input that cannot be read is reported when it is read.
    }
  }
  for (const t of targets) {
    if (t?.kind !== "file" || t.existing === null) continue;
    const input = byIdentity.get(`${t.existing.dev}:${t.existing.ino}`);
    if (input !== undefined) throw usageError("output-is-input", `${t.label} '${t.shown}' is the input file '${input}'; writing it would destroy the input`, "give the output another name");
  }
}

/**
 * The targets of `count` documents written for one option: a file name numbers them (`FILE`,
 * `FILE-2`, …; each numbered name classified and checked now), while a stream (standard
 * output, a pipe, a device) takes exactly one document — concatenated CSV tables or SVG
 * pictures would not parse — so more than one is a usage error, raised before any work.
 */
export function documentTargets(target: OutputTarget, count: number, cwd: string, what: string): OutputTarget[] {
  if (isStream(target)) {
    if (count > 1) {
      throw usageError(
        "stream-takes-one",
        `${target.label} ${target.shown} is ${streamName(target)}, which takes one document, but this run makes ${count} ${what}`,
        `give ${target.label} a file name: the documents go to FILE, FILE-2, … (one per analysis)`,
      );
    }
    return [target];
  }
  return Array.from({ length: count }, (_, k) => (k === 0 ? target : outputTarget(numberedPath(target.shown, k), cwd, target.label)));
}

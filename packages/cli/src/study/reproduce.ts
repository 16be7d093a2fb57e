import { STDIN_NAME } from "../input/source.js";
import type { StudyHeader } from "./header.js";

/** A word as a POSIX shell reads it back: bare when safe, else in single quotes. */
export function shellWord(word: string): string {
  if (/^[A-Za-z0-9_.,:/=+@%\-]+$/.test(word)) return word;
  return `'${word.replace(/'/g, `'\\''`)}'`;
}

/**
 * The command that reruns one sample with its drawn values: `onset run FILE --sample I` with
 * the study's `--set` overrides, and in a design window the setting too.
 */
export function reproduceCommand(header: StudyHeader, index: number, setting?: number): string {
  const words = ["onset", "run", header.file === STDIN_NAME ? "-" : header.file, "--sample", String(index)];
  const sets: Record<string, string> = { ...header.overrides };
  if (header.sweep && setting !== undefined) sets[header.sweep.target] = String(setting);
  for (const [name, value] of Object.entries(sets)) words.push("--set", `${name}=${value}`);
  return words.map(shellWord).join(" ");
}

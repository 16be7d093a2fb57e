import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { dirname, resolve } from "node:path";
import { inputError, isOnsetError, type Circuit, type Diagnostic } from "@onset/core";
import { elaborate, loadSource as parseSource, SourceError, sourceLimits, type Program, type SourceLimits } from "@onset/netlist-parser";
import { displayName, fileReader, readRegularFile, STDIN_NAME } from "@onset/netlist-parser/node";
import { CliError, usageError } from "../cli-error.js";
import type { CliIo } from "../io.js";

export { STDIN_NAME };

/** A circuit file as read: its program, every source text (includes too) and a content hash. */
export interface LoadedSource {
  /** The file as named in messages and reports (`-` becomes `<stdin>`). */
  readonly file: string;
  readonly program: Program;
  readonly sources: ReadonlyMap<string, string>;
  /** SHA-256 of every source text in load order: the same file content gives the same study. */
  readonly hash: string;
  readonly warnings: readonly Diagnostic[];
}

/** How the command reads circuit files: the limits and the folders includes may read besides the file's own. */
export interface SourceOptions {
  readonly limits?: SourceLimits;
  readonly roots?: readonly string[];
}

/** Reads a text file (a results file: a pipe or /dev/fd/N will do), turning a missing or unreadable file into a usage error. */
export function readTextFile(path: string, what = "file", shown = path): string {
  try {
    return readFileSync(path, "utf8");
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const reason = code === "ENOENT" ? "no such file" : code === "EISDIR" ? "it is a folder" : code === "EACCES" ? "permission denied" : String(error);
    throw usageError("cannot-read", `cannot read ${what} '${shown}': ${reason}`, code === "ENOENT" ? "check the path, or give - to read standard input" : undefined);
  }
}

/**
 * Reads a circuit file of at most `maxBytes` bytes: regular files only (a FIFO or a device is
 * refused by its kind before it is opened), a missing or refused file a usage error.
 */
function readCircuitFile(path: string, shown: string, maxBytes: number): string {
  let text: string | undefined;
  try {
    text = readRegularFile(path, maxBytes, shown);
  } catch (error) {
    if (isOnsetError(error)) throw new CliError([error.diagnostic]);
    throw error;
  }
  if (text === undefined) throw usageError("cannot-read", `cannot read file '${shown}': no such file`, "check the path, or give - to read standard input");
  return text;
}

/** Standard input, read up to the size limit. */
function readStdin(io: CliIo, maxBytes: number): string {
  const text = io.readStdin(maxBytes);
  if (text.length > maxBytes || Buffer.byteLength(text, "utf8") > maxBytes) {
    throw new CliError([
      inputError("source-too-large", `standard input is more than ${maxBytes} bytes, the source-file size limit`, {
        hint: "raise the limit with --limit source-size=10M",
      }).diagnostic,
    ]);
  }
  return text;
}

/** The text of a circuit file (standard input for `-`), at most `maxBytes` bytes. */
export function readSourceText(path: string, absolute: string, io: CliIo, maxBytes: number): string {
  return path === "-" ? readStdin(io, maxBytes) : readCircuitFile(absolute, path, maxBytes);
}

/**
 * Reads and parses a circuit file (or standard input for `-`), following its includes: they
 * may read the file's folder tree (standard input: the working folder) and `roots`.
 */
export function loadSource(path: string, io: CliIo, options: SourceOptions = {}): LoadedSource {
  const limits = sourceLimits(options.limits);
  const absolute = resolve(io.cwd, path);
  const file = path === "-" ? STDIN_NAME : displayName(absolute, io.cwd);
  const text = readSourceText(path, absolute, io, limits.maxSourceBytes);
  const top = path === "-" ? io.cwd : dirname(absolute);
  const reader = fileReader({ cwd: io.cwd, roots: [top, ...(options.roots ?? []).map((r) => resolve(io.cwd, r))] });
  let source;
  try {
    source = parseSource(file, text, { reader, limits });
  } catch (error) {
    if (error instanceof SourceError) throw new CliError(error.diagnostics.filter((d) => d.severity === "error"), error.sources);
    throw error;
  }
  const hash = createHash("sha256");
  for (const content of source.sources.values()) hash.update(content).update("\u0000");
  return { file, program: source.program, sources: source.sources, hash: hash.digest("hex"), warnings: source.warnings };
}

/** The files a source was read from, as absolute paths (standard input has none). */
export function sourcePaths(sources: ReadonlyMap<string, string>, cwd: string): string[] {
  return [...sources.keys()].filter((f) => f !== STDIN_NAME).map((f) => resolve(cwd, f));
}

/** Overrides as the elaborator takes them: values as written, or numbers drawn by a study. */
export type OverrideValues = Readonly<Record<string, string | number>>;

/** Elaborates the program with overrides; every error becomes one CliError carrying them all. */
export function elaborateSource(source: LoadedSource, overrides: OverrideValues): { circuit: Circuit; warnings: Diagnostic[] } {
  const { circuit, diagnostics } = elaborate(source.program, { overrides });
  const errors = diagnostics.filter((d) => d.severity === "error");
  if (!circuit || errors.length > 0) throw new CliError(errors.length > 0 ? errors : diagnostics, source.sources);
  return { circuit, warnings: diagnostics.filter((d) => d.severity !== "error") };
}

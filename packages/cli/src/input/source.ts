import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { dirname, isAbsolute, relative, resolve } from "node:path";
import type { Circuit, Diagnostic } from "@onset/core";
import { elaborate, loadProgram, type IncludeResolver, type Program } from "@onset/netlist-parser";
import { CliError, usageError } from "../cli-error.js";
import type { CliIo } from "../io.js";

/** The name standard input goes by in messages. */
export const STDIN_NAME = "<stdin>";

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

/** Reads a text file, turning a missing or unreadable file into a usage error. */
export function readTextFile(path: string, what = "file", shown = path): string {
  try {
    return readFileSync(path, "utf8");
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const reason = code === "ENOENT" ? "no such file" : code === "EISDIR" ? "it is a folder" : code === "EACCES" ? "permission denied" : String(error);
    throw usageError("cannot-read", `cannot read ${what} '${shown}': ${reason}`, code === "ENOENT" ? "check the path, or give - to read standard input" : undefined);
  }
}

/** File names relative to the working folder when below it, else absolute. */
function displayName(absolute: string, cwd: string): string {
  const rel = relative(cwd, absolute);
  return rel !== "" && !rel.startsWith("..") && !isAbsolute(rel) ? rel : absolute;
}

/** Includes are found relative to the including file's folder (standard input: the working folder). */
function fileResolver(cwd: string): IncludeResolver {
  return {
    resolve(fromFile, path) {
      const base = fromFile === STDIN_NAME ? cwd : dirname(resolve(cwd, fromFile));
      const absolute = resolve(base, path);
      try {
        return { file: displayName(absolute, cwd), text: readFileSync(absolute, "utf8") };
      } catch {
        return undefined;
      }
    },
  };
}

/** Reads and parses a circuit file (or standard input for `-`), following its includes. */
export function loadSource(path: string, io: CliIo): LoadedSource {
  const file = path === "-" ? STDIN_NAME : displayName(resolve(io.cwd, path), io.cwd);
  const text = path === "-" ? io.readStdin() : readTextFile(resolve(io.cwd, path), "file", path);
  const loaded = loadProgram(file, text, fileResolver(io.cwd));
  const errors = loaded.diagnostics.filter((d) => d.severity === "error");
  if (errors.length > 0) throw new CliError(errors, loaded.sources);
  const hash = createHash("sha256");
  for (const source of loaded.sources.values()) hash.update(source).update("\u0000");
  return {
    file,
    program: loaded.program,
    sources: loaded.sources,
    hash: hash.digest("hex"),
    warnings: loaded.diagnostics.filter((d) => d.severity !== "error"),
  };
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

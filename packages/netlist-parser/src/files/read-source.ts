import { dirname, resolve } from "node:path";
import { inputError, isOnsetError } from "@onset/core";
import { loadSource, type CircuitSource } from "../circuit-source.js";
import { SourceError } from "../source-error.js";
import { sourceLimits, type SourceLimits } from "../source-limits.js";
import { displayName, fileReader, type FileReaderOptions } from "./file-reader.js";
import { readRegularFile } from "./regular-file.js";

/** How {@link readSource} reads a file and its includes. */
export interface ReadSourceOptions extends Omit<FileReaderOptions, "roots"> {
  /**
   * Folders includes may read besides the top file's own folder tree.
   * @defaultValue none
   */
  readonly roots?: readonly string[];
  /** Bounds on size, include depth and file count. */
  readonly limits?: SourceLimits;
}

/**
 * Reads a circuit file and its includes from the file system and parses them: includes may
 * read the top file's folder tree (and `roots`), regular files only, within the limits. Throws
 * a {@link SourceError} with every problem (a missing or refused top file too).
 *
 * @example
 * ```ts
 * const source = readSource("bench/osc.onset");
 * const { circuit } = buildCircuit(source, { overrides: { "P1.at": 0.4 } });
 * ```
 */
export function readSource(path: string, options: ReadSourceOptions = {}): CircuitSource {
  const cwd = resolve(options.cwd ?? process.cwd());
  const absolute = resolve(cwd, path);
  const file = displayName(absolute, cwd);
  const limits = sourceLimits(options.limits);
  let text: string | undefined;
  try {
    text = readRegularFile(absolute, limits.maxSourceBytes, file);
    if (text === undefined) throw inputError("cannot-read", `cannot read '${file}': no such file`, { hint: "check the path" });
  } catch (error) {
    if (isOnsetError(error)) throw new SourceError([error.diagnostic], new Map());
    throw error;
  }
  const reader = fileReader({ cwd, roots: [dirname(absolute), ...(options.roots ?? [])], ...(options.anywhere ? { anywhere: true } : {}) });
  return loadSource(file, text, { reader, limits });
}

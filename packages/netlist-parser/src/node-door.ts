import type { CircuitSource } from "./circuit-source.js";
import { checkOptionsObject, checkText } from "./arguments.js";
import { badArgument, describeArgument } from "@onset/core";
import { displayName as displayNameInner, fileReader as fileReaderInner, type FileReaderOptions } from "./files/file-reader.js";
import { readSource as readSourceInner, type ReadSourceOptions } from "./files/read-source.js";
import { readRegularFile as readRegularFileInner } from "./files/regular-file.js";
import type { IncludeResolver } from "./loader.js";

// The Node entry's functions, each checking its arguments first (docs/language.md §6).

function checkReaderOptions(api: string, options: unknown): void {
  checkOptionsObject(api, "options", options);
  if (options === undefined) return;
  if (options.cwd !== undefined) checkText(api, "options.cwd", options.cwd);
  const roots = options.roots;
  if (roots !== undefined && !(Array.isArray(roots) && roots.every((r) => typeof r === "string"))) throw badArgument(`${api}: options.roots must be an array of folder names, got ${describeArgument(roots)}`);
  if (options.anywhere !== undefined && typeof options.anywhere !== "boolean") throw badArgument(`${api}: options.anywhere must be true or false, got ${describeArgument(options.anywhere)}`);
}

/**
 * Reads a circuit file and its includes from the file system and parses them: includes may
 * read the top file's folder tree (and `roots`), regular files only, within the limits. Throws
 * a `SourceError` with every problem (a missing or refused top file too).
 *
 * @example
 * ```ts
 * const source = readSource("bench/osc.onset");
 * const { circuit } = buildCircuit(source, { overrides: { "P1.at": 0.4 } });
 * ```
 */
export function readSource(path: string, options: ReadSourceOptions = {}): CircuitSource {
  checkText("readSource", "path", path);
  checkReaderOptions("readSource", options);
  checkOptionsObject("readSource", "options.limits", options.limits);
  return readSourceInner(path, options);
}

/** The file-system include reader, confined to `roots` unless `anywhere` is set. */
export function fileReader(options: FileReaderOptions = {}): IncludeResolver {
  checkReaderOptions("fileReader", options);
  return fileReaderInner(options);
}

/** A file's name as messages show it: relative to `cwd` when inside it. */
export function displayName(absolute: string, cwd: string): string {
  checkText("displayName", "absolute", absolute);
  checkText("displayName", "cwd", cwd);
  return displayNameInner(absolute, cwd);
}

/** A regular file's text, at most `maxBytes` bytes; undefined when there is no such file. */
export function readRegularFile(path: string, maxBytes: number, shown: string = path): string | undefined {
  checkText("readRegularFile", "path", path);
  if (!(typeof maxBytes === "number" && (maxBytes === Infinity || (Number.isSafeInteger(maxBytes) && maxBytes >= 0)))) {
    throw badArgument(`readRegularFile: maxBytes must be a whole number ≥ 0 (or Infinity), got ${describeArgument(maxBytes)}`);
  }
  checkText("readRegularFile", "shown", shown);
  return readRegularFileInner(path, maxBytes, shown);
}

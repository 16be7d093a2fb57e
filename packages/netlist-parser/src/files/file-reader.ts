import { realpathSync } from "node:fs";
import { dirname, isAbsolute, relative, resolve, sep } from "node:path";
import { inputError } from "@onset/core";
import type { IncludeResolver } from "../loader.js";
import { isMissing, readRegularFile } from "./regular-file.js";

/** The name standard input goes by in messages; its includes are found from the working folder. */
export const STDIN_NAME = "<stdin>";

/** File names relative to the working folder when below it, else absolute. */
export function displayName(absolute: string, cwd: string): string {
  const rel = relative(cwd, absolute);
  return rel !== "" && !rel.startsWith("..") && !isAbsolute(rel) ? rel : absolute;
}

/** True when `path` is `folder` or inside its tree (both absolute, normalised). */
function within(folder: string, path: string): boolean {
  const rel = relative(folder, path);
  return rel === "" || (!rel.startsWith(`..${sep}`) && rel !== ".." && !isAbsolute(rel));
}

function realFolder(folder: string): string {
  try {
    return realpathSync(folder);
  } catch {
    return folder;
  }
}

/** Where the file-system reader may read, and where relative names start. */
export interface FileReaderOptions {
  /**
   * The working folder: file names in messages are relative to it, and standard input's
   * includes are found from it.
   * @defaultValue `process.cwd()`
   */
  readonly cwd?: string;
  /**
   * The folders whose whole trees includes may read (symbolic links are followed, and their
   * targets must be inside too).
   * @defaultValue the working folder
   */
  readonly roots?: readonly string[];
  /**
   * Let includes read any file the process can read: only for files you trust.
   * @defaultValue false
   */
  readonly anywhere?: boolean;
}

/**
 * The file-system include reader: a path is relative to the folder of the file that includes
 * it; only regular files are read, at most the size limit; and only inside `roots` (by the
 * path as written and by where its links lead), unless `anywhere` is set. A refusal is an
 * `OnsetError`: `include-outside`, `not-a-regular-file`, `source-too-large` or `cannot-read`.
 */
export function fileReader(options: FileReaderOptions = {}): IncludeResolver {
  const cwd = resolve(options.cwd ?? process.cwd());
  const roots = (options.roots ?? [cwd]).map((r) => resolve(cwd, r));
  const realRoots = roots.map(realFolder);
  const shownRoots = roots.map((r) => (r === cwd ? "." : displayName(r, cwd))).join(", ");
  const refuse = (path: string) =>
    inputError("include-outside", `'${path}' is outside the folders includes may read (${shownRoots})`, {
      hint: "move the file below the including file's folder, or allow its folder: onset --include-root DIR (API: roots)",
    });
  return {
    resolve(fromFile, path, request) {
      const base = fromFile === STDIN_NAME ? cwd : dirname(resolve(cwd, fromFile));
      const absolute = resolve(base, path);
      if (!options.anywhere && !roots.some((r) => within(r, absolute))) throw refuse(path);
      let real: string;
      try {
        real = realpathSync(absolute);
      } catch (error) {
        if (isMissing(error)) return undefined;
        real = absolute;
      }
      if (!options.anywhere && !realRoots.some((r) => within(r, real))) throw refuse(path);
      const file = displayName(absolute, cwd);
      const text = readRegularFile(real, request?.maxBytes ?? Infinity, file);
      return text === undefined ? undefined : { file, text };
    },
  };
}

import { accessSync, constants, fstatSync, lstatSync, readlinkSync, statSync, type Stats } from "node:fs";
import { dirname, resolve } from "node:path";
import { usageError, type CliError } from "../cli-error.js";
import { errnoReason } from "./write-error.js";

/**
 * Where one output goes, decided once before any work is done:
 * - `stdout`: `-` (and `/dev/stdout`, `/dev/fd/1`), written through the command's stdout;
 * - `descriptor`: `/dev/fd/N` or `/proc/self/fd/N` (a shell's `>(…)`, `3>file`): written to the
 *   inherited descriptor N, neither reopened nor truncated (so `3>>log` appends). N must be one
 *   the caller opened for the command; the checks can only refuse what cannot be such a one;
 * - `device`: a FIFO or a character device (a terminal, a sink): opened for writing in place;
 * - `file`: a regular file or a new path, replaced atomically (temporary file beside it, then a
 *   rename). A symlink is followed first, so the link stays and its real file is replaced; a
 *   file with several hard links is rewritten in place so every name keeps seeing it.
 */
export type OutputTarget = {
  /** The option it was given for (`--csv`), or what it is (`the results file`), for messages. */
  readonly label: string;
  /** The path as the user wrote it. */
  readonly shown: string;
} & (
  | { readonly kind: "stdout" }
  | { readonly kind: "descriptor"; readonly fd: number }
  | { readonly kind: "device"; readonly path: string; readonly what: "FIFO" | "character device" }
  | {
      readonly kind: "file";
      /** The file written: the given path with every symlink of its last component followed. */
      readonly path: string;
      /** The file being replaced (its mode and owner are kept), or null for a new file. */
      readonly existing: Stats | null;
      /** Written in place, not replaced: the file has several hard links. */
      readonly inPlace: boolean;
    }
);

/** Symlink hops followed before giving up, as the kernel's own limit (Linux: 40). */
const MAX_LINKS = 40;

/** The descriptor a path names (`/dev/fd/3`, `/proc/self/fd/3`, `/dev/stdout`), if it names one. */
export function descriptorOf(path: string): number | null {
  const named: Record<string, number> = { "/dev/stdin": 0, "/dev/stdout": 1, "/dev/stderr": 2 };
  if (path in named) return named[path]!;
  const match = /^\/(?:dev\/fd|proc\/(?:self|thread-self|(\d+))\/fd)\/(\d+)$/.exec(path);
  if (!match) return null;
  if (match[1] !== undefined && Number(match[1]) !== process.pid) return null;
  return Number(match[2]);
}

function cannot(label: string, shown: string, reason: string, hint?: string): CliError {
  return usageError("cannot-write", `cannot write ${label} '${shown}': ${reason}`, hint);
}

/**
 * Follows the symlinks of the last component of `path` (each hop read relative to the link's
 * folder). Stops at a descriptor path, at something that is not a link, or at a path that does
 * not exist (a new file, or the missing target of a dangling link, which is then created).
 */
function followLinks(path: string, fail: (reason: string, hint?: string) => CliError): string {
  let current = path;
  for (let hop = 0; hop <= MAX_LINKS; hop++) {
    if (descriptorOf(current) !== null) return current;
    let link: Stats;
    try {
      link = lstatSync(current);
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === "ENOENT") return current;
      throw pathProblem(error, fail);
    }
    if (!link.isSymbolicLink()) return current;
    current = resolve(dirname(current), readlinkSync(current));
  }
  throw fail(`more than ${MAX_LINKS} symbolic links in a row`, "one of the links probably points back at itself");
}

function pathProblem(error: unknown, fail: (reason: string, hint?: string) => CliError): CliError {
  const code = (error as NodeJS.ErrnoException).code;
  if (code === "ENOTDIR") return fail("a part of the path before the file name is a file, not a folder", "check the path");
  return fail(errnoReason(error));
}

/** A writable folder for a new file (and for the temporary file of an atomic replace); `shown` names it in messages. */
function checkFolder(folder: string, shown: string, fail: (reason: string, hint?: string) => CliError): void {
  let stats: Stats;
  try {
    stats = statSync(folder);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === "ENOENT") throw fail(`the folder '${shown}' does not exist`, `create it first (mkdir -p ${shown}) or give another path`);
    throw pathProblem(error, fail);
  }
  if (!stats.isDirectory()) throw fail(`'${shown}' is not a folder`, "check the path");
  try {
    accessSync(folder, constants.W_OK | constants.X_OK);
  } catch (error) {
    throw fail(`the folder '${shown}' is not writable: ${errnoReason(error)}`, "choose a folder you can write to");
  }
}

function checkWritable(path: string, fail: (reason: string, hint?: string) => CliError): void {
  try {
    accessSync(path, constants.W_OK);
  } catch (error) {
    throw fail(`it is not writable: ${errnoReason(error)}`, "make it writable or give another path");
  }
}

/**
 * Classifies the output `given` for the option `label` (e.g. `--csv`), relative to `cwd`, and
 * checks that it can be written: its folder exists and is writable, it is not a folder, a
 * socket or a disk. Throws a usage error (exit status 2) naming the option and the path.
 */
export function outputTarget(given: string, cwd: string, label: string): OutputTarget {
  const fail = (reason: string, hint?: string) => cannot(label, given, reason, hint);
  if (given === "") throw usageError("cannot-write", `${label} needs a file name`, `give a path, or - for standard output`);
  if (given === "-") return { kind: "stdout", label, shown: given };
  const absolute = resolve(cwd, given);
  if (given.endsWith("/")) throw fail("it names a folder", "give a file name inside it");
  const end = followLinks(absolute, fail);
  // The folder as the user wrote it, unless a link led elsewhere.
  const folder = end === absolute ? dirname(given) : dirname(end);
  const fd = descriptorOf(end);
  if (fd === 1) return { kind: "stdout", label, shown: given };
  if (fd !== null) {
    let stats: Stats;
    try {
      stats = fstatSync(fd);
    } catch {
      throw fail(`descriptor ${fd} is not open`, `open it in the shell (e.g. ${fd}>file) or give a file name`);
    }
    // The command's own event loop holds descriptors too (epoll, eventfd): only a file, a pipe,
    // a socket or a terminal can be one the shell opened for it.
    if (!(stats.isFile() || stats.isFIFO() || stats.isSocket() || stats.isCharacterDevice())) {
      throw fail(`descriptor ${fd} is not a file, a pipe or a terminal opened for onset`, `open it in the shell (e.g. ${fd}>file) or give a file name`);
    }
    return { kind: "descriptor", label, shown: given, fd };
  }
  let stats: Stats | null;
  try {
    stats = statSync(end);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== "ENOENT") throw pathProblem(error, fail);
    stats = null;
  }
  if (stats === null) {
    checkFolder(dirname(end), folder, fail);
    return { kind: "file", label, shown: given, path: end, existing: null, inPlace: false };
  }
  if (stats.isDirectory()) throw fail("it is a folder", "give a file name inside it");
  if (stats.isBlockDevice()) throw fail("it is a block device (a disk); onset never writes onto one", "give a file name");
  if (stats.isSocket()) throw fail("it is a socket; onset writes files, pipes and terminals", "give a file name, or - for standard output");
  if (stats.isFIFO() || stats.isCharacterDevice()) {
    checkWritable(end, fail);
    return { kind: "device", label, shown: given, path: end, what: stats.isFIFO() ? "FIFO" : "character device" };
  }
  checkWritable(end, fail);
  const inPlace = stats.nlink > 1;
  if (!inPlace) checkFolder(dirname(end), folder, fail);
  return { kind: "file", label, shown: given, path: end, existing: stats, inPlace };
}

/** True when the target is a stream (stdout, a descriptor, a FIFO or a device): it takes one document, read once. */
export function isStream(target: OutputTarget): boolean {
  return target.kind !== "file";
}

import { closeSync, constants, fsyncSync, openSync } from "node:fs";
import { replaceFileAtomic } from "./atomic.js";
import { writeAll } from "./descriptor.js";
import { outputTarget, type OutputTarget } from "./target.js";
import { writeFailure } from "./write-error.js";

/** Where `-` goes: the command's standard output. */
export type StdoutWriter = (text: string) => void;

/** An output written as it grows (a study's results file): appends after the first text. */
export interface OutputStream {
  append(text: string): void;
  /** Flushes a file to disk and closes what was opened; inherited descriptors stay open. */
  close(): void;
}

/** Opens a device or FIFO for writing in place: no creation, no truncation, no rename. */
function openDevice(path: string): number {
  return openSync(path, constants.O_WRONLY | constants.O_NOCTTY);
}

/** Runs `action`, turning a system error into the plain write failure of `target`. */
function guarded<T>(target: OutputTarget, action: () => T): T {
  try {
    return action();
  } catch (error) {
    throw writeFailure(error, target.label, target.shown);
  }
}

/**
 * Writes one whole document to a classified target: stdout through `stdout`, a descriptor or a
 * device directly, a hard-linked file in place, any other file replaced atomically.
 */
export function writeOutput(target: OutputTarget, text: string, stdout: StdoutWriter): void {
  openOutput(target, text, stdout).close();
}

/**
 * Starts an output that grows: `first` is written as a whole document (a file is replaced
 * atomically, so an interrupted start leaves the old file), then each `append` adds to it.
 * After a failed write every later one fails the same way.
 */
export function openOutput(target: OutputTarget, first: string, stdout: StdoutWriter): OutputStream {
  // The descriptor this output opened (closed at the end); inherited ones stay open.
  let owned: number | undefined;
  const start = (): StdoutWriter => {
    switch (target.kind) {
      case "stdout":
        stdout(first);
        return stdout;
      case "descriptor":
        writeAll(target.fd, first);
        return (text: string) => writeAll(target.fd, text);
      case "device":
        owned = openDevice(target.path);
        break;
      case "file":
        if (target.inPlace) owned = openSync(target.path, constants.O_WRONLY | constants.O_TRUNC);
        else {
          replaceFileAtomic(target.path, first, target.existing);
          owned = openSync(target.path, "a");
          const fd = owned;
          return (text: string) => writeAll(fd, text);
        }
    }
    const fd = owned!;
    writeAll(fd, first);
    return (text: string) => writeAll(fd, text);
  };
  let sink: StdoutWriter;
  try {
    sink = guarded(target, start);
  } catch (error) {
    if (owned !== undefined) closeSync(owned);
    throw error;
  }
  let failure: unknown;
  let closed = false;
  return {
    append(text) {
      if (closed) throw new Error(`${target.label}: append after close`);
      if (failure !== undefined) throw failure;
      try {
        guarded(target, () => sink(text));
      } catch (error) {
        failure = error;
        throw error;
      }
    },
    close() {
      if (closed) return;
      closed = true;
      if (owned === undefined) return;
      const fd = owned;
      guarded(target, () => {
        try {
          if (target.kind === "file" && failure === undefined) fsyncSync(fd);
        } finally {
          closeSync(fd);
        }
      });
    },
  };
}

/**
 * Writes `text` to the output `path` (relative to `cwd`) the way the command does: classified
 * by `outputTarget` (a bad path throws a `CliError`), then written by `writeOutput`; `-` is
 * this process's standard output.
 */
export function writeOutputFile(path: string, text: string, cwd: string = process.cwd()): void {
  writeOutput(outputTarget(path, cwd, "output"), text, (t) => process.stdout.write(t));
}

import { closeSync, constants, fstatSync, openSync, readSync, statSync, type Stats } from "node:fs";
import { inputError } from "@onset/core";
import { byteSize, exactSize, tooLargeWords } from "../source-limits.js";

/** What a file-system entry is, in words, when it is not a regular file. */
function kindOf(stats: Stats): string {
  if (stats.isDirectory()) return "a folder";
  if (stats.isFIFO()) return "a FIFO (named pipe)";
  if (stats.isCharacterDevice()) return "a character device";
  if (stats.isBlockDevice()) return "a block device";
  if (stats.isSocket()) return "a socket";
  return "not a regular file";
}

function notRegular(shown: string, stats: Stats) {
  return inputError("not-a-regular-file", `'${shown}' is ${kindOf(stats)}, not a regular file: circuit files are read only from regular files`, {
    hint: "name a .onset file (standard input is read with -)",
  });
}

function tooLarge(shown: string, size: string, maxBytes: number) {
  const { message, hint } = tooLargeWords(shown, size, maxBytes);
  return inputError("source-too-large", message, { hint });
}

/** The reason a system call failed, in words. */
function reason(error: NodeJS.ErrnoException): string {
  switch (error.code) {
    case "EACCES":
    case "EPERM":
      return "permission denied";
    case "EISDIR":
      return "it is a folder";
    case "ELOOP":
      return "too many symbolic links";
    default:
      return error.code ?? error.message;
  }
}

/** True for the errors that mean "no such file". */
export function isMissing(error: unknown): boolean {
  const code = (error as NodeJS.ErrnoException | undefined)?.code;
  return code === "ENOENT" || code === "ENOTDIR";
}

/**
 * Reads a UTF-8 text file of at most `maxBytes` bytes. A folder, FIFO, device or socket is
 * refused by its kind before it is opened (`not-a-regular-file`); a file above the size limit
 * is refused by its size (`source-too-large`), and reading stops at the limit whatever the file
 * does meanwhile, so memory never depends on what the path points to. Returns undefined when
 * there is no such file; other failures are `cannot-read`. `shown` names the file in messages.
 */
export function readRegularFile(path: string, maxBytes: number, shown: string = path): string | undefined {
  let fd: number;
  try {
    const stats = statSync(path);
    if (!stats.isFile()) throw notRegular(shown, stats);
    if (stats.size > maxBytes) throw tooLarge(shown, exactSize(stats.size), maxBytes);
    // Non-blocking, so a FIFO put in the file's place after the check cannot hold the open.
    fd = openSync(path, constants.O_RDONLY | (constants.O_NONBLOCK ?? 0));
  } catch (error) {
    if (isMissing(error)) return undefined;
    if (error instanceof Error && "code" in error && typeof (error as NodeJS.ErrnoException).syscall === "string") {
      throw inputError("cannot-read", `cannot read '${shown}': ${reason(error as NodeJS.ErrnoException)}`);
    }
    throw error;
  }
  try {
    const stats = fstatSync(fd);
    if (!stats.isFile()) throw notRegular(shown, stats);
    // Room for one byte past the size seen, to notice a file that grew; never past the limit + 1.
    let buffer = Buffer.alloc(Math.min(stats.size, maxBytes) + 1);
    let length = 0;
    for (;;) {
      if (length === buffer.length) {
        if (length > maxBytes) throw tooLarge(shown, `more than ${byteSize(maxBytes)} (it grew while being read)`, maxBytes);
        const bigger = Buffer.alloc(Math.min(2 * buffer.length, maxBytes + 1));
        buffer.copy(bigger, 0, 0, length);
        buffer = bigger;
      }
      const n = readSync(fd, buffer, length, buffer.length - length, null);
      if (n === 0) break;
      length += n;
    }
    return buffer.toString("utf8", 0, length);
  } catch (error) {
    if (error instanceof Error && typeof (error as NodeJS.ErrnoException).syscall === "string") {
      throw inputError("cannot-read", `cannot read '${shown}': ${reason(error as NodeJS.ErrnoException)}`);
    }
    throw error;
  } finally {
    closeSync(fd);
  }
}

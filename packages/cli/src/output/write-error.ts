import { usageError } from "../cli-error.js";

/** System error codes a write can meet, in plain words. */
const REASONS: Readonly<Record<string, string>> = {
  ENOSPC: "no space left on the device",
  EDQUOT: "the disk quota is used up",
  EFBIG: "the file would be larger than the file system allows",
  EPIPE: "the program reading it went away before onset finished writing",
  ECONNRESET: "the program reading it went away before onset finished writing",
  EACCES: "permission denied",
  EPERM: "operation not permitted",
  EROFS: "the file system is read-only",
  ENOENT: "its folder no longer exists",
  ENOTDIR: "a part of the path before the file name is a file, not a folder",
  EISDIR: "it is a folder",
  ENXIO: "nothing is at the other end (no reader, or a socket)",
  ELOOP: "too many symbolic links",
  ENAMETOOLONG: "the name is too long",
  EIO: "an input/output error on the device",
  EBADF: "the descriptor is not open for writing",
  EBUSY: "it is busy",
  ETXTBSY: "it is a running program",
};

/** The reason of a system error in plain words (its code kept for a search), or its message. */
export function errnoReason(error: unknown): string {
  const code = (error as NodeJS.ErrnoException | undefined)?.code;
  if (code !== undefined && code in REASONS) return `${REASONS[code]!} (${code})`;
  return error instanceof Error ? error.message : String(error);
}

/** True for an error raised by the system (it has an errno code), as opposed to a bug. */
export function isSystemError(error: unknown): error is NodeJS.ErrnoException {
  return error instanceof Error && typeof (error as NodeJS.ErrnoException).code === "string" && typeof (error as NodeJS.ErrnoException).syscall === "string";
}

/**
 * A write that failed after the checks (the disk filled up, a pipe's reader left): a plain
 * message naming the option and the path, exit status 2 — never an internal error.
 */
export function writeFailure(error: unknown, label: string, shown: string): unknown {
  if (!isSystemError(error)) return error;
  const code = error.code!;
  const hint = code === "EPIPE" || code === "ECONNRESET" ? "keep the reading program open until onset exits" : code === "ENOSPC" || code === "EDQUOT" ? "free some space, or write elsewhere" : undefined;
  return usageError("write-failed", `cannot write ${label} '${shown}': ${errnoReason(error)}`, hint);
}

import { randomBytes } from "node:crypto";
import { closeSync, fchmodSync, fchownSync, fsyncSync, openSync, renameSync, rmSync, type Stats } from "node:fs";
import { basename, dirname, join } from "node:path";
import { writeAll } from "./descriptor.js";

/** Flushes a folder's entries, so a rename in it survives a crash; not every file system can. */
function syncFolder(folder: string): void {
  let fd: number | undefined;
  try {
    fd = openSync(folder, "r");
    fsyncSync(fd);
  } catch {
    // A folder that cannot be opened or flushed (some network file systems) keeps the rename anyway.
  } finally {
    if (fd !== undefined) closeSync(fd);
  }
}

/**
 * Replaces the regular file (or new path) `path` with `text` atomically: the text goes to a
 * temporary file in the same folder (so the rename stays on one file system), is flushed, then
 * renamed over the target. A reader sees the old file or the new one, never half of it. The
 * replaced file's permissions are kept, and its owner when the process may set it.
 * The caller has classified the target (`outputTarget`): `path` is never a link or a device.
 */
export function replaceFileAtomic(path: string, text: string, existing: Stats | null): void {
  const temporary = join(dirname(path), `.${basename(path)}.${randomBytes(6).toString("hex")}.tmp`);
  const fd = openSync(temporary, "wx", existing ? existing.mode & 0o7777 : 0o666);
  try {
    writeAll(fd, text);
    if (existing) {
      try {
        fchownSync(fd, existing.uid, existing.gid);
      } catch {
        // Only a privileged process may give a file away; otherwise it stays the writer's.
      }
      // The mode given to open is cut by the umask (and a change of owner clears set-id bits):
      // set it exactly as the old file had it, last.
      fchmodSync(fd, existing.mode & 0o7777);
    }
    fsyncSync(fd);
  } catch (error) {
    closeSync(fd);
    rmSync(temporary, { force: true });
    throw error;
  }
  closeSync(fd);
  try {
    renameSync(temporary, path);
  } catch (error) {
    rmSync(temporary, { force: true });
    throw error;
  }
  syncFolder(dirname(path));
}

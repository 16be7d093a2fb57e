import { execFileSync, spawn } from "node:child_process";
import { statSync } from "node:fs";

/**
 * Special files a test makes in its own temporary folder (never the machine's /dev entries):
 * FIFOs with mkfifo, and character-device nodes with mknod where the user may (root may).
 */

export function mkfifo(path: string): void {
  execFileSync("mkfifo", [path]);
}

/**
 * A device node at `path` (`c` character, `b` block) of the given major/minor numbers; false
 * when mknod is not permitted. Only our own nodes in a temporary folder are ever written.
 */
export function mknod(path: string, type: "c" | "b", major: number, minor: number): boolean {
  try {
    execFileSync("mknod", [path, type, String(major), String(minor)], { stdio: "ignore" });
    const s = statSync(path);
    return type === "c" ? s.isCharacterDevice() : s.isBlockDevice();
  } catch {
    return false;
  }
}

/** A character device node of the kernel's null device (major 1, minor 3) at `path`; false when mknod is not permitted. */
export function mknodNull(path: string): boolean {
  return mknod(path, "c", 1, 3);
}

/**
 * A reader of a FIFO in another process, as a user's `cat fifo > file` would be: the FIFO's
 * content ends up in `into`; resolves with the shell's exit status when the writer closes it.
 * (The reader must not write into a pipe of this process: a test that blocks writing the FIFO
 * would stop draining it, and both would wait for ever.)
 */
export function readFifo(fifo: string, into: string, bytes?: number): Promise<number | null> {
  const command = bytes === undefined ? `cat "$0" > "$1"` : `head -c ${bytes} "$0" > "$1"`;
  return new Promise((done, fail) => {
    const child = spawn("sh", ["-c", command, fifo, into], { stdio: "ignore" });
    child.on("error", fail);
    child.on("close", done);
  });
}

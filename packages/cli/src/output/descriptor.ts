import { writeSync } from "node:fs";

/** A cell to sleep on: Atomics.wait blocks this thread for a while without spinning. */
const pause = new Int32Array(new SharedArrayBuffer(4));

/**
 * Writes all of `text` to the descriptor `fd`. A pipe may take part of it, or (when its writer
 * end was left non-blocking, as an inherited descriptor can be) none for now (EAGAIN): the rest
 * is written when the reader has made room, so a reader always gets the whole document.
 */
export function writeAll(fd: number, text: string): void {
  const bytes = Buffer.from(text, "utf8");
  let offset = 0;
  while (offset < bytes.length) {
    try {
      offset += writeSync(fd, bytes, offset, bytes.length - offset);
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== "EAGAIN") throw error;
      Atomics.wait(pause, 0, 0, 2);
    }
  }
}

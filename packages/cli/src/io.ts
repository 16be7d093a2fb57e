import { readSync } from "node:fs";

/** What the command reads and writes besides files: the streams, the environment and the folder. */
export interface CliIo {
  readonly stdout: (text: string) => void;
  readonly stderr: (text: string) => void;
  /**
   * Standard input, read when a FILE of `-` asks for it: all of it, or at most `maxBytes` + 1
   * bytes (enough to tell that it is over the limit).
   */
  readonly readStdin: (maxBytes?: number) => string;
  /** True when standard output is a terminal (the report may be coloured). */
  readonly stdoutIsTerminal: boolean;
  /** True when standard error is a terminal (progress bars and coloured messages go there). */
  readonly stderrIsTerminal: boolean;
  readonly env: Readonly<Record<string, string | undefined>>;
  readonly cwd: string;
  /** The stream progress bars draw on (a terminal); absent when none may be drawn. */
  readonly progressStream?: NodeJS.WriteStream;
  /**
   * Calls `stop` when the user interrupts (Ctrl-C, or a termination request) and returns the
   * function that stops listening; without a listener an interrupt ends the process at once.
   * `onset run --watch` listens while it waits for changes.
   */
  readonly onInterrupt?: (stop: () => void) => () => void;
}

/** Waits a few milliseconds without spinning (a non-blocking descriptor with nothing to read yet). */
function pause(ms: number): void {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}

/** Reads a descriptor to its end, or until more than `maxBytes` bytes have come. */
function readDescriptor(fd: number, maxBytes: number): string {
  const chunks: Buffer[] = [];
  let total = 0;
  const chunk = Buffer.alloc(65536);
  while (total <= maxBytes) {
    let n: number;
    try {
      n = readSync(fd, chunk, 0, Math.min(chunk.length, maxBytes + 1 - total), null);
    } catch (error) {
      const code = (error as NodeJS.ErrnoException).code;
      if (code === "EAGAIN") {
        pause(5);
        continue;
      }
      if (code === "EOF") break;
      throw error;
    }
    if (n === 0) break;
    chunks.push(Buffer.from(chunk.subarray(0, n)));
    total += n;
  }
  return Buffer.concat(chunks).toString("utf8");
}

/**
 * The process's own streams and environment. When the program reading stdout goes away
 * (`onset run … --csv - | head`), the rest of the output is dropped quietly, as a pipeline
 * expects, instead of ending in an unhandled EPIPE.
 */
export function processIo(): CliIo {
  let readerGone = false;
  process.stdout.on("error", (error: NodeJS.ErrnoException) => {
    if (error.code !== "EPIPE") throw error;
    readerGone = true;
  });
  return {
    stdout: (text) => {
      if (!readerGone) process.stdout.write(text);
    },
    stderr: (text) => process.stderr.write(text),
    readStdin: (maxBytes = Infinity) => readDescriptor(0, maxBytes),
    stdoutIsTerminal: process.stdout.isTTY === true,
    stderrIsTerminal: process.stderr.isTTY === true,
    env: process.env,
    cwd: process.cwd(),
    ...(process.stderr.isTTY ? { progressStream: process.stderr } : {}),
    onInterrupt: (stop) => {
      process.on("SIGINT", stop);
      process.on("SIGTERM", stop);
      return () => {
        process.off("SIGINT", stop);
        process.off("SIGTERM", stop);
      };
    },
  };
}

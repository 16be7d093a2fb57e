import { readFileSync } from "node:fs";

/** What the command reads and writes besides files: the streams, the environment and the folder. */
export interface CliIo {
  readonly stdout: (text: string) => void;
  readonly stderr: (text: string) => void;
  /** The whole of standard input, read when a FILE of `-` asks for it. */
  readonly readStdin: () => string;
  /** True when standard output is a terminal (the report may be coloured). */
  readonly stdoutIsTerminal: boolean;
  /** True when standard error is a terminal (progress bars and coloured messages go there). */
  readonly stderrIsTerminal: boolean;
  readonly env: Readonly<Record<string, string | undefined>>;
  readonly cwd: string;
  /** The stream progress bars draw on (a terminal); absent when none may be drawn. */
  readonly progressStream?: NodeJS.WriteStream;
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
    readStdin: () => readFileSync(0, "utf8"),
    stdoutIsTerminal: process.stdout.isTTY === true,
    stderrIsTerminal: process.stderr.isTTY === true,
    env: process.env,
    cwd: process.cwd(),
    ...(process.stderr.isTTY ? { progressStream: process.stderr } : {}),
  };
}

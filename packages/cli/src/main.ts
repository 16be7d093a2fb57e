#!/usr/bin/env node
import { runCli } from "./cli.js";

// The exit status is set rather than forced, so pending output is flushed before node exits.
runCli(process.argv.slice(2)).then(
  (status) => {
    process.exitCode = status;
  },
  (error: unknown) => {
    process.stderr.write(`internal error: ${error instanceof Error ? error.message : String(error)}\n`);
    process.exitCode = 3;
  },
);

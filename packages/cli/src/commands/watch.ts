import { statSync, watch, type FSWatcher } from "node:fs";
import { basename, dirname, resolve } from "node:path";
import type { ParsedArgs } from "../args.js";
import { CliError, usageError } from "../cli-error.js";
import { EXIT } from "../exit.js";
import { sourcePaths } from "../input/source.js";
import type { CommandContext } from "./context.js";
import { reportFailure } from "./failure.js";

/** Saves closer together than this make one change (an editor writes, renames, touches). */
const DEBOUNCE_MS = 150;

/** One run of the command; `signal` aborts a study in progress. */
export type RunOnce = (ctx: CommandContext, args: ParsedArgs, signal: AbortSignal) => Promise<number>;

/** What identifies a file's content cheaply: it changes on every save. */
function fingerprint(path: string): string {
  try {
    const s = statSync(path);
    return `${s.ino}:${s.size}:${s.mtimeMs}:${s.ctimeMs}`;
  } catch {
    return "absent";
  }
}

function clock(): string {
  return new Date().toTimeString().slice(0, 8);
}

/**
 * `onset run --watch FILE`: runs, then runs again whenever FILE or one of its includes is
 * saved (the includes are read afresh each time, so a new include is watched too), rewriting
 * the outputs. An error in the file is shown and watching goes on. A study still running when a
 * file changes is stopped and started again. Ctrl-C while waiting stops watching (status 0);
 * during a run it ends the process at once, as without --watch.
 *
 * Each file's folder is watched rather than the file, so an editor that saves by writing a new
 * file and renaming it over the old one is seen; events are filtered by name and by the files'
 * fingerprints, and debounced.
 */
export async function watchCommand(ctx: CommandContext, args: ParsedArgs, runOnce: RunOnce): Promise<number> {
  const path = args.positionals[0]!;
  if (path === "-") throw usageError("bad-option", "--watch needs a file to watch, not standard input", "give the circuit file's name");
  if (args.flags.has("resume")) throw usageError("bad-option", "--watch and --resume do not go together", "each run of --watch starts the study afresh");
  const top = resolve(ctx.io.cwd, path);
  const debug = args.flags.has("debug");
  let files = new Map<string, string>([[top, fingerprint(top)]]);
  const watchers = new Map<string, FSWatcher>();
  let timer: ReturnType<typeof setTimeout> | undefined;
  let running: AbortController | null = null;
  let again = false;
  let finish: (status: number) => void = () => {};
  const finished = new Promise<number>((done) => (finish = done));
  let stopListening: (() => void) | undefined;

  const changed = (): string[] => [...files].filter(([file, print]) => fingerprint(file) !== print).map(([file]) => file);

  const follow = (paths: readonly string[]) => {
    files = new Map(paths.map((p) => [p, fingerprint(p)]));
    const folders = new Set(paths.map((p) => dirname(p)));
    for (const [folder, watcher] of watchers) {
      if (!folders.has(folder)) {
        watcher.close();
        watchers.delete(folder);
      }
    }
    for (const folder of folders) {
      if (watchers.has(folder)) continue;
      try {
        const watcher = watch(folder, (_event, name) => {
          if (name === null || paths.some((p) => basename(p) === String(name))) schedule();
        });
        watcher.on("error", () => watcher.close());
        watchers.set(folder, watcher);
      } catch {
        // A folder that vanished is looked at again after the next run.
      }
    }
  };

  const stop = () => {
    clearTimeout(timer);
    for (const watcher of watchers.values()) watcher.close();
    stopListening?.();
    running?.abort();
    ctx.note("stopped watching");
    finish(EXIT.ok);
  };

  const schedule = () => {
    clearTimeout(timer);
    timer = setTimeout(() => {
      if (running) {
        again = true;
        running.abort();
      } else if (changed().length > 0) void run(changed());
    }, DEBOUNCE_MS);
  };

  const run = async (because: readonly string[]) => {
    stopListening?.();
    stopListening = undefined;
    if (because.length > 0) ctx.note(`\n── ${clock()} ${because.map((f) => basename(f)).join(", ")} changed: running again`);
    const controller = new AbortController();
    running = controller;
    ctx.sources = new Map();
    let read: ReadonlyMap<string, string> = new Map();
    try {
      await runOnce(ctx, args, controller.signal);
      read = ctx.sources;
    } catch (error) {
      if (controller.signal.aborted) ctx.note("stopped: a file changed");
      else reportFailure(error, ctx, debug);
      read = error instanceof CliError && error.sources.size > 0 ? error.sources : ctx.sources;
    }
    running = null;
    const paths = sourcePaths(read, ctx.io.cwd);
    follow(paths.includes(top) ? paths : [top, ...paths]);
    if (again) {
      again = false;
      void run(changed());
      return;
    }
    stopListening = ctx.io.onInterrupt?.(stop);
    ctx.note(`watching ${files.size} ${files.size === 1 ? "file" : "files"} for changes (Ctrl-C to stop)`);
  };

  await run([]);
  return finished;
}

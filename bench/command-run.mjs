// One command of the built CLI in a process of its own, as a stranger's file would be run: its
// exit status, what it ended in (the error code, or the result), its wall time and peak memory.
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";

const MAIN = fileURLToPath(new URL("../packages/cli/dist/main.js", import.meta.url));
/** Preloaded into each command: writes its peak resident set (kB) to the file named in ONSET_BENCH_RSS at exit. */
const PROBE = "process.on('exit', () => require('node:fs').writeFileSync(process.env.ONSET_BENCH_RSS, String(process.resourceUsage().maxRSS)));";

/** A fresh folder for the commands' files, with the memory probe in it. */
export function commandDir(prefix) {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  writeFileSync(join(dir, "probe.cjs"), PROBE);
  return dir;
}

/** Runs one command in `dir`: its exit status, what it ended in, wall ms and peak RSS. */
export function measure(dir, args) {
  const rss = join(dir, "rss");
  const started = performance.now();
  const run = spawnSync(process.execPath, ["--require", join(dir, "probe.cjs"), MAIN, ...args], { cwd: dir, encoding: "utf8", env: { ...process.env, NO_COLOR: "1", ONSET_BENCH_RSS: rss }, maxBuffer: 1 << 28 });
  const ms = performance.now() - started;
  return { status: run.status, stdout: run.stdout, stderr: run.stderr, ms, peakMB: Number(readFileSync(rss, "utf8")) / 1024 };
}

export function outcomeOf(r) {
  try {
    const doc = JSON.parse(r.stdout);
    if (doc.error) return `error ${doc.error.code}${doc.error.line ? ` at line ${doc.error.line}` : ""}`;
    const warnings = (doc.results ?? []).flatMap((x) => x.warnings ?? []).map((w) => `${w.code} ${w.part ?? ""}`.trim());
    return warnings.length > 0 ? `result; warnings: ${[...new Set(warnings)].join(", ")}` : "result";
  } catch {
    const first = r.stderr.split("\n").find((l) => / error: /.test(l));
    const more = r.stderr.split("\n").filter((l) => / error: /.test(l)).length;
    return first ? `${more} error lines, first: ${first.slice(0, 60)}` : `status ${r.status}`;
  }
}


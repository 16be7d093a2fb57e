import { mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { afterAll, describe, expect, test } from "vitest";
import { RC_STEP, wien, Workspace } from "./support/onset.js";
import { mkfifo } from "../support/special-files.js";

// The limits of the command line: each hit ends with a clear message naming the limit, what was
// met and how to raise it (exit 2 for input, 3 for a run stopped by a limit), never a crash.

const ws = new Workspace();
afterAll(() => ws.remove());

const LONG = RC_STEP.replace("until=5m max-step=10u", "until=100 max-step=1u");

describe("run limits", () => {
  test("--limit steps=N refuses up front a run whose until= and max-step= need more steps, positioned at the analysis", async () => {
    ws.write("long.onset", LONG);
    const r = await ws.run(["run", "long.onset", "--limit", "steps=1000"]);
    expect(r.status).toBe(3);
    const lines = r.stderr.split("\n");
    // 100 s in steps of at most 1 µs: 10⁸ steps at the least.
    expect(lines[0]).toBe("long.onset:5:1: error: the transient until=100 s with max-step=0.000001 s needs at least 100 000 000 steps, more than the step limit of 1 000; it was not started");
    expect(lines.slice(1, 4)).toEqual([
      "  transient until=100 max-step=1u start=rest probes=(o, R1.i)",
      `  ^${"~".repeat("transient until=100 max-step=1u start=rest probes=(o, R1.i)".length - 1)}`,
      "hint: raise the limit with --limit steps=N (API: limits.maxSteps), or give the analysis a larger max-step or a shorter run (until=; cycles= on steady)",
    ]);
  });

  test("--limit simulated-time refuses a longer run before it starts; --json names the code", async () => {
    const r = await ws.run(["run", "long.onset", "--limit", "simulated-time=10", "--json"]);
    expect(r.status).toBe(3);
    const doc = JSON.parse(r.stdout);
    expect([doc.error.code, doc.error.message, doc.error.line]).toEqual(["simulated-time-limit", "the transient until=100 s is longer than the simulated-time limit of 10 s; it was not started", 5]);
  });

  test("--time-limit stops a run that would take far longer (1e8 steps) with wall-time-limit", async () => {
    const r = await ws.run(["run", "long.onset", "--time-limit", "300m", "--limit", "steps=inf"]);
    expect(r.status).toBe(3);
    expect(r.stderr).toMatch(/^long\.onset:5:1: error: the wall-time limit of 0\.3 s ran out during the transient at t = [\d.e-]+ s \([\d.]+ s spent\)\n/);
    expect(r.stderr).toContain("hint: raise the limit with --time-limit SECONDS (API: limits.maxWallTime)");
  });

  test("a tolerance study on two workers stops at the first sample that runs out, keeping what finished for --resume", async () => {
    ws.write("study.onset", wien("startup probe=o until=auto\ntolerance runs=8 seed=2\n"));
    const r = await ws.run(["run", "study.onset", "--jobs", "2", "--limit", "steps=200"]);
    expect(r.status).toBe(3);
    expect(r.stderr).toContain("error: the start-up run reached the step limit of 200 accepted steps at t = ");
    expect(r.stderr).toContain("the samples finished so far are in study.results.jsonl: --resume continues the study");
  });

  test("bad limits are usage errors naming the choices", async () => {
    const unknown = await ws.run(["run", "long.onset", "--limit", "stepz=10"]);
    expect([unknown.status, unknown.stderr]).toEqual([2, "error: --limit: unknown limit 'stepz' (did you mean 'steps'?)\nhint: limits: source-size, include-depth, source-files, diagnostics, use-depth, parts, expression-depth, operators, parameter-depth, steps, simulated-time, sweep-points, runs, study-runs, stored-points, dense-unknowns\n"]);
    const time = await ws.run(["run", "long.onset", "--time-limit", "soon"]);
    expect([time.status, time.stderr]).toEqual([2, "error: --time-limit: 'soon' is not a time above 0\nhint: write seconds, for example 10, 500m or 2.5s\n"]);
    const count = await ws.run(["run", "long.onset", "--limit", "steps=-1"]);
    expect(count.stderr).toBe("error: --limit steps: '-1' is not a whole number above 0\nhint: write for example 250000, 250k, 4M or inf\n");
  });
});

describe("source limits and the include reader", () => {
  test("include of a device or a system file is refused at the include, without reading it", async () => {
    ws.write("zero.onset", 'include "/dev/zero"\n');
    const r = await ws.run(["check", "zero.onset"]);
    expect([r.status, r.stderr.split("\n")[0]]).toEqual([2, "zero.onset:1:9: error: '/dev/zero' is outside the folders includes may read (.)"]);
    const allowed = await ws.run(["check", "zero.onset", "--include-root", "/dev"]);
    expect([allowed.status, allowed.stderr.split("\n")[0]]).toEqual([2, "zero.onset:1:9: error: '/dev/zero' is a character device, not a regular file: circuit files are read only from regular files"]);
  });

  test("a FIFO as the circuit file or an include is refused by kind (an open would wait for a writer)", async () => {
    mkfifo(ws.path("pipe.onset"));
    const top = await ws.run(["run", "pipe.onset"]);
    expect([top.status, top.stderr.split("\n")[0]]).toEqual([2, "error: 'pipe.onset' is a FIFO (named pipe), not a regular file: circuit files are read only from regular files"]);
    ws.write("inc-pipe.onset", 'include "pipe.onset"\n');
    expect((await ws.run(["check", "inc-pipe.onset"])).stderr.split("\n")[0]).toBe(
      "inc-pipe.onset:1:9: error: 'pipe.onset' is a FIFO (named pipe), not a regular file: circuit files are read only from regular files",
    );
  });

  test("--include-root lets includes read a folder beside the project", async () => {
    mkdirSync(ws.path("library"));
    mkdirSync(ws.path("proj"));
    writeFileSync(ws.path("library/values.onset"), "param R = 10k\n");
    writeFileSync(ws.path("proj/main.onset"), 'include "../library/values.onset"\nvsource V1 a gnd 1\nresistor R1 a gnd (R)\nbias\n');
    const refused = await ws.run(["check", "proj/main.onset"]);
    expect([refused.status, refused.stderr.split("\n")[0]]).toEqual([2, "proj/main.onset:1:9: error: '../library/values.onset' is outside the folders includes may read (proj)"]);
    const allowed = await ws.run(["check", "proj/main.onset", "--include-root", "library"]);
    expect([allowed.status, allowed.stdout]).toEqual([0, "proj/main.onset: ok (2 parts, analyses: bias)\n"]);
  });

  test("files above the size limit are refused: the file, an include, standard input", async () => {
    const top = await ws.run(["check", "long.onset", "--limit", "source-size=50"]);
    expect([top.status, top.stderr]).toEqual([2, `error: 'long.onset' is ${LONG.length} bytes, above the source-file size limit of 50 bytes\nhint: raise the limit with --limit source-size=10M (API: limits.maxSourceBytes)\n`]);
    ws.write("inc-long.onset", 'include "long.onset"\n');
    expect((await ws.run(["check", "inc-long.onset", "--limit", "source-size=100"])).stderr.split("\n")[0]).toBe(
      `inc-long.onset:1:9: error: 'long.onset' is ${LONG.length} bytes, above the source-file size limit of 100 bytes`,
    );
    const stdin = await ws.run(["check", "-", "--limit", "source-size=1k"], "#".repeat(5000));
    expect([stdin.status, stdin.stderr.split("\n")[0]]).toEqual([2, "error: standard input is more than 1000 bytes, the source-file size limit"]);
  });

  test("include depth and file count are capped, each raisable", async () => {
    for (let k = 0; k < 4; k++) ws.write(`d${k}.onset`, `include "d${k + 1}.onset"\n`);
    ws.write("d4.onset", "param X = 1\n");
    const deep = await ws.run(["check", "d0.onset", "--limit", "include-depth=3"]);
    expect(deep.stderr.split("\n")[0]).toBe("d3.onset:1:9: error: including 'd4.onset' nests includes 4 deep, past the include-depth limit of 3");
    expect((await ws.run(["check", "d0.onset", "--limit", "include-depth=4"])).stderr).not.toContain("error");
    const many = await ws.run(["check", "d0.onset", "--limit", "source-files=2"]);
    expect(many.stderr.split("\n")[0]).toBe("d1.onset:1:9: error: including 'd2.onset' would make 3 source files, past the limit of 2");
    expect(readFileSync(ws.path("d0.onset"), "utf8")).toBe('include "d1.onset"\n');
  });
});

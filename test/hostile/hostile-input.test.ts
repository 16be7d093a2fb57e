import { spawn } from "node:child_process";
import { readFileSync, writeFileSync } from "node:fs";
import { afterAll, describe, expect, test } from "vitest";
import { OnsetError, runStartup, runTransient, type TransientAnalysis } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { MAIN, wien, Workspace } from "../e2e/support/onset.js";

// The hostile-input suite: every row of issue 19's table and every limit, run through the built
// command as a stranger's file would be, under a memory cap (ulimit -v) and a time cap, so a
// regression that brings back unbounded reading, unbounded storage or a stack overflow fails
// here. Each case ends in a result or a positioned error with its code, never an internal error.

/**
 * Virtual memory one command may map (kB): Node itself maps about 1 GB of address space, and
 * each worker thread reserves more, so the studies here run with --jobs 1.
 */
const MEMORY_KB = 1_600_000;
/** Wall time one command may take (ms). */
const TIME_MS = 45_000;

interface Outcome {
  readonly status: number | null;
  readonly stdout: string;
  readonly stderr: string;
  readonly ms: number;
}

const ws = new Workspace();
afterAll(() => ws.remove());

/** Runs the command under the memory cap; a run that passes the time cap is killed (status null). */
function capped(args: readonly string[]): Promise<Outcome> {
  const started = performance.now();
  return new Promise((done, fail) => {
    const quoted = [MAIN, ...args].map((a) => `'${a.replace(/'/g, "'\\''")}'`).join(" ");
    const child = spawn("sh", ["-c", `ulimit -v ${MEMORY_KB} && exec '${process.execPath}' ${quoted}`], { cwd: ws.dir, timeout: TIME_MS, env: { ...process.env, NO_COLOR: "1" } });
    let stdout = "";
    let stderr = "";
    child.stdout.setEncoding("utf8").on("data", (d: string) => (stdout += d));
    child.stderr.setEncoding("utf8").on("data", (d: string) => (stderr += d));
    child.on("error", fail);
    child.on("close", (status) => done({ status, stdout, stderr, ms: performance.now() - started }));
    child.stdin.end();
  });
}

/** The error of a `--json` run: its code and line. */
async function jsonError(file: string, extra: readonly string[] = []): Promise<{ status: number | null; code: string; line: number | null; message: string; hint: string }> {
  const r = await capped(["run", file, "--json", ...extra]);
  const doc = JSON.parse(r.stdout) as { error?: { code: string; line?: number; message: string; hint?: string } };
  if (!doc.error) throw new Error(`no error reported: ${r.stdout.slice(0, 300)}`);
  expect(r.stderr).not.toContain("internal error");
  return { status: r.status, code: doc.error.code, line: doc.error.line ?? null, message: doc.error.message, hint: doc.error.hint ?? "" };
}

const BLOCK = wien("startup probe=o until=auto\n");

describe("the rows of the table", () => {
  test("include of /dev/zero: refused by its kind, never read", async () => {
    ws.write("zero.onset", 'include "/dev/zero"\n');
    const e = await jsonError("zero.onset", ["--include-root", "/dev"]);
    expect([e.status, e.code, e.line]).toEqual([2, "not-a-regular-file", 1]);
  });

  test("include of a system file: outside the readable folders; allowed, its problems are capped at 100 and 'and N more'", async () => {
    ws.write("system.onset", 'include "/etc/passwd"\n');
    expect((await jsonError("system.onset")).code).toBe("include-outside");
    const many = Array.from({ length: 500 }, (_, k) => `user${k}:x:${k}:${k}::/home/u${k}:/bin/sh`).join("\n");
    ws.write("etc-like.txt", many);
    ws.write("allowed.onset", 'include "etc-like.txt"\n');
    const r = await capped(["check", "allowed.onset"]);
    expect(r.status).toBe(2);
    const errors = r.stderr.split("\n").filter((l) => / error: /.test(l));
    expect(errors).toHaveLength(101);
    expect(errors[100]).toMatch(/^etc-like\.txt:\d+:\d+: error: and \d+ more problems in 'etc-like\.txt' \(the first 100 are shown\)$/);
  });

  test("a sweep of 10¹² steps: sweep-limit at steps=, nothing allocated", async () => {
    ws.write("sweep.onset", `${BLOCK}sweep Rf from=15k to=30k steps=1000000000000\n`);
    const e = await jsonError("sweep.onset");
    expect([e.status, e.code, e.line]).toEqual([3, "sweep-limit", 12]);
    expect(e.hint).toContain("--limit sweep-points=N");
  });

  test("tolerance runs=10¹²: runs-limit at runs=", async () => {
    ws.write("runs.onset", `${BLOCK}tolerance runs=1000000000000\n`);
    const e = await jsonError("runs.onset");
    expect([e.status, e.code, e.line]).toEqual([3, "runs-limit", 12]);
  });

  test("sweep × runs above the limit: study-limit", async () => {
    ws.write("window.onset", `${BLOCK}sweep Rf from=15k to=30k steps=5000\ntolerance runs=1000\n`);
    expect((await jsonError("window.onset")).code).toBe("study-limit");
  });

  test("a chain of 3000 blocks each using the next: too-deep, no stack overflow", async () => {
    const lines: string[] = [];
    for (let k = 0; k < 3000; k++) lines.push(`block b${k} (x)`, k < 2999 ? `  use U b${k + 1} x` : "  resistor R x gnd 1k", "end");
    ws.write("chain.onset", [...lines, "vsource V1 a gnd 1", "use X b0 a", "bias", ""].join("\n"));
    const e = await jsonError("chain.onset");
    expect([e.status, e.code, e.line]).toEqual([2, "too-deep", 9002]);
  });

  test("20 000 lines of 'block b (x)' never closed: 100 problems and 'and N more', in time linear in the file", async () => {
    ws.write("unclosed.onset", "block b (x)\n".repeat(20000));
    const r = await capped(["check", "unclosed.onset"]);
    expect(r.status).toBe(2);
    const errors = r.stderr.split("\n").filter((l) => / error: /.test(l));
    expect(errors[0]).toBe("unclosed.onset:1:1: error: block 'b' has no 'end'");
    expect(errors[100]).toBe("unclosed.onset:101:1: error: and 19900 more problems in 'unclosed.onset' (the first 100 are shown)");
    expect(errors).toHaveLength(101);
  });

  test("startup until=1e-9: window-too-short at until= with the minimum", async () => {
    ws.write("short.onset", wien("startup probe=o until=1e-9\n"));
    const e = await jsonError("short.onset");
    expect([e.status, e.code, e.line]).toEqual([2, "window-too-short", 11]);
    expect(e.message).toMatch(/needs at least [\d.]+ s \(3 periods of the predicted \d+ Hz oscillation\)$/);
  });

  test("a pulse delay=1e-311: unrepresentable at delay=", async () => {
    ws.write("tiny.onset", "vsource V1 in gnd wave=pulse low=0 high=1 delay=1e-311 rise=1u width=1m\nresistor R1 in o 1k\ncapacitor C1 o gnd 1u\ntransient until=1m\n");
    const e = await jsonError("tiny.onset");
    expect([e.status, e.code, e.line]).toEqual([2, "unrepresentable", 1]);
  });

  test("transient until=100 max-step=1n: refused up front with the step count it needs", async () => {
    ws.write("long.onset", "vsource V1 in gnd 1\nresistor R1 in o 1k\ncapacitor C1 o gnd 1u\ntransient until=100 max-step=1n\n");
    const e = await jsonError("long.onset");
    expect([e.status, e.code, e.line]).toEqual([3, "step-limit", 4]);
    expect(e.message).toContain("needs at least 100 000 000 000 steps");
  });

  test("a transient of 10⁶ steps keeps its waveforms within the stored-points limit (and finishes under the memory cap)", async () => {
    ws.write("million.onset", "vsource V1 in gnd wave=pulse low=0 high=1 delay=1u rise=1u width=1m\nresistor R1 in o 1k\ncapacitor C1 o gnd 1u\ntransient until=1 max-step=1u\n");
    const r = await capped(["run", "million.onset", "--json", "--limit", "stored-points=30000"]);
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout) as { results: Array<{ time?: number[] }> };
    expect(JSON.stringify(doc.results[0]).length).toBeLessThan(4_000_000);
  });

  test("a diode with series=0 across 1 kV: the result with a warning naming the part, in text and JSON, at the bias point and in the transient", async () => {
    ws.write("diode.onset", "vsource V1 a gnd 1k\ndiode D1 a gnd series=0\nbias\ntransient until=1m\n");
    const text = await capped(["run", "diode.onset"]);
    expect(text.status).toBe(0);
    expect(text.stdout).toMatch(/warning: diode D1 carries [\d.]+e\+\d+ A at the bias point, far outside any physical operating point/);
    expect(text.stdout).toMatch(/warning: diode D1 carries [\d.]+e\+\d+ A at t = \S+ \w?s in the transient, far outside any physical operating point/);
    const json = await capped(["run", "diode.onset", "--json"]);
    const doc = JSON.parse(json.stdout) as { results: Array<{ warnings: Array<{ code: string; part: string }> }> };
    for (const result of doc.results) {
      expect(result.warnings.map((w) => [w.code, w.part])).toEqual([
        ["implausible-operation", "V1"],
        ["implausible-operation", "D1"],
      ]);
    }
    expect(doc.results).toHaveLength(2);
  });

  test("a steady orbit through kiloamperes: its JSON warnings name the part in a field of their own", async () => {
    // 2 kV peak across 1 Ω: a 2 kA peak on the driven orbit (Ohm's law).
    ws.write("kiloamp.onset", "vsource V1 a gnd wave=sine amp=2k freq=1k\nresistor R1 a gnd 1\nresistor R2 a o 1k\ncapacitor C1 o gnd 100n\nsteady probe=o\n");
    const r = await capped(["run", "kiloamp.onset", "--json"]);
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout) as { results: Array<{ warnings: Array<{ code: string; part?: string }> }> };
    expect(doc.results[0]!.warnings.filter((w) => w.code === "implausible-operation").map((w) => w.part)).toEqual(["V1", "R1"]);
  });

  test("onset merge of a results file whose drawn values were edited: refused naming file and line", async () => {
    ws.write("mc.onset", wien("startup probe=o until=auto\ntolerance runs=4\n"));
    for (const shard of ["0/2", "1/2"]) expect((await capped(["run", "mc.onset", "--jobs", "1", "--shard", shard, "--results", `s${shard[0]}.jsonl`])).status).toBe(0);
    const lines = readFileSync(ws.path("s1.jsonl"), "utf8").split("\n");
    const edited = lines.map((l, k) => (k === 2 ? l.replace(/"R1":(\d)/, (_, d: string) => `"R1":${(Number(d) + 1) % 10}`) : l));
    writeFileSync(ws.path("edited.jsonl"), edited.join("\n"));
    const r = await capped(["merge", "s0.jsonl", "edited.jsonl"]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/^error: edited\.jsonl:3: sample 3's drawn R1 = [\d.e+-]+ is not what seed 1 draws for it \([\d.e+-]+\)\n/);
    // A record of another shard, an index out of range and a duplicate are refused too.
    const foreign = [lines[0], lines[1], lines[1]].join("\n") + "\n";
    writeFileSync(ws.path("twice.jsonl"), foreign);
    expect((await capped(["merge", "twice.jsonl"])).stderr).toContain("twice.jsonl:3: sample 2 appears twice in the file (first on line 2)");
    writeFileSync(ws.path("range.jsonl"), [lines[0], lines[1]!.replace(/^\{"index":\d+/, '{"index":99')].join("\n") + "\n");
    expect((await capped(["merge", "range.jsonl"])).stderr).toContain("range.jsonl:2: sample index 99 is not one of the study's 4 runs (0 to 3)");
    expect((await capped(["merge", "s0.jsonl", "s1.jsonl"])).status).toBe(0);
  });

  test("tolerance on a file with no startup analysis: nothing-to-measure before a sample runs", async () => {
    ws.write("nothing.onset", wien("bias\ntolerance runs=20\n"));
    const e = await jsonError("nothing.onset");
    expect([e.status, e.code, e.line]).toEqual([2, "nothing-to-measure", 12]);
  });
});

describe("the rows of the table, continued", () => {
  test("the API given NaN, negatives and wrong shapes: an OnsetError naming the entry and the rule, never a TypeError", () => {
    const circuit = buildCircuit(loadSource("t.onset", "vsource V1 a gnd 1\nresistor R1 a o 1k\ncapacitor C1 o gnd 1u\ntransient until=1m\n")).circuit;
    const transient = circuit.analyses[0] as TransientAnalysis;
    const outcome = (f: () => unknown): string => {
      try {
        f();
        return "no error";
      } catch (e) {
        if (!(e instanceof OnsetError)) throw e;
        return `${e.diagnostic.code}: ${e.diagnostic.message}`;
      }
    };
    const r1 = (change: object) => ({ ...circuit, parts: circuit.parts.map((p) => (p.name === "R1" ? { ...p, ...change } : p)) });
    expect(outcome(() => runTransient(circuit, { ...transient, until: NaN }))).toBe("bad-argument: runTransient: until must be a finite time above 0 s, got NaN");
    expect(outcome(() => runTransient(circuit, { ...transient, maxStep: -1e-6 }))).toBe("bad-argument: runTransient: maxStep must be a finite time above 0 s, got -0.000001");
    expect(outcome(() => runTransient({ ...circuit, parts: "R1" } as never, transient))).toBe('bad-argument: runTransient: circuit.parts must be an array of objects, got "R1"');
    expect(outcome(() => runTransient(r1({ nodes: [1, 2] }) as never, transient))).toBe("bad-argument: runTransient: every part needs a kind, a name and nodes (strings), got an object");
    expect(outcome(() => runTransient(r1({ value: NaN }), transient))).toBe("out-of-range: resistor R1: resistance must be positive and finite, got NaN Ω");
    expect(outcome(() => runTransient(circuit, transient, { limits: { maxSteps: -5 } }))).toBe("bad-limit: limits.maxSteps must be a whole number above 0, got -5");
    expect(outcome(() => runStartup(circuit, transient as never))).toBe('bad-argument: runStartup: analysis must be a startup analysis ({ kind: "startup", … }), got an object');
  });

  test("a 2000-section RC ladder (2002 unknowns): a transient within the time and memory caps; the far end has not moved (diffusion takes about N²·RC = 10 s)", async () => {
    const lines = ["vsource Vs n0 gnd wave=sine amp=1 freq=1k"];
    for (let k = 1; k <= 2000; k++) lines.push(`resistor R${k} n${k - 1} n${k} 1k`, `capacitor C${k} n${k} gnd 10n`);
    lines.push("transient until=2m max-step=10u probes=(n1, n2000)");
    ws.write("ladder.onset", `${lines.join("\n")}\n`);
    const r = await capped(["run", "ladder.onset", "--json"]);
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout) as { results: Array<{ probes: Array<{ name: string; min: number; max: number }> }> };
    const [near, far] = doc.results[0]!.probes;
    expect(near!.max).toBeGreaterThan(0.5);
    expect(near!.max).toBeLessThan(1);
    expect(Math.max(Math.abs(far!.min), Math.abs(far!.max))).toBeLessThan(1e-9);
  });
});

describe("the steady analysis at its edges (issue 15's acceptance)", () => {
  test("steady bandwidth=1e10: THD over harmonics 2 … 1000, within the caps (it grew to 2.3 GB and overflowed the stack)", async () => {
    ws.write("steady-bandwidth.onset", wien("steady probe=o bandwidth=1e10\n"));
    const r = await capped(["run", "steady-bandwidth.onset", "--json"]);
    expect(r.status).toBe(0);
    const [result] = (JSON.parse(r.stdout) as { results: { found: boolean; thdOrders: number[] }[] }).results;
    expect(result!.found).toBe(true);
    expect(result!.thdOrders).toEqual([2, 1000]);
  });

  test("steady max-step=1e-15: step-limit before any work, at the analysis, with the limit to raise (it ran for minutes)", async () => {
    ws.write("steady-step.onset", wien("steady probe=o max-step=1e-15\n"));
    const e = await jsonError("steady-step.onset");
    expect([e.status, e.code, e.line]).toEqual([3, "step-limit", 11]);
    expect(e.message).toMatch(/^the steady state's recorded period of about .* s with max-step=1e-15 s needs at least [\d ]+ steps, more than the step limit of 10 000 000; it was not started$/);
    expect(e.hint).toContain("--limit steps=N");
  });

  test("steady max-step=1e30: the orbit (it 'died out within 2 periods')", async () => {
    ws.write("steady-long-step.onset", wien("steady probe=o max-step=1e30\n"));
    const r = await capped(["run", "steady-long-step.onset", "--json"]);
    expect(r.status).toBe(0);
    expect((JSON.parse(r.stdout) as { results: { found: boolean }[] }).results[0]!.found).toBe(true);
  });

  test("startup max-step=1e6 under until=auto: window-too-short at max-step= (it was an unplaced 'measureStartup: need at least 4 samples')", async () => {
    ws.write("startup-long-step.onset", wien("startup probe=o max-step=1e6\n"));
    const e = await jsonError("startup-long-step.onset");
    expect([e.status, e.code, e.line]).toEqual([2, "window-too-short", 11]);
  });

  test("tolerance runs=10⁶ measure=steady: runs-limit before a sample, raisable", async () => {
    ws.write("steady-runs.onset", wien("steady probe=o\ntolerance runs=1000000 measure=steady\n"));
    const e = await jsonError("steady-runs.onset");
    expect([e.status, e.code, e.line]).toEqual([3, "runs-limit", 12]);
    expect(e.hint).toContain("--limit runs=N");
  });
});

describe("the limits, each raisable", () => {
  test("source-size: a file above the limit is refused by its size", async () => {
    ws.write("big.onset", `# ${"x".repeat(5000)}\n`);
    expect((await jsonError("big.onset", ["--limit", "source-size=1k"])).code).toBe("source-too-large");
  });

  test("use-depth raised lets a deep chain through", async () => {
    const lines: string[] = [];
    for (let k = 0; k < 100; k++) lines.push(`block b${k} (x)`, k < 99 ? `  use U b${k + 1} x` : "  resistor R x gnd 1k", "end");
    ws.write("chain100.onset", [...lines, "vsource V1 a gnd 1", "use X b0 a", "bias", ""].join("\n"));
    expect((await jsonError("chain100.onset")).code).toBe("too-deep");
    expect((await capped(["run", "chain100.onset", "--limit", "use-depth=100"])).status).toBe(0);
  });

  test("diagnostics raised shows more", async () => {
    ws.write("unclosed300.onset", "block b (x)\n".repeat(300));
    const r = await capped(["check", "unclosed300.onset", "--limit", "diagnostics=1000"]);
    expect(r.stderr.split("\n").filter((l) => / error: /.test(l))).toHaveLength(300);
  });

  test("steps: a run that spends its budget stops at it; a too-long run with the limit lifted runs", async () => {
    ws.write("auto.onset", wien("startup probe=o until=auto\n"));
    expect((await jsonError("auto.onset", ["--limit", "steps=200"])).code).toBe("step-limit");
    ws.write("fine.onset", "vsource V1 in gnd 1\nresistor R1 in o 1k\ncapacitor C1 o gnd 1u\ntransient until=10m max-step=100n\n");
    expect((await jsonError("fine.onset", ["--limit", "steps=50k"])).code).toBe("step-limit");
    expect((await capped(["run", "fine.onset", "--limit", "steps=200k"])).status).toBe(0);
  });

  test("runs raised lets a larger study through the up-front check (then the wall-time limit stops it)", async () => {
    ws.write("runs2.onset", `${BLOCK}tolerance runs=200000\n`);
    const e = await jsonError("runs2.onset", ["--jobs", "1", "--limit", "runs=200000", "--time-limit", "1", "--results", "runs2.jsonl"]);
    expect(e.code).toBe("wall-time-limit");
  });

  test("a bad limit is a usage error", async () => {
    const r = await capped(["run", "big.onset", "--limit", "sweep-points=-1"]);
    expect([r.status, r.stderr.split("\n")[0]]).toEqual([2, "error: --limit sweep-points: '-1' is not a whole number above 0"]);
  });
});

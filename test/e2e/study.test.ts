import { execFile } from "node:child_process";
import { lstatSync, readFileSync, symlinkSync, writeFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { mkfifo, readFifo } from "../support/special-files.js";
import { MAIN, Workspace, wien, type Ran } from "./support/onset.js";

const ws = new Workspace();
afterAll(() => ws.remove());

// A tiny study keeps the suite fast: six samples of a short start-up.
const STUDY = wien("startup probe=o until=30m\ntolerance runs=6 seed=11\nspec frequency=1.55k±5% amplitude=10..16 yield>50%\n");

interface Sample {
  index: number;
  drawn: Record<string, number>;
  metrics: { frequency: number; amplitude: number } | null;
  pass: boolean;
}
interface StudyDoc {
  exit: number;
  results: [{ analysis: string; samples: Sample[]; summary: { yield: { value: number; interval: { low: number; high: number } }; percentiles: Record<string, { median: number }> } }];
}

let single: Ran;
beforeAll(async () => {
  ws.write("study.onset", STUDY);
  single = await ws.run(["run", "study.onset", "--json", "--jobs", "1", "--results", "single.jsonl"]);
});

describe("a tolerance study", () => {
  test("reports every sample with its drawn values and metrics, and the yield with its Wilson interval", () => {
    expect(single.status).toBe(0);
    const doc = JSON.parse(single.stdout) as StudyDoc;
    const study = doc.results[0];
    expect(study.analysis).toBe("tolerance");
    expect(study.samples.map((s) => s.index)).toEqual([0, 1, 2, 3, 4, 5]);
    for (const s of study.samples) {
      expect(Object.keys(s.drawn)).toEqual(["R1", "C1", "R2", "C2", "Rf", "Rg"]);
      // ±1 % and ±5 % tolerances: every drawn value stays within its band (normal draws are cut at ±tol).
      expect(Math.abs(s.drawn.R1! / 10e3 - 1)).toBeLessThanOrEqual(0.01);
      expect(Math.abs(s.drawn.C1! / 10e-9 - 1)).toBeLessThanOrEqual(0.05);
      expect(s.metrics).not.toBeNull();
    }
    const y = study.summary.yield;
    expect(y.value).toBe(study.samples.filter((s) => s.pass).length / 6);
    expect(y.interval.low).toBeLessThanOrEqual(y.value);
    expect(y.interval.high).toBeGreaterThanOrEqual(y.value);
  });

  test("the results file holds a header and one line per sample", () => {
    const lines = readFileSync(ws.path("single.jsonl"), "utf8").trimEnd().split("\n");
    expect(lines).toHaveLength(7);
    expect(JSON.parse(lines[0]!)).toMatchObject({ onset: "tolerance-results", file: "study.onset", runs: 6, seed: 11, dist: "normal", shard: null });
  });

  test("one worker and two workers give the same document, byte for byte", async () => {
    const two = await ws.run(["run", "study.onset", "--json", "--jobs", "2", "--results", "two.jsonl"]);
    expect(two.status).toBe(0);
    expect(two.stdout).toBe(single.stdout);
  });

  test("node flags a worker thread refuses (V8's heap and stack sizes, a profiler's) do not stop a study on two workers", async () => {
    const flags = ["--max-old-space-size=2048", "--stack-size=2000", "--max-semi-space-size=16"];
    const run = await new Promise<{ status: number | null; stdout: string; stderr: string }>((done) => {
      execFile(process.execPath, [...flags, MAIN, "run", "study.onset", "--json", "--jobs", "2", "--results", "flags.jsonl"], { cwd: ws.dir }, (error, stdout, stderr) =>
        done({ status: error ? ((error as { code?: number }).code ?? 1) : 0, stdout, stderr }),
      );
    });
    expect(run.stderr).not.toMatch(/ERR_WORKER_INVALID_EXEC_ARGV|\n\s+at /);
    expect(run.status).toBe(0);
    expect(run.stdout).toBe(single.stdout);
  });

  test("shards run as separate concurrent processes, merged, equal the single run byte for byte", async () => {
    const shards = await Promise.all([
      ws.run(["run", "study.onset", "--shard", "0/3", "--jobs", "1", "--json"]),
      ws.run(["run", "study.onset", "--shard", "1/3", "--jobs", "1", "--quiet"]),
      ws.run(["run", "study.onset", "--shard", "env:SHARD_INDEX/3", "--jobs", "1", "--quiet"], undefined, { SHARD_INDEX: "2" }),
    ]);
    for (const s of shards) expect(s.status).toBe(0);
    const partial = JSON.parse(shards[0]!.stdout) as StudyDoc;
    expect(partial.results[0].samples.map((s) => s.index)).toEqual([0, 1]);
    const files = [0, 1, 2].map((k) => `study.shard-${k}-of-3.results.jsonl`);
    const merged = await ws.run(["merge", ...files, "--json"]);
    expect(merged.status).toBe(0);
    expect(merged.stdout).toBe(single.stdout);
    const text = await Promise.all([ws.run(["merge", ...files.reverse()]), ws.run(["run", "study.onset", "--jobs", "1", "--results", "text.jsonl"])]);
    expect(text[0]!.stdout).toBe(text[1]!.stdout);
  });

  test("merging without every shard is an error that names the missing one", async () => {
    const r = await ws.run(["merge", "study.shard-0-of-3.results.jsonl", "study.shard-2-of-3.results.jsonl"]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("shards 1/3 not given");
  });

  test("--resume after an interrupted run (a cut-off last line) runs only the missing samples and reports as one run", async () => {
    const full = readFileSync(ws.path("single.jsonl"), "utf8");
    const lines = full.split("\n");
    // header + three whole samples + half of the fourth, as a kill in mid-write leaves it
    const cut = `${lines.slice(0, 4).join("\n")}\n${lines[4]!.slice(0, 40)}`;
    writeFileSync(ws.path("cut.jsonl"), cut);
    const r = await ws.run(["run", "study.onset", "--json", "--jobs", "1", "--results", "cut.jsonl", "--resume"]);
    expect(r.status).toBe(0);
    // Reported at its place, naming the sample that runs again (line 5 held sample 3).
    expect(r.stderr).toContain("cut.jsonl:5: warning: the last line was cut off (an interrupted run): sample 3 is not counted as done and runs again");
    expect(r.stdout).toBe(single.stdout);
    const after = readFileSync(ws.path("cut.jsonl"), "utf8");
    expect(after.startsWith(`${lines.slice(0, 4).join("\n")}\n`)).toBe(true);
    expect(after.endsWith("\n")).toBe(true);
    // The final file holds every sample once, complete: the same lines as the uninterrupted run's.
    expect(after.trimEnd().split("\n").sort()).toEqual(full.trimEnd().split("\n").sort());
  });

  test("--resume through a symlink resumes the real file and keeps the link", async () => {
    const full = readFileSync(ws.path("single.jsonl"), "utf8");
    writeFileSync(ws.path("real-cut.jsonl"), full.slice(0, full.length - 50));
    symlinkSync("real-cut.jsonl", ws.path("link-cut.jsonl"));
    const r = await ws.run(["run", "study.onset", "--json", "--jobs", "1", "--results", "link-cut.jsonl", "--resume"]);
    expect(r.status).toBe(0);
    expect(r.stderr).toContain("link-cut.jsonl:7: warning: the last line was cut off (an interrupted run): sample 5 is not counted as done and runs again");
    expect(r.stdout).toBe(single.stdout);
    expect(lstatSync(ws.path("link-cut.jsonl")).isSymbolicLink()).toBe(true);
    expect(readFileSync(ws.path("real-cut.jsonl"), "utf8").trimEnd().split("\n").sort()).toEqual(full.trimEnd().split("\n").sort());
  });

  test("merge of a file with a cut-off last line warns with file:line and refuses while that sample is missing", async () => {
    const full = readFileSync(ws.path("single.jsonl"), "utf8");
    writeFileSync(ws.path("merge-cut.jsonl"), full.slice(0, full.length - 50));
    const alone = await ws.run(["merge", "merge-cut.jsonl"]);
    expect(alone.status).toBe(2);
    expect(alone.stderr).toContain("merge-cut.jsonl:7: warning: the last line was cut off (an interrupted run): sample 5 is left out");
    expect(alone.stderr).toContain("error: the results files hold 5 of the study's samples; 1 is missing (a line was cut off at merge-cut.jsonl:7)");
    // With a file that holds the sample whole, the merge is complete and equals the single run.
    const both = await ws.run(["merge", "merge-cut.jsonl", "single.jsonl", "--json"]);
    expect(both.status).toBe(0);
    expect(both.stderr).toContain("merge-cut.jsonl:7: warning");
    expect(both.stdout).toBe(single.stdout);
  });

  test("--results to a FIFO streams the header and each sample to its reader; the FIFO stays", async () => {
    mkfifo(ws.path("results.fifo"));
    const reader = readFifo(ws.path("results.fifo"), ws.path("from-fifo.jsonl"));
    const r = await ws.run(["run", "study.onset", "--json", "--jobs", "1", "--results", "results.fifo"]);
    expect(r.status).toBe(0);
    expect(await reader).toBe(0);
    expect(r.stdout).toBe(single.stdout);
    const lines = readFileSync(ws.path("from-fifo.jsonl"), "utf8").trimEnd().split("\n");
    expect(lines).toHaveLength(7);
    expect(lstatSync(ws.path("results.fifo")).isFIFO()).toBe(true);
    const resume = await ws.run(["run", "study.onset", "--jobs", "1", "--results", "results.fifo", "--resume"]);
    expect(resume.status).toBe(2);
    expect(resume.stderr).toContain("--resume reads the results file back, but --results results.fifo is not a file");
  });

  test("--results - streams the samples on stdout; the text report moves to stderr", async () => {
    const r = await ws.run(["run", "study.onset", "--jobs", "1", "--results", "-"]);
    expect(r.status).toBe(0);
    const lines = r.stdout.trimEnd().split("\n").map((l) => JSON.parse(l) as { onset?: string; index?: number });
    expect(lines[0]!.onset).toBe("tolerance-results");
    expect(lines.slice(1).map((l) => l.index).sort()).toEqual([0, 1, 2, 3, 4, 5]);
    expect(r.stderr).toMatch(/yield \d/);
  });

  test("--resume refuses a results file of another study", async () => {
    const r = await ws.run(["run", "study.onset", "--results", "single.jsonl", "--resume", "--set", "Rf=23k"]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("holds a different study");
  });

  test("the text report lists percentiles, the yield and a command that reproduces a worst sample", async () => {
    const r = await ws.run(["run", "study.onset", "--jobs", "1", "--results", "text.jsonl"]);
    expect(r.stdout).toMatch(/metric +min +p1 +p5 +median +p95 +p99 +max/);
    expect(r.stdout).toMatch(/yield \d+(\.\d+)? % \(\d of 6 pass\), 95 % Wilson interval/);
    expect(r.stdout).toMatch(/reproduce: onset run study\.onset --sample \d/);
  });

  test("--sample I reruns sample I alone with the same drawn values and metrics", async () => {
    const doc = JSON.parse(single.stdout) as StudyDoc;
    const target = doc.results[0].samples[4]!;
    const r = await ws.run(["run", "study.onset", "--sample", "4", "--json"]);
    const rerun = JSON.parse(r.stdout) as { sample: { index: number; drawn: Record<string, number> }; results: { frequency: number; amplitude: number }[] };
    expect(rerun.sample).toEqual({ index: 4, drawn: target.drawn });
    expect(rerun.results[0]!.frequency).toBe(target.metrics!.frequency);
    expect(rerun.results[0]!.amplitude).toBe(target.metrics!.amplitude);
  });
});

describe("per-use draws (param … each)", () => {
  const EACH = `title "Bench Wien oscillator, separate parts"
param R = 10k±1% each
param C = 10n±5% each
resistor  R1 o  s   (R)
capacitor C1 s  p   (C)
resistor  R2 p  gnd (R)
capacitor C2 p  gnd (C)
resistor  Rf o  n   22k
resistor  Rg n  gnd 10k
opamp     U1 p  n   o  preset=general
startup probe=o until=30m
`;

  test("each use draws its own value; --sample I reproduces the sample exactly; the report prints drawn values with units", async () => {
    ws.write("each.onset", `${EACH}tolerance runs=4 seed=5\n`);
    const r = await ws.run(["run", "each.onset", "--json", "--jobs", "1", "--results", "each.jsonl"]);
    expect(r.status).toBe(0);
    const samples = (JSON.parse(r.stdout) as StudyDoc).results[0].samples;
    for (const s of samples) {
      expect(Object.keys(s.drawn)).toEqual(["R@R1", "C@C1", "R@R2", "C@C2"]);
      expect(s.drawn["R@R1"]).not.toBe(s.drawn["R@R2"]);
      expect(Math.abs(s.drawn["C@C2"]! / 10e-9 - 1)).toBeLessThanOrEqual(0.05);
    }
    const rerun = JSON.parse((await ws.run(["run", "each.onset", "--sample", "2", "--json"])).stdout) as { sample: { drawn: Record<string, number> }; results: { frequency: number; thd: number }[] };
    expect(rerun.sample.drawn).toEqual(samples[2]!.drawn);
    expect(rerun.results[0]!.frequency).toBe(samples[2]!.metrics!.frequency);
    const text = await ws.run(["run", "each.onset", "--jobs", "1", "--results", "each-text.jsonl"]);
    expect(text.stdout).toMatch(/drawn R@R1 = \d+(\.\d+)? kΩ, C@C1 = \d+(\.\d+)? nF, R@R2 = \d+(\.\d+)? kΩ, C@C2 = \d+(\.\d+)? nF/);
  });

  test("a shared parameter warns under a study, and its drawn value is printed in the unit of the parts that read it", async () => {
    ws.write("shared.onset", `${EACH.replaceAll(" each", "")}tolerance runs=2 seed=5\n`);
    const r = await ws.run(["run", "shared.onset", "--jobs", "1", "--results", "shared.jsonl"]);
    expect(r.stderr).toContain("warning: parameter R is drawn once per sample and shared by 2 parts (R1, R2)");
    expect(r.stderr).toContain("for separate components write: param R = 10k±1% each");
    // Worst samples list the draws with SI prefixes and units (R = 9.987 kΩ, not R = 9987.2).
    expect(r.stdout).toMatch(/drawn R = \d+(\.\d+)? kΩ, C = \d+(\.\d+)? nF\n/);
  });

  test("a design window sweeping R draws every use of R, and parts written (R)±1%, around the setting", async () => {
    ws.write("each-window.onset", `${EACH}resistor Rx o gnd (R)±1%\nsweep R from=9k to=11k steps=2\ntolerance runs=2 seed=3\n`);
    const r = await ws.run(["run", "each-window.onset", "--json", "--jobs", "1"]);
    const w = (JSON.parse(r.stdout) as { results: [{ points: { value: number; samples: { drawn: Record<string, number> }[] }[] }] }).results[0];
    for (const point of w.points) {
      for (const s of point.samples) {
        expect(Math.abs(s.drawn["R@R1"]! / point.value - 1)).toBeLessThanOrEqual(0.01);
        expect(Math.abs(s.drawn.Rx! / point.value - 1)).toBeLessThanOrEqual(0.01);
      }
    }
    const first = w.points[0]!.samples[1]!;
    const rerun = JSON.parse((await ws.run(["run", "each-window.onset", "--sample", "1", "--set", "R=9000", "--json"])).stdout) as { sample: { drawn: Record<string, number> } };
    expect(rerun.sample.drawn).toEqual(first.drawn);
  });
});

describe("sweeps and the design window", () => {
  test("a sweep of the feedback resistor finds the start threshold near Rf = 2·Rg (gain 3, Barkhausen)", async () => {
    ws.write("sweep.onset", wien("startup probe=o until=30m\nsweep Rf from=18k to=24k steps=3\n"));
    const r = await ws.run(["run", "sweep.onset", "--json", "--csv", "sweep.csv"]);
    expect(r.status).toBe(0);
    const sweep = (JSON.parse(r.stdout) as { results: [{ analysis: string; points: unknown[]; threshold: { value: number; startsAbove: boolean; margin: number } }] }).results[0];
    expect(sweep.analysis).toBe("sweep");
    expect(sweep.points).toHaveLength(3);
    // Wien bridge: the loop gain reaches 1 at an amplifier gain of 3, i.e. Rf = 2·Rg = 20 kΩ
    // (Sedra & Smith); the op-amp's finite gain and bandwidth move it by less than 5 %.
    expect(sweep.threshold.value / 20e3).toBeCloseTo(1, 1);
    expect(sweep.threshold.startsAbove).toBe(true);
    expect(sweep.threshold.margin).toBeGreaterThan(0);
    expect(readFileSync(ws.path("sweep.csv"), "utf8").split("\n")[0]).toBe("Rf,verdict,frequency,amplitude,thd,startupTime,settlingTime,bounceFrequency,dampingRatio,growthRate,offset,rms,peakToPeak,frequencyError,amplitudeError,rmsError,thdError,pass");
  });

  test("the sweep table prints each setting's frequency, amplitude and THD with their error bars", async () => {
    ws.write("sweep-two.onset", wien("startup probe=o until=30m\nsweep Rf from=22k to=23k steps=2\n"));
    const r = await ws.run(["run", "sweep-two.onset", "--no-color"]);
    expect(r.status).toBe(0);
    const rows = r.stdout.split("\n").filter((l) => / 2[23] kΩ +settled/.test(l));
    expect(rows).toHaveLength(2);
    for (const row of rows) expect(row.match(/ ± /g)?.length).toBe(3);
  });

  test("sweep × tolerance gives the yield at each setting and the window that meets it", async () => {
    ws.write("window.onset", wien("startup probe=o until=30m\nsweep Rf from=19k to=23k steps=2\ntolerance runs=3 seed=2\nspec amplitude=10..16 yield>60%\n"));
    const r = await ws.run(["run", "window.onset", "--json", "--jobs", "1"]);
    expect(r.status).toBe(0);
    const w = (JSON.parse(r.stdout) as { results: [{ analysis: string; points: { value: number; pass: boolean; samples: { drawn: Record<string, number> }[] }[]; window: { from: number; to: number } }] }).results[0];
    expect(w.analysis).toBe("window");
    expect(w.points.map((p) => [p.value, p.pass])).toEqual([
      [19e3, false],
      [23e3, true],
    ]);
    expect(w.window).toEqual({ from: 23e3, to: 23e3 });
    // The swept resistor is set, not drawn.
    expect(Object.keys(w.points[0]!.samples[0]!.drawn)).not.toContain("Rf");
  });
});

describe("onset design", () => {
  test("phase-shift --freq 1k reports the simulated settled frequency beside the small-signal poles, in the file and on stderr", async () => {
    const r = await ws.run(["design", "phase-shift", "--freq", "1k", "--output", "ladder.onset"]);
    expect(r.status).toBe(0);
    // The ladder's poles sit about 5 % low (start margin: gain 33 > 29); the file settles within 1 %.
    const line = /design: simulated start-up settles at ([\d.]+) Hz \(([+−])([\d.]+) % from the target\); small-signal poles ([\d.]+) Hz/.exec(r.stderr)!;
    expect(line).not.toBeNull();
    expect(Math.abs(Number(line[1]) / 1000 - 1)).toBeLessThan(0.01);
    expect(Number(line[4]) / 1000 - 1).toBeLessThan(-0.03);
    const file = readFileSync(ws.path("ladder.onset"), "utf8");
    expect(file).toContain(`# simulated start-up of this file: settles at ${line[1]} Hz`);
    const ran = await ws.run(["run", "ladder.onset", "--nominal", "--json"]);
    expect((JSON.parse(ran.stdout) as { results: { frequency: number }[] }).results[0]!.frequency.toFixed(2)).toBe(line[1]);
  });


  test("wien --limit lamp writes a lamp-stabilised bridge that checks clean; --limit on a twin-T or an unknown limit is a usage error", async () => {
    const designed = await ws.run(["design", "wien", "--freq", "1k", "--limit", "lamp", "--output", "lamp.onset"]);
    expect(designed.status).toBe(0);
    expect(readFileSync(ws.path("lamp.onset"), "utf8")).toMatch(/^lamp +L1 +n +gnd +100 /m);
    expect((await ws.run(["check", "lamp.onset"])).status).toBe(0);
    const twinT = await ws.run(["design", "twin-t", "--freq", "1k", "--limit", "lamp"]);
    expect(twinT.status).toBe(2);
    expect(twinT.stderr).toContain("design: --limit lamp is for the Wien bridge");
    const typo = await ws.run(["design", "wien", "--freq", "1k", "--limit", "lmap"]);
    expect(typo.status).toBe(2);
    expect(typo.stderr).toContain("design: unknown amplitude limit 'lmap' (did you mean 'lamp'?)");
  });

  test("writes a circuit file that checks clean", async () => {
    const designed = await ws.run(["design", "wien", "--freq", "1k", "--output", "designed.onset"]);
    expect(designed.status).toBe(0);
    const checked = await ws.run(["check", "designed.onset"]);
    expect(checked.status).toBe(0);
  });
});

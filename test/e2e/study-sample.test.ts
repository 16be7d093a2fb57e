// `onset run FILE --sample I` under `tolerance … measure=steady`: the study's own figures for the
// sample, to the bit (the same nominal orbit, first-order start and single grid), beside a fresh
// full steady analysis with its error bars.
import { readFileSync } from "node:fs";
import { afterAll, describe, expect, test } from "vitest";
import { Workspace, wien } from "./support/onset.js";

const ws = new Workspace();
afterAll(() => ws.remove());

interface Sample {
  readonly index: number;
  readonly drawn: Record<string, number>;
  readonly pass: boolean;
  readonly failures: string[];
  readonly metrics: Record<string, unknown> | null;
}
interface Rerun {
  readonly sample: { index: number; drawn: Record<string, number>; study?: Sample & { measure: string; setting?: { target: string; value: number | null } } };
  readonly results: Array<{ analysis: string; frequency: number; numericalError: { frequency: number } | null }>;
}

/** The study's figures of a rerun, as the study's JSON lists a sample. */
function studyFigures(rerun: Rerun): Sample {
  const { measure: _measure, setting: _setting, ...sample } = rerun.sample.study!;
  return sample;
}

describe("--sample I of a tolerance study measured by the steady state", () => {
  // A start-up criterion makes each sample predict its start-up time too, as the study does.
  const study = wien("steady probe=o\ntolerance runs=4 seed=3 measure=steady\nspec frequency=1.55k±5% startup<50m\n");

  test("gives the study's own figures for the sample bit for bit, on one and two workers, beside the full analysis", async () => {
    ws.write("mc.onset", study);
    const docs = await Promise.all(
      ["1", "2"].map(async (jobs) => {
        const r = await ws.run(["run", "mc.onset", "--json", "--jobs", jobs, "--results", `jobs-${jobs}.jsonl`]);
        expect(r.status).toBe(0);
        return (JSON.parse(r.stdout) as { results: [{ samples: Sample[] }] }).results[0].samples;
      }),
    );
    const [one, two] = docs as [Sample[], Sample[]];
    expect(two).toEqual(one);
    for (const s of one) {
      const jobs = s.index % 2 === 0 ? "1" : "2";
      const rerun = JSON.parse((await ws.run(["run", "mc.onset", "--json", "--jobs", jobs, "--sample", String(s.index)])).stdout) as Rerun;
      expect(rerun.sample.study?.measure).toBe("steady");
      // toEqual on the parsed JSON compares every figure exactly (no tolerance).
      expect(studyFigures(rerun)).toEqual(s);
      expect(s.metrics).not.toBeNull();
      // The fresh full analysis is still there, extrapolated, with its error bars.
      const [steady] = rerun.results;
      expect(steady).toMatchObject({ analysis: "steady" });
      expect(steady!.numericalError).not.toBeNull();
    }
  });

  test("the text report says the figures are the study's, and tells them from the full analysis below", async () => {
    ws.write("text.onset", study);
    const r = await ws.run(["run", "text.onset", "--sample", "1"]);
    expect(r.status).toBe(0);
    expect(r.stdout).toContain("the study's figures for sample #1");
    expect(r.stdout).toContain("exactly as the study measured it");
    expect(r.stdout).toContain("the analyses below are a fresh full run with the drawn values");
    expect(r.stdout.indexOf("the study's figures")).toBeLessThan(r.stdout.indexOf("steady state on o"));
    // The page has them in a section of their own, before the analyses.
    const page = await ws.run(["run", "text.onset", "--sample", "1", "--html", "sample.html"]);
    expect(page.status).toBe(0);
    const html = readFileSync(ws.path("sample.html"), "utf8");
    expect(html).toMatch(/<h2>study sample<\/h2><pre>the study&apos;s figures for sample #1/);
    expect(html.indexOf("<h2>study sample</h2>")).toBeLessThan(html.indexOf("<h2>steady</h2>"));
  });

  test("exits as the study's verdict on the sample: 0 for a passing one, 1 for a failing one (docs/language.md, exit statuses)", async () => {
    // The band splits the samples; the file has no start-up run, so the fresh analysis has no spec of its own to exit by.
    ws.write("verdict.onset", wien("steady probe=o\ntolerance runs=6 seed=3 measure=steady\nspec frequency=1.5k..1.56k\n"));
    const r = await ws.run(["run", "verdict.onset", "--json", "--results", "verdict.jsonl"]);
    const samples = (JSON.parse(r.stdout) as { results: [{ samples: Sample[] }] }).results[0].samples;
    const passing = samples.find((s) => s.pass)!;
    const failing = samples.find((s) => !s.pass)!;
    expect(passing).toBeDefined();
    expect(failing.failures).toEqual(["frequency=1.5k..1.56k"]);
    for (const [s, status] of [[passing, 0], [failing, 1]] as const) {
      const text = await ws.run(["run", "verdict.onset", "--sample", String(s.index)]);
      expect(text.status, text.stderr).toBe(status);
      expect(text.stdout).toContain(`the exit status is the study's verdict on this sample (${s.pass ? "passes: 0" : "fails: 1"})`);
      const json = await ws.run(["run", "verdict.onset", "--json", "--sample", String(s.index)]);
      expect(json.status).toBe(status);
      expect((JSON.parse(json.stdout) as { exit: number }).exit).toBe(status);
    }
  });

  test("without a spec the study judges nothing, and --sample I exits 0 as the study does", async () => {
    ws.write("unjudged.onset", wien("steady probe=o\ntolerance runs=2 seed=3 measure=steady\n"));
    const r = await ws.run(["run", "unjudged.onset", "--sample", "0"]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).not.toContain("the exit status is the study's verdict");
  });

  test("in a design window, --sample I --set at a setting gives the study's figures at that setting", async () => {
    ws.write("window.onset", wien("steady probe=o\nsweep Rg from=9k to=10k steps=2\ntolerance runs=2 seed=5 measure=steady\nspec frequency=1.55k±5%\n"));
    const r = await ws.run(["run", "window.onset", "--json", "--jobs", "1", "--results", "window.jsonl"]);
    const points = (JSON.parse(r.stdout) as { results: [{ points: Array<{ value: number; samples: Sample[] }> }] }).results[0].points;
    expect(points).toHaveLength(2);
    for (const point of points) {
      const sample = point.samples[1]!;
      const rerun = JSON.parse((await ws.run(["run", "window.onset", "--json", "--sample", "1", "--set", `Rg=${point.value}`])).stdout) as Rerun;
      expect(rerun.sample.study?.setting).toEqual({ target: "Rg", value: point.value });
      expect(studyFigures(rerun)).toEqual(sample);
    }
  });

  test("a sweep … measure=steady setting is the file's steady analysis run alone: --nominal --set gives its figures exactly (docs/language.md)", async () => {
    ws.write("sweep.onset", wien("steady probe=o\nsweep Rg from=9k to=10k steps=2 measure=steady\n"));
    const sweep = JSON.parse((await ws.run(["run", "sweep.onset", "--json", "--jobs", "2"])).stdout) as { results: [{ points: Array<{ value: number; results: Array<Record<string, unknown>> }> }] };
    for (const point of sweep.results[0].points) {
      const alone = JSON.parse((await ws.run(["run", "sweep.onset", "--json", "--nominal", "--set", `Rg=${point.value}`])).stdout) as { results: Array<Record<string, unknown>> };
      const [setting] = point.results;
      const [steady] = alone.results;
      for (const key of ["frequency", "amplitude", "thd", "rms", "offset", "numericalError", "multipliers"]) expect(steady![key]).toEqual(setting![key]);
    }
  });

  test("a study measured by start-up runs has no separate study figures: the rerun's start-up run is the study's", async () => {
    ws.write("startup.onset", wien("startup probe=o until=30m\ntolerance runs=2 seed=3\n"));
    const rerun = JSON.parse((await ws.run(["run", "startup.onset", "--json", "--sample", "0"])).stdout) as Rerun;
    expect(rerun.sample.study).toBeUndefined();
  });
});

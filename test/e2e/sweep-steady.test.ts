// Issue 15: `sweep … measure=steady` from the command line — the bridge-excitation source's gain
// trimmer swept with each setting measured by its periodic steady state: the JSON on one and two
// workers, the CSV, the text report's labels and the HTML page.
import { readFileSync } from "node:fs";
import { afterAll, describe, expect, test } from "vitest";
import { Workspace, wien } from "./support/onset.js";

const ws = new Workspace();
afterAll(() => ws.remove());

ws.write("bridge-excitation.onset", readFileSync(new URL("../../examples/bridge-excitation.onset", import.meta.url), "utf8"));
ws.write("trimmer.onset", 'include "bridge-excitation.onset"\nsweep P1.at from=0 to=1 steps=4 measure=steady\n');

interface SteadyJson {
  analysis: string;
  found: boolean;
  explanation: string;
  frequency: number | null;
  amplitude: number | null;
  thd: number | null;
  numericalError: { frequency: number; amplitude: number; thd: number } | null;
  predicted: { startupTime: number | null };
}
interface SweepJson {
  analysis: string;
  measure?: string;
  points: { value: number; results: SteadyJson[]; spec: { on: string } | null }[];
  threshold: { value: number; startsAbove: boolean } | null;
}

describe("onset run with sweep … measure=steady", () => {
  test("the same JSON on one and two workers; each setting holds its steady state, the wiper at end1 no orbit with the reason", async () => {
    const [one, two] = await Promise.all([ws.run(["run", "trimmer.onset", "--json", "--jobs", "1"]), ws.run(["run", "trimmer.onset", "--json", "--jobs", "2"])]);
    expect(one.status).toBe(0);
    expect(two.stdout).toBe(one.stdout);
    const sweep = (JSON.parse(one.stdout) as { results: [SweepJson] }).results[0];
    expect(sweep).toMatchObject({ analysis: "sweep", measure: "steady" });
    expect(sweep.points.map((p) => p.results.map((r) => r.analysis))).toEqual([["steady"], ["steady"], ["steady"], ["steady"]]);
    const [silent, ...rest] = sweep.points.map((p) => p.results[0]!);
    expect(silent).toMatchObject({ found: false, frequency: null, amplitude: null, thd: null, numericalError: null });
    expect(silent!.explanation).toMatch(/^no periodic orbit: the circuit does not oscillate/);
    for (const r of rest) {
      expect(r.found).toBe(true);
      expect(r.numericalError!.frequency).toBeGreaterThan(0);
      expect(r.predicted.startupTime).toBeGreaterThan(0);
    }
    expect(sweep.points[0]!.spec!.on).toBe("the steady state");
    expect(sweep.threshold!.startsAbove).toBe(true);
    expect(sweep.threshold!.value).toBeGreaterThan(0);
    expect(sweep.threshold!.value).toBeLessThan(1 / 3);
  });

  test("the CSV has a row per setting: verdict, orbit, the orbit's figures, the predicted start-up; no figures where there is no orbit", async () => {
    const r = await ws.run(["run", "trimmer.onset", "--csv", "trimmer.csv", "--json"]);
    expect(r.status).toBe(0);
    const sweep = (JSON.parse(r.stdout) as { results: [SweepJson] }).results[0];
    const [header, ...rows] = readFileSync(ws.path("trimmer.csv"), "utf8").trim().split("\n");
    expect(header).toBe("P1.at,verdict,orbit,frequency,amplitude,thd,offset,rms,peakToPeak,predictedStartupTime,predictedGrowthRate,frequencyError,amplitudeError,rmsError,thdError,pass");
    expect(rows).toHaveLength(4);
    const cells = rows.map((row) => row.split(","));
    expect(cells[0]!.slice(0, 6)).toEqual(["0", "decaying", "none", "", "", ""]);
    expect(cells[0]![9]).toBe("");
    cells.slice(1).forEach((c, k) => {
      const s = sweep.points[k + 1]!.results[0]!;
      expect(c.slice(1, 3)).toEqual(["settled", "stable"]);
      expect([Number(c[3]), Number(c[4]), Number(c[5]), Number(c[9])]).toEqual([s.frequency, s.amplitude, s.thd, s.predicted.startupTime]);
    });
  });

  test("the text report and the HTML page say the figures are the periodic steady state's and the start-up time is predicted", async () => {
    const r = await ws.run(["run", "trimmer.onset", "--no-color", "--html", "trimmer.html"]);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/sweep of P1\.at {2}\(0 to 1, 4 settings, periodic steady state\)/);
    expect(r.stdout).toMatch(/orbit +frequency +amplitude +THD +start-up \(predicted\) +growth rate \(poles\)/);
    expect(r.stdout).toMatch(/\n +0 +no orbit /);
    expect(r.stdout).toMatch(/P1\.at = 0: no periodic orbit: the circuit does not oscillate/);
    expect(r.stdout).toMatch(/Hz ± [\d.]+ Hz/);
    expect(r.stdout).toMatch(/start-up times are predicted from the poles and the thermal noise, not simulated/);
    expect(r.stdout).toMatch(/start threshold \(poles\): P1\.at = 0\.28\d* ± /);
    const html = readFileSync(ws.path("trimmer.html"), "utf8");
    expect(html).toContain("(periodic steady state)");
    expect(html).toContain("start-up (predicted)");
    expect(html).toContain("no orbit");
  });

  test("a design window whose sweep alone says measure=steady measures its samples by start-up runs, and says so", async () => {
    ws.write("window.onset", wien("startup probe=o until=30m\nsweep Rf from=22k to=23k steps=2 measure=steady\ntolerance runs=1 seed=2\n"));
    const r = await ws.run(["run", "window.onset", "--results", "window.jsonl"]);
    expect(r.status).toBe(0);
    expect(r.stderr).toContain("the sweep's measure=steady does not apply to a design window: each sample is measured by its start-up run");
  });
});

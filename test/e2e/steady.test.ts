// Issue 15: `steady` from the command line — the JSON contract, the text report, the same orbit
// as the settled start-up run, and a clear answer for a circuit that does not oscillate.
import { readFileSync } from "node:fs";
import { afterAll, describe, expect, test } from "vitest";
import { Workspace, wien } from "./support/onset.js";

const ws = new Workspace();
afterAll(() => ws.remove());

type Result = Record<string, unknown>;

async function results(file: string, text: string, extra: string[] = []): Promise<{ status: number | null; results: Result[]; stdout: string }> {
  ws.write(file, text);
  const r = await ws.run(["run", file, "--json", ...extra]);
  return { status: r.status, results: (JSON.parse(r.stdout) as { results: Result[] }).results, stdout: r.stdout };
}

describe("onset run with steady", () => {
  test("the JSON carries analysis: steady with the figures, multipliers and stability, and agrees with the settled start-up run", async () => {
    const { status, results: [steady, startup] } = await results("osc.onset", wien("steady probe=o\nstartup probe=o until=auto\n"));
    expect(status).toBe(0);
    for (const key of ["frequency", "period", "amplitude", "peakToPeak", "rms", "offset", "thd", "harmonics", "iterations", "multipliers", "multiplierError", "stability", "predicted", "numericalError"]) {
      expect(steady).toHaveProperty(key);
    }
    // One bar per listed multiplier.
    expect((steady!.multiplierError as number[]).length).toBe((steady!.multipliers as unknown[]).length);
    expect(steady).toMatchObject({ analysis: "steady", probe: "o", found: true, kind: "autonomous", from: "startup" });
    expect(steady).not.toHaveProperty("waveform");
    expect(startup).toMatchObject({ analysis: "startup", verdict: "settled" });
    const s = steady as { frequency: number; amplitude: number; thd: number; period: number; stability: { verdict: string; largest: number } };
    const u = startup as { frequency: number; amplitude: number; thd: number };
    // The start-up run settled by itself is the independent route to the same orbit (issue 15's tolerances).
    expect(Math.abs(s.frequency / u.frequency - 1)).toBeLessThan(5e-4);
    expect(Math.abs(s.amplitude / u.amplitude - 1)).toBeLessThan(5e-3);
    expect(Math.abs(s.thd / u.thd - 1)).toBeLessThan(2e-2);
    expect(s.period * s.frequency).toBeCloseTo(1, 12);
    expect(s.stability.verdict).toBe("stable");
    expect(s.stability.largest).toBeLessThan(1);
  });

  test("a Wien bridge below the Barkhausen gain (1 + Rf/Rg = 2.5 < 3): no orbit, the poles' verdict, exit 0", async () => {
    const { status, results: [steady] } = await results("quiet.onset", wien("steady probe=o\n").replace("Rf o  n   22k±1%", "Rf o  n   15k±1%"));
    expect(status).toBe(0);
    expect(steady).toMatchObject({ analysis: "steady", found: false, frequency: null, amplitude: null, multipliers: [], multiplierError: null, stability: null });
    expect(steady!.explanation).toMatch(/^no periodic orbit: the circuit does not oscillate — the poles' dominant pair at .* decays/);
  });

  test("a lamp's temperature as the probe: no THD (its tones are the even harmonics), the warning, and a complex pair of multipliers written once", async () => {
    ws.write(
      "lamp.onset",
      "resistor R1 o s 3.3k\ncapacitor C1 s p 47n\nresistor R2 p gnd 3.3k\ncapacitor C2 p gnd 47n\nresistor Rf o n 680\nlamp L1 n gnd 180 hot=800 rated=6 tau=60m\nopamp U1 p n o preset=general rails=(-15, 15)\nsteady probe=L1.temperature\n",
    );
    const r = await ws.run(["run", "lamp.onset"]);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/THD \(2–\d+\) +—/);
    expect(r.stdout).toMatch(/warning: the probe L1\.temperature carries no tone at the oscillation's frequency/);
    // The slow thermal pair: one entry a ± bj, not the pair twice.
    expect(r.stdout).toMatch(/multipliers +0\.\d+ ± 0\.\d+j \(\|μ\| 0\.\d+ ± 0\.\d+\)\n/);
  });

  test("the text report names the orbit's stability and the predicted start-up time; the CSV holds one period", async () => {
    ws.write("text.onset", wien("steady probe=o\n"));
    const r = await ws.run(["run", "text.onset", "--csv", "one-period.csv"]);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/steady state on o: stable orbit/);
    expect(r.stdout).toMatch(/multipliers +0\.\d+ ± 0\.\d+/);
    expect(r.stdout).toMatch(/start-up time +[\d.]+ ms \(predicted/);
    const csv = readFileSync(ws.path("one-period.csv"), "utf8").trim().split("\n");
    expect(csv[0]).toBe("time (s),o (V)");
    const last = Number(csv[csv.length - 1]!.split(",")[0]);
    const { results: [steady] } = await results("text.onset", wien("steady probe=o\n"));
    // The CSV is the orbit on the finer grid; the reported period is extrapolated from both grids.
    const { period, numericalError } = steady as { period: number; numericalError: { frequency: number } };
    expect(Math.abs(last / period - 1)).toBeLessThan(numericalError.frequency * period + 1e-9);
  });
});

describe("tolerance measure=steady", () => {
  // Six samples; each is also run alone as a steady analysis with the drawn values (--sample N).
  const study = wien("steady probe=o\ntolerance runs=6 seed=11 measure=steady\nspec frequency=1.55k±5% amplitude=10..16\n");

  test("every sample settles on its orbit; the same document on one and two workers; a sample's figures are its own steady run's", async () => {
    ws.write("mc.onset", study);
    const [one, two] = await Promise.all([ws.run(["run", "mc.onset", "--json", "--jobs", "1", "--results", "one.jsonl"]), ws.run(["run", "mc.onset", "--json", "--jobs", "2", "--results", "two.jsonl"])]);
    expect(one.status).toBe(0);
    expect(two.stdout).toBe(one.stdout);
    const doc = JSON.parse(one.stdout) as { results: [{ samples: { index: number; metrics: { verdict: string; frequency: number; amplitude: number; settlingTime: number | null } }[] }] };
    const samples = doc.results[0].samples;
    expect(samples.map((s) => s.metrics.verdict)).toEqual(Array(6).fill("settled"));
    for (const s of samples) expect(s.metrics.settlingTime).toBeNull();
    expect(JSON.parse(readFileSync(ws.path("one.jsonl"), "utf8").split("\n")[0]!)).toMatchObject({ measure: "steady" });
    const alone = await ws.run(["run", "mc.onset", "--json", "--sample", "3"]);
    const [steady] = (JSON.parse(alone.stdout) as { results: Array<{ frequency: number; amplitude: number }> }).results;
    // The study shoots on one grid; the analysis extrapolates two: the same orbit within the grid's error.
    expect(Math.abs(samples[3]!.metrics.frequency / steady!.frequency - 1)).toBeLessThan(5e-4);
    expect(Math.abs(samples[3]!.metrics.amplitude / steady!.amplitude - 1)).toBeLessThan(5e-3);
  });
});

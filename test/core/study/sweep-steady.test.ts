// Issue 15: `sweep … measure=steady` — each setting of the bridge-excitation source's gain
// trimmer measured by its periodic steady state (shooting) instead of a start-up run.
import { readFileSync } from "node:fs";
import { describe, expect, test } from "vitest";
import { analysisOf, isOnsetError, refuseStudy, runPoles, runSweep, runSweepInParallel, type Circuit, type StartupResult, type SteadyResult, type SweepResult } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { DIODE_WIEN_SOURCE } from "../../support/circuits.js";

const BRIDGE = readFileSync(new URL("../../../examples/bridge-excitation.onset", import.meta.url), "utf8");

/** The bridge source (a diode-limited Wien bridge, f₀ = 1/(2π·13.7 kΩ·4.7 nF) ≈ 2.47 kHz) with its trimmer swept. */
const sweepOf = (text: string) => {
  const build = (overrides: Readonly<Record<string, number>> = {}): Circuit => buildCircuit(loadSource("t.onset", text), { overrides }).circuit;
  return { build, sweep: analysisOf(build(), "sweep") };
};

const trimmer = (measure: string) => sweepOf(`${BRIDGE}sweep P1.at from=0 to=1 steps=4 measure=${measure}\n`);
const steadyOf = (r: SweepResult, k: number) => r.points[k]!.run.results[0] as SteadyResult;

describe("sweep … measure=steady", () => {
  const steady = (() => {
    const { build, sweep } = trimmer("steady");
    return runSweep(build, sweep);
  })();

  test("each setting holds its steady state only; the wiper at end1 (gain 1 + 18.6k/10k = 2.86 < 3) has no orbit and says why, the others have figures with error bars", () => {
    expect(steady.measure).toBe("steady");
    expect(steady.points.map((p) => p.run.results.map((r) => r.analysis))).toEqual([["steady"], ["steady"], ["steady"], ["steady"]]);
    const silent = steadyOf(steady, 0);
    expect(silent.found).toBe(false);
    expect([silent.frequency, silent.amplitude, silent.thd, silent.predicted.startupTime]).toEqual([null, null, null, null]);
    expect(silent.explanation).toMatch(/^no periodic orbit: the circuit does not oscillate — the poles' dominant pair at .* decays/);
    for (const k of [1, 2, 3]) {
      const r = steadyOf(steady, k);
      expect(r.found).toBe(true);
      expect(r.numericalError).not.toBeNull();
      expect(r.predicted.startupTime).toBeGreaterThan(0);
    }
    // The spec (frequency 2.5k ± 5 %, THD < 3 %, start-up < 40 ms) is judged on the steady state: no orbit fails it.
    expect(steady.points[0]!.run.spec!.pass).toBe(false);
  });

  test("per setting, frequency / amplitude / THD agree with the start-up runs to 0.05 % / 0.5 % / 2 % (the settled start-up is the independent route to the same orbit)", () => {
    const { build, sweep } = trimmer("startup");
    const startup = runSweep(build, sweep);
    expect(startup.measure).toBe("startup");
    startup.points.forEach((p, k) => {
      const u = p.run.results.find((r): r is StartupResult => r.analysis === "startup")!;
      const s = steadyOf(steady, k);
      expect(s.found).toBe(u.verdict === "settled");
      if (!s.found) return;
      expect(Math.abs(s.frequency! / u.frequency! - 1)).toBeLessThan(5e-4);
      expect(Math.abs(s.amplitude! / u.amplitude! - 1)).toBeLessThan(5e-3);
      expect(Math.abs(s.thd! / u.thd! - 1)).toBeLessThan(2e-2);
    });
  });

  test("the start threshold is bisected on the poles: the dominant pair decays just below it and grows just above it", () => {
    const { build } = trimmer("steady");
    const t = steady.threshold!;
    expect(t.startsAbove).toBe(true);
    const starts = (at: number) => runPoles(build({ "P1.at": at }), { kind: "poles" }).starts;
    expect(starts(t.value - t.precision)).toBe(false);
    expect(starts(t.value + t.precision)).toBe(true);
  });

  test("runSweepInParallel in this thread gives the same result as runSweep", async () => {
    const { build, sweep } = trimmer("steady");
    const parallel = await runSweepInParallel(build, sweep);
    expect(JSON.stringify(parallel.points.map((p) => ({ ...p, run: { ...p.run, results: p.run.results.map((r) => ({ ...r, waveform: null })) } })))).toBe(
      JSON.stringify(steady.points.map((p) => ({ ...p, run: { ...p.run, results: p.run.results.map((r) => ({ ...r, waveform: null })) } }))),
    );
    expect(parallel.threshold).toEqual(steady.threshold);
  });
});

describe("nothing to measure", () => {
  test("a sweep measure=steady with neither a steady nor a startup analysis is nothing-to-measure at the sweep, with a hint", () => {
    const text = `${DIODE_WIEN_SOURCE}poles\nsweep Rf from=15k to=30k steps=3 measure=steady\n`;
    const { build, sweep } = sweepOf(text);
    let thrown: unknown;
    try {
      refuseStudy(build());
    } catch (e) {
      thrown = e;
    }
    expect(isOnsetError(thrown)).toBe(true);
    const d = (thrown as { diagnostic: { code: string; message: string; hint: string; span: { start: number } } }).diagnostic;
    expect([d.code, d.message, d.hint]).toEqual([
      "nothing-to-measure",
      "the sweep of Rf has nothing to measure: the file has no steady or startup analysis",
      "each setting is measured by its steady state: add a line such as: steady probe=o",
    ]);
    expect(d.span.start).toBe(text.indexOf("sweep Rf"));
    // The same file with measure=startup runs its poles at each setting.
    expect(() => refuseStudy(sweepOf(text.replace("measure=steady", "measure=startup")).build())).not.toThrow();
    expect(() => runSweep(build, sweep)).toThrow(/nothing to measure/);
  });
});

import { describe, expect, test } from "vitest";
import { analysisOf, isOnsetError, refuseStudy, RunLimitError, runStartup, runToleranceStudy, sweepValues, type Circuit } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { thrownBy } from "../../support/thrown.js";
import { DIODE_WIEN_SOURCE } from "../../support/circuits.js";

/** A Wien bridge (R = 10 kΩ, C = 10 nF: f₀ = 1/(2πRC) ≈ 1.59 kHz), diode-limited. */
const WIEN = DIODE_WIEN_SOURCE;

const build = (text: string, overrides: Record<string, number> = {}): Circuit => buildCircuit(loadSource("t.onset", text), { overrides }).circuit;
const refusal = (f: () => unknown) => thrownBy(RunLimitError, f);

describe("study sizes are refused before anything is allocated", () => {
  test("a sweep of 10¹² steps is sweep-limit at its steps=, naming the count, the limit and how to raise it", () => {
    const text = `${WIEN}startup probe=o\nsweep Rf from=15k to=30k steps=1000000000000\n`;
    const e = refusal(() => refuseStudy(build(text)));
    expect([e.diagnostic.code, e.limit, e.value, e.reached]).toEqual(["sweep-limit", "maxSweepPoints", 10_000, 1e12]);
    expect(e.message).toBe("the sweep of Rf visits 1000000000000 settings, more than the sweep-points limit of 10 000");
    expect(e.diagnostic.hint).toBe("raise the limit with --limit sweep-points=N (API: limits.maxSweepPoints), or sweep with fewer steps");
    expect(e.diagnostic.span!.start).toBe(text.indexOf("1000000000000"));
    // The listing of settings refuses the same way, without allocating.
    expect(refusal(() => sweepValues(analysisOf(build(text), "sweep"))).limit).toBe("maxSweepPoints");
  });

  test("step= counts too: 1k to 2k in steps of 1 mΩ is 10⁶ settings", () => {
    const e = refusal(() => refuseStudy(build(`${WIEN}startup probe=o\nsweep Rf from=1k to=2k step=1m\n`)));
    expect(e.reached).toBe(1_000_001);
  });

  test("tolerance runs= above the limit is runs-limit at runs=; raising the limit lets it pass", () => {
    const text = `${WIEN}startup probe=o\ntolerance runs=200000\n`;
    const e = refusal(() => refuseStudy(build(text)));
    expect([e.diagnostic.code, e.value, e.reached]).toEqual(["runs-limit", 100_000, 200_000]);
    expect(e.diagnostic.span!.start).toBe(text.indexOf("200000"));
    expect(() => refuseStudy(build(text), { limits: { maxRuns: 200_000 } })).not.toThrow();
  });

  test("settings × runs above the limit is study-limit", () => {
    const e = refusal(() => refuseStudy(build(`${WIEN}startup probe=o\nsweep Rf from=15k to=30k steps=1000\ntolerance runs=2000\n`)));
    expect([e.diagnostic.code, e.value, e.reached]).toEqual(["study-limit", 1_000_000, 2_000_000]);
  });

  test("a tolerance study without a startup analysis is nothing-to-measure, before a sample runs, from refuseStudy and the library's study", async () => {
    const text = `${WIEN}bias\ntolerance runs=20\n`;
    const circuit = build(text);
    let thrown: unknown;
    try {
      refuseStudy(circuit);
    } catch (e) {
      thrown = e;
    }
    expect(isOnsetError(thrown) && [thrown.diagnostic.code, thrown.diagnostic.span?.start]).toEqual(["nothing-to-measure", text.indexOf("tolerance")]);
    let samples = 0;
    const study = runToleranceStudy((o) => build(text, o), circuit.tolerances, analysisOf(circuit, "tolerance"), [], { onSample: () => samples++ });
    await expect(study).rejects.toMatchObject({ diagnostic: { code: "nothing-to-measure" } });
    expect(samples).toBe(0);
  });
});

describe("a start-up window too short for its measurement", () => {
  test("until=1n is refused at until= with the minimum: 3 periods of the predicted frequency", () => {
    const text = `${WIEN}startup probe=o until=1n\n`;
    const circuit = build(text);
    let thrown: unknown;
    try {
      runStartup(circuit, analysisOf(circuit, "startup"));
    } catch (e) {
      thrown = e;
    }
    if (!isOnsetError(thrown)) throw new Error("expected an OnsetError");
    expect(thrown.diagnostic.code).toBe("window-too-short");
    // f₀ ≈ 1/(2π · 10 kΩ · 10 nF) = 1.59 kHz: 3 periods ≈ 1.9 ms (the predicted pole sits near it).
    const m = /^the start-up run until=1e-9 s is too short to measure: it needs at least ([\d.]+) s \(3 periods of the predicted (\d+) Hz oscillation\)$/.exec(thrown.diagnostic.message);
    expect(m).not.toBeNull();
    expect(Number(m![2])).toBeGreaterThan(1500);
    expect(Number(m![2])).toBeLessThan(1700);
    expect(Number(m![1])).toBeCloseTo(3 / Number(m![2]), 5);
    expect(thrown.diagnostic.span!.start).toBe(text.indexOf("1n"));
  });
});

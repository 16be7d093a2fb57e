import { describe, expect, test } from "vitest";
import { designOscillator, E_SERIES, runStartup, snapToSeries, startupAnalysisOf, twinTCrossing, type DesignedFile, type Topology } from "@onset/core";
import { elaborate, parseText, printDesignedFile } from "@onset/netlist-parser";

function elaborated(text: string) {
  const { program, diagnostics } = parseText(text, "design.onset");
  expect(diagnostics).toEqual([]);
  const result = elaborate(program);
  expect(result.diagnostics.filter((d) => d.severity === "error")).toEqual([]);
  return result.circuit!;
}

const inSeries = (v: number, series: keyof typeof E_SERIES) => {
  const mantissa = v / Math.pow(10, Math.floor(Math.log10(v) + 1e-9));
  return E_SERIES[series].some((m) => Math.abs(m - mantissa) < 1e-9);
};

/** The start-up of a designed file as `onset run` gives it: printed, parsed, elaborated, its own startup analysis. */
function simulate(file: DesignedFile) {
  const circuit = elaborated(printDesignedFile(file));
  return runStartup(circuit, startupAnalysisOf(circuit)!);
}

describe.each(["wien", "twin-t", "phase-shift"] as const)("onset design %s --freq 1k with the start-up simulated", (topology) => {
  const d = designOscillator({ topology, frequency: 1000 }, { simulate });

  test("reports the frequency the written file settles at, labelled apart from the small-signal poles", () => {
    const run = simulate(d.file);
    expect(run.verdict).toBe("settled");
    expect(d.simulated).toEqual({ verdict: "settled", frequency: run.frequency, amplitude: run.amplitude, thd: run.thd, startupTime: run.startupTime, error: run.frequency! / 1000 - 1 });
    expect(printDesignedFile(d.file)).toContain(`# simulated start-up of this file: settles at ${run.frequency!.toFixed(2)} Hz (${(d.simulated!.error! * 100).toFixed(2)} % from the target)`);
    expect(printDesignedFile(d.file)).toContain("# small-signal poles of the snapped circuit (the start):");
    // The settled frequency is what the design is judged on: within 1.5 % of the target for all
    // three, where the ladder's poles (with its start margin, gain 33 > 29) sit about 5 % low.
    expect(Math.abs(d.simulated!.error!)).toBeLessThan(0.015);
  });
});

describe("onset design: E-series choices", () => {
  test("Wien at 440 Hz with 33 nF: R ideal 10 961.08 Ω snaps to 12 k / 11 k / 11.0 k in E12 / E24 / E96 (docs/references.md §1)", () => {
    for (const [series, expected] of [["E12", 12e3], ["E24", 11e3], ["E96", 11e3]] as const) {
      const d = designOscillator({ topology: "wien", frequency: 440, capacitor: 33e-9, series });
      const r = d.choices.find((c) => c.part === "R1, R2")!;
      expect(r.ideal).toBeCloseTo(10961.08, 1);
      expect(r.chosen).toBe(expected);
    }
  });

  test("the twin-T crossing Ω(k) solves k(2k+1)Ω⁴ + k(1−2k)Ω² − 1 = 0: Ω(0.45) = 1.027366 (docs/references.md §2.3)", () => {
    expect(twinTCrossing(0.45)).toBeCloseTo(1.027366, 6);
    expect(twinTCrossing(0.47)).toBeCloseTo(1.015825, 6);
    expect(twinTCrossing(0.5)).toBeCloseTo(1, 12);
  });
});

describe.each([
  ["wien", 2500, "E24"],
  ["phase-shift", 1200, "E24"],
  ["twin-t", 440, "E96"],
] as const)("onset design %s --freq %d --series %s", (topology: Topology, frequency: number, series: "E24" | "E96") => {
  const d = designOscillator({ topology, frequency, series });

  test("writes a file that parses and elaborates, with every resistor in the series and snapped log-nearest", () => {
    const circuit = elaborated(printDesignedFile(d.file));
    for (const p of circuit.parts.filter((x) => x.kind === "resistor")) expect(inSeries(p.value!, series)).toBe(true);
    for (const ch of d.choices.filter((x) => x.unit === "Ω")) expect(ch.chosen).toBe(snapToSeries(ch.ideal, series));
    expect(printDesignedFile(d.file)).toContain("startup probe=o until=auto");
    expect(printDesignedFile(d.file)).toMatch(/^tolerance runs=\d+/m);
    expect(printDesignedFile(d.file)).toMatch(/^spec frequency=/m);
  });

  test("the comment block states ideal and snapped values, the predicted frequency and its error", () => {
    expect(printDesignedFile(d.file)).toMatch(/ideal [\d.]+kΩ → [\d.]+kΩ/);
    expect(printDesignedFile(d.file)).toContain(`small-signal poles of the snapped circuit (the start): ${d.predicted.frequency.toFixed(2)} Hz`);
    expect(d.simulated).toBeNull();
    expect(printDesignedFile(d.file)).not.toContain("simulated");
    expect(Math.abs(d.error)).toBeLessThan(topology === "phase-shift" ? 0.08 : 0.03);
  });

  test("the chosen gain starts within the requested time (growth from the poles)", () => {
    expect(d.predicted.growthRate).toBeGreaterThan(0);
    expect(d.startupEstimate).toBeLessThanOrEqual(d.request.startupTime * 1.0001);
  });

  test("the design runs: it settles, near the predicted frequency (the phase-shift ladder's settled gain falls back to 29)", () => {
    const circuit = elaborated(printDesignedFile(d.file));
    const r = runStartup(circuit, startupAnalysisOf(circuit)!);
    expect(r.verdict).toBe("settled");
    // Wien and twin-T: limiting barely moves the frequency; the ladder's frequency depends on its
    // gain, which the limiting lowers from the small-signal value to 29.
    expect(Math.abs(r.frequency! / d.predicted.frequency - 1)).toBeLessThan(topology === "phase-shift" ? 0.08 : 0.01);
    expect(Math.abs(r.frequency! / frequency - 1)).toBeLessThan(0.03);
  });
});

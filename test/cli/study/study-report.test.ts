import { describe, expect, test } from "vitest";
import { studyJson } from "../../../packages/cli/src/json/study.js";
import type { StoredSample, StudyHeader } from "../../../packages/cli/src/study/header.js";
import { reproduceCommand, shellWord } from "../../../packages/cli/src/study/reproduce.js";
import { studyReport, windowReport } from "../../../packages/cli/src/study/study-report.js";

const metrics = (frequency: number) => ({
  verdict: "settled" as const,
  frequency,
  amplitude: 3,
  thd: 0.01,
  startupTime: 0.02,
  settlingTime: 0.021,
  growthRate: 500,
  offset: 0,
  rms: 2.1,
  peakToPeak: 6,
  predictedFrequency: frequency,
  predictedGrowthRate: 510,
});

const base: StudyHeader = {
  onset: "tolerance-results",
  version: 1,
  file: "osc.onset",
  title: "osc",
  hash: "ab",
  overrides: { R: "10k" },
  runs: 4,
  seed: 1,
  dist: "uniform",
  shard: null,
  tolerances: [{ target: "C1", unit: "F", nominal: 1e-8, relative: 0.05 }],
  criteria: [
    { metric: "frequency", test: "within", low: 990, high: 1010, text: "frequency=1k±1%" },
    { metric: "yield", test: "above", limit: 0.7, text: "yield>70%" },
  ],
  sweep: null,
};

function sample(index: number, frequency: number, point?: number): StoredSample {
  const pass = frequency >= 990 && frequency <= 1010;
  return { ...(point === undefined ? {} : { point }), index, drawn: { C1: 1e-8 * (1 + index / 100) }, metrics: metrics(frequency), pass, failures: pass ? [] : ["frequency=1k±1%"] };
}

describe("studyReport(header, samples)", () => {
  test("does not depend on the order samples finished in", () => {
    const samples = [sample(0, 1000), sample(1, 1020), sample(2, 995), sample(3, 1005)];
    const a = JSON.stringify(studyJson(studyReport(base, samples)));
    const b = JSON.stringify(studyJson(studyReport(base, [...samples].reverse())));
    expect(b).toBe(a);
  });

  test("checks the yield criterion: 3 of 4 pass is 75 %, above 70 %", () => {
    const r = studyReport(base, [sample(0, 1000), sample(1, 1020), sample(2, 995), sample(3, 1005)]);
    expect(r.kind === "tolerance" && r.summary.yield.value).toBe(0.75);
    expect(r.spec).toEqual({ pass: true, on: "the yield of 4 samples", criteria: [{ text: "yield>70%", metric: "yield", measured: 0.75, pass: true }] });
    expect(r.missing).toEqual([]);
  });

  test("names the samples a shard still lacks", () => {
    const r = studyReport({ ...base, shard: { index: 1, count: 2 } }, [sample(3, 1000)]);
    expect(r.missing).toEqual([2]);
  });

  test("a design window is the widest run of settings whose yield meets the requirement", () => {
    const header: StudyHeader = { ...base, runs: 2, sweep: { target: "P1.at", unit: "", log: false, values: [0.1, 0.2, 0.3, 0.4, 0.5], required: 0.7 } };
    // settings 0.1 fail, 0.2 pass, 0.3 fail, 0.4 and 0.5 pass: the window is 0.4 … 0.5
    const good = [1, 3, 4];
    const samples = [0, 1, 2, 3, 4].flatMap((k) => [0, 1].map((i) => sample(i, good.includes(k) || k === 1 ? 1000 : 1100, k)));
    const r = windowReport(header, samples);
    expect(r.points.map((p) => p.pass)).toEqual([false, true, false, true, true]);
    expect(r.window).toEqual({ from: 0.4, to: 0.5 });
    expect(r.spec?.pass).toBe(true);
  });
});

describe("reproduceCommand(header, index)", () => {
  test("reruns one sample with the study's overrides, quoting what a shell would split", () => {
    expect(reproduceCommand(base, 17)).toBe("onset run osc.onset --sample 17 --set R=10k");
    expect(reproduceCommand({ ...base, file: "my circuits/osc.onset", overrides: {} }, 3)).toBe("onset run 'my circuits/osc.onset' --sample 3");
    expect(shellWord("it's")).toBe(`'it'\\''s'`);
  });
});

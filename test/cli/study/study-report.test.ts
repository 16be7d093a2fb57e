import { describe, expect, test } from "vitest";
import { studyJson } from "../../../packages/cli/src/json/study.js";
import type { StoredSample, StudyHeader } from "../../../packages/cli/src/study/header.js";
import { reproduceCommand, shellWord } from "../../../packages/cli/src/study/reproduce.js";
import { studyReport, windowReport } from "../../../packages/cli/src/study/study-report.js";
import { specReport } from "../../../packages/cli/src/report/spec.js";
import { paint } from "../../../packages/cli/src/color.js";
import { studyCsv } from "../../../packages/cli/src/csv/study.js";
import { studyText } from "../../../packages/cli/src/report/study.js";
import { wilsonInterval } from "@onset/core";

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
  numericalError: { frequency: 0.02, amplitude: 1e-4, rms: 7e-5, thd: 1e-6 } as { frequency: number; amplitude: number; rms: number; thd: number } | null,
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
    const interval = wilsonInterval(3, 4);
    const row = { metric: "yield", measured: 0.75, unit: "1", passed: 3, runs: 4, interval: { low: interval.low, high: interval.high }, pass: true };
    expect(r.spec).toEqual({ pass: true, on: "the yield of 4 samples", criteria: [{ text: "frequency=1k±1%", ...row }, { text: "yield>70%", ...row, combined: true }] });
    expect(r.missing).toEqual([]);
  });

  test("a spec of three criteria and yield> lists every criterion with its own yield and interval, then the yield of all together", () => {
    const header: StudyHeader = {
      ...base,
      runs: 5,
      criteria: [
        { metric: "frequency", test: "within", low: 990, high: 1010, text: "frequency=1k±1%" },
        { metric: "thd", test: "below", limit: 0.02, text: "thd<2%" },
        { metric: "amplitude", test: "within", low: 2, high: 4, text: "amplitude=2..4" },
        { metric: "yield", test: "above", limit: 0.5, text: "yield>50%" },
      ],
    };
    // Sample 3 is off frequency, sample 4 distorts; 0, 1, 2 meet everything.
    const made = (index: number, frequency: number, thd: number): StoredSample => {
      const m = { ...metrics(frequency), thd };
      const failures = [...(frequency < 990 || frequency > 1010 ? ["frequency=1k±1%"] : []), ...(thd >= 0.02 ? ["thd<2%"] : [])];
      return { index, drawn: { C1: 1e-8 }, metrics: m, pass: failures.length === 0, failures };
    };
    const samples = [made(0, 1000, 0.01), made(1, 1003, 0.01), made(2, 998, 0.015), made(3, 1030, 0.01), made(4, 1001, 0.05)];
    const r = studyReport(header, samples);
    if (r.kind !== "tolerance") throw new Error("tolerance report expected");
    expect(r.summary.criteria.map((c) => [c.criterion.text, c.passed, c.runs])).toEqual([
      ["frequency=1k±1%", 4, 5],
      ["thd<2%", 4, 5],
      ["amplitude=2..4", 5, 5],
    ]);
    expect(r.summary.criteria[0]!.interval).toEqual(wilsonInterval(4, 5));
    expect(r.summary.yield).toEqual({ passed: 3, runs: 5, value: 0.6, interval: wilsonInterval(3, 5) });
    expect(r.spec?.criteria.map((c) => [c.text, c.measured, c.pass, c.combined ?? false])).toEqual([
      ["frequency=1k±1%", 0.8, true, false],
      ["thd<2%", 0.8, true, false],
      ["amplitude=2..4", 1, true, false],
      ["yield>50%", 0.6, true, true],
    ]);
    expect(specReport(r.spec!, paint(false))).toEqual([
      "spec met: 3 of 5 samples settle and meet all 3 criteria (yield 60 %, required: yield>50%)",
      "  criterion                 yield  95 % interval       samples  result",
      "  frequency=1k±1%            80 %  37.55 % to 96.38 %   4 of 5  pass",
      "  thd<2%                     80 %  37.55 % to 96.38 %   4 of 5  pass",
      "  amplitude=2..4            100 %    56.55 % to 100 %   5 of 5  pass",
      "  all together (yield>50%)   60 %  23.07 % to 88.24 %   3 of 5  pass",
    ]);
    const json = studyJson(r) as { summary: { criteria: Array<{ text: string; value: number }> } };
    expect(json.summary.criteria.map((c) => [c.text, c.value])).toEqual([["frequency=1k±1%", 0.8], ["thd<2%", 0.8], ["amplitude=2..4", 1]]);
    const csv = studyCsv(r).split("\n");
    expect(csv[0]!.endsWith(",pass frequency=1k±1%,pass thd<2%,pass amplitude=2..4,pass")).toBe(true);
    expect(csv.slice(1, 6).map((line) => line.split(",").slice(-4).join(""))).toEqual(["1111", "1111", "1111", "0110", "1010"]);
  });

  test("without yield> every sample must meet the spec, and a criterion passes only at 100 %", () => {
    const header: StudyHeader = { ...base, criteria: [base.criteria[0]!] };
    const r = studyReport(header, [sample(0, 1000), sample(1, 1020), sample(2, 995), sample(3, 1005)]);
    expect(r.spec?.criteria.map((c) => [c.text, c.measured, c.pass])).toEqual([
      ["frequency=1k±1%", 0.75, false],
      ["every sample", 0.75, false],
    ]);
    expect(specReport(r.spec!, paint(false))[0]).toBe("spec NOT met: 3 of 4 samples settle and meet the criterion (yield 75 %, required: every sample)");
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

describe("error bars in a study", () => {
  const withBars = (index: number, frequency: number, bar: number) => {
    const s = sample(index, frequency);
    return { ...s, metrics: { ...s.metrics!, numericalError: { frequency: bar, amplitude: bar * 1e-3, rms: bar * 1e-3, thd: bar * 1e-6 } } };
  };
  const samples = [withBars(0, 1000, 0.02), withBars(1, 1005, 0.05), withBars(2, 995, 0.01)];

  test("the summary carries the largest error bar of each figure over the samples", () => {
    const r = studyReport(base, samples);
    expect(r.kind === "tolerance" && r.summary.numericalError).toEqual({ frequency: 0.05, amplitude: 5e-5, rms: 5e-5, thd: 5e-8 });
    const json = studyJson(r) as { summary: { numericalError: unknown }; samples: { metrics: { numericalError: unknown } }[] };
    expect(json.summary.numericalError).toEqual({ frequency: 0.05, amplitude: 5e-5, rms: 5e-5, thd: 5e-8 });
    expect(json.samples[1]!.metrics.numericalError).toEqual({ frequency: 0.05, amplitude: 5e-5, rms: 5e-5, thd: 5e-8 });
  });

  test("samples stored before bars existed (no numericalError) summarise to null, and the table has no error column", () => {
    const old = samples.map((s) => ({ ...s, metrics: { ...s.metrics, numericalError: undefined as unknown as null } }));
    const r = studyReport(base, old);
    expect(r.kind === "tolerance" && r.summary.numericalError).toBeNull();
    expect(studyText(r, paint(false)).join("\n")).not.toContain("numerical error");
  });

  test("the percentile table ends in a numerical-error column", () => {
    const text = studyText(studyReport(base, samples), paint(false));
    const header = text.find((l) => l.includes("median"))!;
    expect(header.trim().endsWith("numerical error")).toBe(true);
    expect(text.find((l) => l.trim().startsWith("frequency"))).toContain("± 50 mHz");
  });

  test("the CSV has one error column per settled figure, in absolute units", () => {
    const [header, first] = studyCsv(studyReport(base, samples)).split("\n");
    const columns = header!.split(",");
    const cells = first!.split(",");
    expect(columns).toEqual(expect.arrayContaining(["frequencyError", "amplitudeError", "rmsError", "thdError"]));
    expect(Number(cells[columns.indexOf("frequencyError")])).toBe(0.02);
    expect(Number(cells[columns.indexOf("thdError")])).toBe(2e-8);
  });
});

describe("studyCsv under measure=steady", () => {
  test("the start-up time's column is named predictedStartupTime (issue 15: labelled as predicted), as a steady sweep's is", () => {
    const [header, first] = studyCsv(studyReport({ ...base, measure: "steady" }, [sample(0, 1000)])).split("\n");
    const columns = header!.split(",");
    expect(columns).not.toContain("startupTime");
    expect(Number(first!.split(",")[columns.indexOf("predictedStartupTime")])).toBe(0.02);
    // A start-up study's column keeps its name: that time was simulated.
    expect(studyCsv(studyReport(base, [sample(0, 1000)])).split("\n")[0]!.split(",")).toContain("startupTime");
  });
});

describe("reproduceCommand(header, index)", () => {
  test("reruns one sample with the study's overrides, quoting what a shell would split", () => {
    expect(reproduceCommand(base, 17)).toBe("onset run osc.onset --sample 17 --set R=10k");
    expect(reproduceCommand({ ...base, file: "my circuits/osc.onset", overrides: {} }, 3)).toBe("onset run 'my circuits/osc.onset' --sample 3");
    expect(shellWord("it's")).toBe(`'it'\\''s'`);
  });
});

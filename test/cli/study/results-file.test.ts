import { lstatSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, test } from "vitest";
import { CliError } from "../../../packages/cli/src/cli-error.js";
import { outputTarget } from "../../../packages/cli/src/output/target.js";
import type { StoredSample, StudyHeader } from "../../../packages/cli/src/study/header.js";
import { cutSample, readResults, ResultsWriter } from "../../../packages/cli/src/study/results-file.js";

const dir = mkdtempSync(join(tmpdir(), "onset-results-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const header: StudyHeader = {
  onset: "tolerance-results",
  version: 1,
  file: "a.onset",
  title: null,
  hash: "00",
  overrides: {},
  runs: 3,
  seed: 1,
  dist: "normal",
  shard: null,
  tolerances: [{ target: "R1", unit: "Ω", nominal: 1e3, relative: 0.01 }],
  criteria: [],
  sweep: null,
};
const writer = (name: string) => new ResultsWriter(outputTarget(name, dir, "--results"), () => {});
const sample = (index: number): StoredSample => ({ index, drawn: { R1: 1e3 + index }, metrics: null, pass: false, failures: ["simulation failed"] });

describe("results files (JSON Lines)", () => {
  test("samples appended one line each read back exactly", () => {
    const path = join(dir, "ok.jsonl");
    const w = writer("ok.jsonl");
    w.start(header, [sample(0)]);
    w.append(sample(2));
    w.close();
    expect(readResults(path)).toEqual({ header, samples: [sample(0), sample(2)], lines: [2, 3], truncated: null });
  });

  test("a results file reached through a symlink is started afresh in the real file; the link stays", () => {
    writeFileSync(join(dir, "real.jsonl"), "stale\n");
    symlinkSync("real.jsonl", join(dir, "link.jsonl"));
    const w = writer("link.jsonl");
    w.start(header, []);
    w.append(sample(1));
    w.close();
    expect(lstatSync(join(dir, "link.jsonl")).isSymbolicLink()).toBe(true);
    expect(readResults(join(dir, "real.jsonl"))).toEqual({ header, samples: [sample(1)], lines: [2], truncated: null });
  });

  test("a cut-off last line is left out and reported with its line number and the sample it held", () => {
    const path = join(dir, "cut.jsonl");
    const whole = `${JSON.stringify(header)}\n${JSON.stringify(sample(0))}\n`;
    writeFileSync(path, `${whole}${JSON.stringify(sample(1)).slice(0, 20)}`);
    expect(readResults(path)).toMatchObject({ samples: [sample(0)], truncated: { line: 3, index: 1, point: null } });
    // A complete JSON line without its newline was still cut: the sample may be incomplete on disk.
    writeFileSync(path, `${whole}${JSON.stringify(sample(1))}`);
    expect(readResults(path)).toMatchObject({ samples: [sample(0)], truncated: { line: 3, index: 1 } });
    // Too little left to tell which sample: "{"index":1" could be the start of 17.
    writeFileSync(path, `${whole}{"index":1`);
    expect(readResults(path).truncated).toEqual({ line: 3, index: null, point: null });
  });

  test("a cut-off line of a design window names its sweep setting too", () => {
    const path = join(dir, "cut-window.jsonl");
    writeFileSync(path, `${JSON.stringify(header)}\n${JSON.stringify({ point: 2, ...sample(4) }).slice(0, 30)}`);
    const cut = readResults(path).truncated!;
    expect(cut).toEqual({ line: 2, index: 4, point: 2 });
    expect(cutSample(cut)).toBe("sample 4 of setting 2");
    expect(cutSample({ line: 2, index: null, point: null })).toBe("the sample on it");
  });

  test("a bad line before the end is an error naming file:line", () => {
    const path = join(dir, "bad.jsonl");
    writeFileSync(path, `${JSON.stringify(header)}\n{oops\n${JSON.stringify(sample(1))}\n`);
    expect(() => readResults(path, "bad.jsonl")).toThrow(CliError);
    expect(() => readResults(path, "bad.jsonl")).toThrow("bad.jsonl:2: the line is not a sample");
  });

  test("a file that is not a results file is refused", () => {
    const path = join(dir, "other.jsonl");
    writeFileSync(path, '{"hello":1}\n');
    expect(() => readResults(path)).toThrow(/is not an onset results file/);
  });

});

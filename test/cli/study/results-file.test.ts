import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, test } from "vitest";
import { writeFileAtomic } from "../../../packages/cli/src/atomic.js";
import { CliError } from "../../../packages/cli/src/cli-error.js";
import type { StoredSample, StudyHeader } from "../../../packages/cli/src/study/header.js";
import { readResults, ResultsWriter } from "../../../packages/cli/src/study/results-file.js";

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
const sample = (index: number): StoredSample => ({ index, drawn: { R1: 1e3 + index }, metrics: null, pass: false, failures: ["simulation failed"] });

describe("results files (JSON Lines)", () => {
  test("samples appended one line each read back exactly", () => {
    const path = join(dir, "ok.jsonl");
    const w = new ResultsWriter(path);
    w.start(header, [sample(0)]);
    w.append(sample(2));
    w.close();
    expect(readResults(path)).toEqual({ header, samples: [sample(0), sample(2)], truncated: false });
  });

  test("a cut-off last line is left out and flagged; a bad line before the end is an error", () => {
    const path = join(dir, "cut.jsonl");
    const whole = `${JSON.stringify(header)}\n${JSON.stringify(sample(0))}\n`;
    writeFileSync(path, `${whole}${JSON.stringify(sample(1)).slice(0, 20)}`);
    expect(readResults(path)).toMatchObject({ samples: [sample(0)], truncated: true });
    // A complete JSON line without its newline was still cut: the sample may be incomplete on disk.
    writeFileSync(path, `${whole}${JSON.stringify(sample(1))}`);
    expect(readResults(path)).toMatchObject({ samples: [sample(0)], truncated: true });
    writeFileSync(path, `${JSON.stringify(header)}\n{oops\n${JSON.stringify(sample(1))}\n`);
    expect(() => readResults(path)).toThrow(CliError);
  });

  test("a file that is not a results file is refused", () => {
    const path = join(dir, "other.jsonl");
    writeFileSync(path, '{"hello":1}\n');
    expect(() => readResults(path)).toThrow(/is not an onset results file/);
  });

  test("atomic writes replace the file whole and leave no temporary file", () => {
    const path = join(dir, "atomic.txt");
    writeFileAtomic(path, "first");
    writeFileAtomic(path, "second");
    expect(readFileSync(path, "utf8")).toBe("second");
    expect(readdirSync(dir).filter((f) => f.endsWith(".tmp"))).toEqual([]);
  });
});

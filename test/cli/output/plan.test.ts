import { mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, test } from "vitest";
import { CliError } from "../../../packages/cli/src/cli-error.js";
import { checkOutputs, documentTargets, refuseInputs } from "../../../packages/cli/src/output/plan.js";
import { outputTarget } from "../../../packages/cli/src/output/target.js";
import { mkfifo } from "../../support/special-files.js";

const dir = mkdtempSync(join(tmpdir(), "onset-plan-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const t = (given: string, label = "--csv") => outputTarget(given, dir, label);

function problem(action: () => unknown): string {
  try {
    action();
  } catch (error) {
    expect(error).toBeInstanceOf(CliError);
    const d = (error as CliError).diagnostics[0]!;
    return `${d.code}: ${d.message} | ${d.hint ?? ""}`;
  }
  throw new Error("no usage error raised");
}

describe("checkOutputs(targets, json)", () => {
  test("standard output takes one document: --json, or one - output", () => {
    expect(problem(() => checkOutputs([t("-"), null], true))).toBe("stdout-taken: --json prints its document on standard output, and so would --csv - | give --csv a file name, or drop --json");
    expect(problem(() => checkOutputs([t("-"), t("/dev/stdout", "--svg")], false))).toBe(
      "stdout-taken: --csv and --svg both write to standard output | standard output takes one document: give one of them a file name",
    );
    expect(() => checkOutputs([t("-"), t("plot.svg", "--svg"), null], false)).not.toThrow();
    expect(() => checkOutputs([t("a.csv"), t("plot.svg", "--svg")], true)).not.toThrow();
  });

  test("two outputs naming one file (also through a link) are refused", () => {
    writeFileSync(join(dir, "same.csv"), "");
    symlinkSync("same.csv", join(dir, "alias.csv"));
    expect(problem(() => checkOutputs([t("same.csv"), t("alias.csv", "--svg")], false))).toBe("same-output: --csv 'same.csv' and --svg 'alias.csv' are the same output | give each output its own file");
  });
});

describe("refuseInputs(targets, inputs, cwd)", () => {
  test("an output that is an input file, by any name, is refused; other outputs pass", () => {
    writeFileSync(join(dir, "circuit.onset"), "bias\n");
    symlinkSync("circuit.onset", join(dir, "circuit-link.csv"));
    expect(problem(() => refuseInputs([t("circuit-link.csv")], ["circuit.onset"], dir))).toBe(
      "output-is-input: --csv 'circuit-link.csv' is the input file 'circuit.onset'; writing it would destroy the input | give the output another name",
    );
    expect(() => refuseInputs([t("fresh.csv"), null], ["circuit.onset"], dir)).not.toThrow();
  });
});

describe("documentTargets(target, count, cwd, what)", () => {
  test("a file name takes several documents as FILE, FILE-2, FILE-3", () => {
    expect(documentTargets(t("out.csv"), 3, dir, "CSV tables").map((x) => x.shown)).toEqual(["out.csv", "out-2.csv", "out-3.csv"]);
    expect(documentTargets(t("out.csv"), 0, dir, "CSV tables")).toEqual([]);
  });

  test("a numbered name is checked too: a folder in its place is refused before any work", () => {
    mkdirSync(join(dir, "plot-2.svg"));
    expect(problem(() => documentTargets(t("plot.svg", "--svg"), 2, dir, "plots"))).toBe("cannot-write: cannot write --svg 'plot-2.svg': it is a folder | give a file name inside it");
  });

  test("a stream takes one document: more is a usage error, one or none pass", () => {
    mkfifo(join(dir, "pipe"));
    expect(problem(() => documentTargets(t("-"), 2, dir, "CSV tables"))).toBe(
      "stream-takes-one: --csv - is standard output, which takes one document, but this run makes 2 CSV tables | give --csv a file name: the documents go to FILE, FILE-2, … (one per analysis)",
    );
    expect(problem(() => documentTargets(t("pipe", "--svg"), 3, dir, "plots"))).toMatch(/^stream-takes-one: --svg pipe is a FIFO, which takes one document, but this run makes 3 plots/);
    expect(documentTargets(t("pipe"), 1, dir, "CSV tables")).toHaveLength(1);
    expect(documentTargets(t("pipe"), 0, dir, "CSV tables")).toHaveLength(1);
  });
});

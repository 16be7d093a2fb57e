import { describe, expect, test } from "vitest";
import { inputError } from "@onset/core";
import { loadProgram, SOURCE_LIMITS, type IncludeResolver } from "@onset/netlist-parser";
import { memoryResolver } from "./support/helpers.js";

/** A chain of files: f0 includes f1, f1 includes f2, … up to f{n}. */
function chain(n: number): Record<string, string> {
  const files: Record<string, string> = {};
  for (let k = 0; k < n; k++) files[`f${k}.onset`] = `include "f${k + 1}.onset"\n`;
  files[`f${n}.onset`] = "param X = 1\n";
  return files;
}

describe("source limits (the defaults are documented in docs/language.md, Limits)", () => {
  test("the defaults", () => {
    expect(SOURCE_LIMITS).toEqual({ maxSourceBytes: 4_000_000, maxIncludeDepth: 16, maxSourceFiles: 100, maxDiagnostics: 100, maxUseDepth: 64, maxParts: 250_000, maxExpressionDepth: 64, maxOperators: 2000, maxParameterDepth: 256 });
  });

  test("includes may nest as deep as the limit, and one more is a positioned include-too-deep at its path", () => {
    const ok = chain(16);
    expect(loadProgram("f0.onset", ok["f0.onset"]!, memoryResolver(ok)).diagnostics).toEqual([]);
    const deep = chain(17);
    const r = loadProgram("f0.onset", deep["f0.onset"]!, memoryResolver(deep));
    expect(r.diagnostics).toEqual([
      {
        severity: "error",
        stage: "input",
        code: "include-too-deep",
        message: "including 'f17.onset' nests includes 17 deep, past the include-depth limit of 16",
        span: { file: "f16.onset", start: 8, end: 19 },
        hint: "raise the limit with --limit include-depth=32 (API: limits.maxIncludeDepth)",
        notes: [`include chain: ${Array.from({ length: 17 }, (_, k) => `f${k}.onset`).join(" → ")} → f17.onset`],
      },
    ]);
    expect(r.sources.size).toBe(17);
    expect(loadProgram("f0.onset", deep["f0.onset"]!, memoryResolver(deep), { maxIncludeDepth: 17 }).diagnostics).toEqual([]);
  });

  test("the number of files is capped (too-many-sources), counting the top file", () => {
    const files: Record<string, string> = { "main.onset": Array.from({ length: 5 }, (_, k) => `include "p${k}.onset"\n`).join("") };
    for (let k = 0; k < 5; k++) files[`p${k}.onset`] = `param P${k} = 1\n`;
    const r = loadProgram("main.onset", files["main.onset"]!, memoryResolver(files), { maxSourceFiles: 4 });
    expect(r.diagnostics.map((d) => [d.code, d.message, d.span?.start, d.hint])).toEqual([
      ["too-many-sources", "including 'p3.onset' would make 5 source files, past the limit of 4", 3 * 19 + 8, "raise the limit with --limit source-files=8 (API: limits.maxSourceFiles)"],
      ["too-many-sources", "including 'p4.onset' would make 5 source files, past the limit of 4", 4 * 19 + 8, "raise the limit with --limit source-files=8 (API: limits.maxSourceFiles)"],
    ]);
    expect([...r.sources.keys()]).toEqual(["main.onset", "p0.onset", "p1.onset", "p2.onset"]);
  });

  test("an included text above the size limit is refused at its include, in UTF-8 bytes", () => {
    // 'Ω' is two bytes in UTF-8: 30 characters, 31 bytes.
    const files = { "m.onset": 'include "big.onset"\n', "big.onset": `# ${"x".repeat(26)}Ω\n` };
    const r = loadProgram("m.onset", files["m.onset"], memoryResolver(files), { maxSourceBytes: 30 });
    expect(r.diagnostics).toEqual([
      {
        severity: "error",
        stage: "input",
        code: "source-too-large",
        message: "'big.onset' is 31 bytes, above the source-file size limit of 30 bytes",
        span: { file: "m.onset", start: 8, end: 19 },
        hint: "raise the limit with --limit source-size=10M (API: limits.maxSourceBytes)",
      },
    ]);
    expect(loadProgram("m.onset", files["m.onset"], memoryResolver(files), { maxSourceBytes: 31 }).diagnostics).toEqual([]);
  });

  test("a top text above the limit is not parsed", () => {
    const r = loadProgram("m.onset", "param X = 1\n".repeat(1000), undefined, { maxSourceBytes: 5000 });
    expect(r.diagnostics.map((d) => [d.code, d.message, d.span])).toEqual([
      ["source-too-large", "'m.onset' is 12 kB (12000 bytes), above the source-file size limit of 5 kB", { file: "m.onset", start: 0, end: 0 }],
    ]);
    expect(r.program.statements).toEqual([]);
  });

  test("the reader is told the size limit, and its refusal keeps its own code and words at the include", () => {
    const asked: number[] = [];
    const reader: IncludeResolver = {
      resolve(_from, path, request) {
        asked.push(request!.maxBytes);
        throw inputError("include-outside", `'${path}' is not for you`, { hint: "ask nicely" });
      },
    };
    const r = loadProgram("m.onset", 'include "/etc/secret"\n', reader, { maxSourceBytes: 1234 });
    expect(asked).toEqual([1234]);
    expect(r.diagnostics).toEqual([
      { severity: "error", stage: "input", code: "include-outside", message: "'/etc/secret' is not for you", hint: "ask nicely", span: { file: "m.onset", start: 8, end: 21 } },
    ]);
  });

  test("limits that are not whole numbers above 0 are bad-limit", () => {
    for (const limits of [{ maxSourceBytes: 0 }, { maxIncludeDepth: -1 }, { maxSourceFiles: 2.5 }, { maxSourceBytes: NaN }]) {
      expect(() => loadProgram("m.onset", "", undefined, limits)).toThrow(expect.objectContaining({ diagnostic: expect.objectContaining({ code: "bad-limit" }) }));
    }
  });
});

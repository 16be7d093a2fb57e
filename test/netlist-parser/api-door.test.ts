import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { designOscillator, OnsetError } from "@onset/core";
import {
  buildCircuit,
  checkProgram,
  decodeNumber,
  elaborate,
  formatProgram,
  formatText,
  lineColumnAt,
  loadProgram,
  loadSource,
  overrideTargets,
  parseQuantity,
  parseText,
  printDesignedFile,
  renderDiagnostic,
  sourceLimits,
  tokenize,
} from "@onset/netlist-parser";
import { displayName, fileReader, readRegularFile, readSource } from "@onset/netlist-parser/node";
import { onlyTypedErrors } from "../support/door.js";
import { thrownBy } from "../support/thrown.js";

// The parser package validates at the door like core (test/core/api-door.test.ts): whatever a
// caller passes (NaN, ±∞, negatives, wrong shapes, huge counts, a source that is not a string,
// a resolver that misbehaves), a public function returns or throws an OnsetError with a code,
// in bounded time: never a TypeError or RangeError from deep inside.

const SOURCE = `resistor R1 a gnd 1k
capacitor C1 a gnd 1u
transient until=1m
`;

/** Values a careless or hostile caller might pass. */
const hostile = fc.oneof(
  fc.constantFrom(NaN, Infinity, -Infinity, -1, 0, 1e308, 2 ** 53, "", "x", SOURCE, "t.onset", null, undefined, true, [], {}, [NaN], { kind: "transient" }, () => 1),
  fc.anything(),
  fc.string(),
  fc.record({ statements: fc.anything(), file: fc.anything(), overrides: fc.anything(), limits: fc.anything(), reader: fc.anything(), color: fc.anything() }, { requiredKeys: [] }),
  fc.record({ maxSourceBytes: fc.double(), maxIncludeDepth: fc.double(), maxDiagnostics: fc.double(), maxParts: fc.double() }, { requiredKeys: [] }),
);

/** A resolver that misbehaves: throws a plain error, returns the wrong shape, a huge text, or is no function at all. */
const badResolver = fc.oneof(
  fc.constantFrom<unknown>(
    { resolve: () => { throw new TypeError("boom"); } },
    { resolve: () => ({ file: 3, text: null }) },
    { resolve: () => "text" },
    { resolve: () => ({ file: "x.onset", text: "x".repeat(5_000_000) }) },
    { resolve: () => ({ file: "x.onset", text: "include \"x.onset\"\n" }) },
    { resolve: 42 },
    () => undefined,
  ),
  hostile,
);

const INCLUDING = `include "part.onset"\n${SOURCE}`;
const PROGRAM = parseText(SOURCE, "t.onset").program;
const LOADED = loadSource("t.onset", SOURCE);
const DESIGNED = designOscillator({ topology: "wien", frequency: 1e3 }).file;
const ERROR = { severity: "error", stage: "input", code: "x", message: "m", span: { file: "t.onset", start: 2, end: 4 } };

const FIELDS = ["header", "title", "parts", "analyses", "spec", "kind", "name", "nodes", "value", "tolerance", "options", "comment"];

/** A designed file with one field (or one part's field) replaced. */
function designedWith(key: unknown, value: unknown): unknown {
  const k = String(key);
  if (k in DESIGNED) return { ...DESIGNED, [k]: value };
  return { ...DESIGNED, parts: [{ ...DESIGNED.parts[0]!, [k.slice(0, 8)]: value }, ...DESIGNED.parts.slice(1)] };
}

const entries: Record<string, (a: unknown, b: unknown, c: unknown) => unknown> = {
  parseText: (a, b) => parseText(a as never, b as never),
  loadProgram: (a, b, c) => loadProgram(a as never, b as never, c as never, {} as never),
  "loadProgram (resolver)": (a, _b, c) => loadProgram("t.onset", INCLUDING, a as never, c as never),
  loadSource: (a, b, c) => loadSource(a as never, b as never, c as never),
  "loadSource (reader)": (a, _b, c) => loadSource("t.onset", INCLUDING, { reader: a as never, limits: c as never }),
  buildCircuit: (a, b) => buildCircuit(a as never, b as never),
  sourceLimits: (a) => sourceLimits(a as never),
  elaborate: (a, b) => elaborate(a as never, b as never),
  overrideTargets: (a) => overrideTargets(a as never),
  checkProgram: (a, b) => checkProgram(a as never, b as never),
  formatText: (a, b) => formatText(a as never, b as never),
  formatProgram: (a) => formatProgram(a as never),
  printDesignedFile: (a) => printDesignedFile(a as never),
  renderDiagnostic: (a, b, c) => renderDiagnostic(a as never, b as never, c as never),
  lineColumnAt: (a, b) => lineColumnAt(a as never, b as never),
  parseQuantity: (a, b, c) => parseQuantity(a as never, b as never, c as never),
  tokenize: (a, b) => tokenize(a as never, b as never),
  decodeNumber: (a) => decodeNumber(a as never),
  // A good first argument and hostile others: the checks look inside options too.
  "elaborate (options)": (a) => elaborate(PROGRAM, a as never),
  "elaborate (overrides)": (a) => elaborate(PROGRAM, { overrides: { R1: a } as never }),
  "checkProgram (options)": (a) => checkProgram(PROGRAM, a as never),
  "buildCircuit (options)": (a) => buildCircuit(LOADED, a as never),
  "buildCircuit (sources)": (a) => buildCircuit({ ...LOADED, sources: a } as never),
  "printDesignedFile (each field)": (a) => {
    for (const field of FIELDS) {
      try {
        printDesignedFile(designedWith(field, a) as never);
      } catch (e) {
        if (!(e instanceof OnsetError)) throw e;
      }
    }
  },
  "renderDiagnostic (sources)": (a) => renderDiagnostic(ERROR as never, a as never),
  "renderDiagnostic (text)": (a, b) => renderDiagnostic({ ...ERROR, span: { file: "t.onset", start: b, end: b } } as never, new Map([["t.onset", a]]) as never),
  "lineColumnAt (offset)": (a) => lineColumnAt(SOURCE, a as never),
  // The Node entry: paths that are not strings, options of the wrong shape (a missing file is `cannot-read`).
  readSource: (a, b) => readSource(typeof a === "string" ? `/nonexistent-onset-door/${a}` : (a as never), b as never),
  fileReader: (a) => fileReader(a as never),
  displayName: (a, b) => displayName(a as never, b as never),
  readRegularFile: (a, b, c) => readRegularFile(typeof a === "string" ? `/nonexistent-onset-door/${a}` : (a as never), b as never, c as never),
};

describe("the parser's public API validates at the door", () => {
  test.each(Object.keys(entries))("%s: hostile arguments give a result or an OnsetError, in bounded time", (name) => {
    const arb = name.endsWith("(resolver)") || name.endsWith("(reader)") ? badResolver : hostile;
    fc.assert(
      fc.property(arb, hostile, hostile, (a, b, c) => {
        onlyTypedErrors(() => entries[name]!(a, b, c));
      }),
      { numRuns: 300 },
    );
  });
});

describe("the door's errors", () => {
  const thrown = (f: () => unknown): OnsetError => thrownBy(OnsetError, f);

  test("parseText(42, file): bad-argument, the message names the function and what it got", () => {
    const e = thrown(() => parseText(42 as never, "t.onset"));
    expect([e.diagnostic.code, e.message]).toEqual(["bad-argument", "parseText: text must be a string, got 42"]);
  });

  test("elaborate of a copied program is refused: the functions behind it trust a tree parseText made", () => {
    const e = thrown(() => elaborate({ ...PROGRAM }));
    expect([e.diagnostic.code, e.message]).toEqual(["bad-argument", "elaborate: program must be one that parseText or loadProgram returned (unchanged), got an object"]);
    expect(elaborate(PROGRAM).circuit?.parts.length).toBe(2);
  });

  test("loadProgram with a resolver that is not one: bad-argument naming it", () => {
    const e = thrown(() => loadProgram("t.onset", INCLUDING, (() => undefined) as never));
    expect(e.message).toBe("loadProgram: resolver must be an include reader ({ resolve(from, path, { maxBytes }) }), got a function");
  });

  test("a resolver that throws a plain error or returns the wrong shape leaves the include missing, placed at its path", () => {
    for (const resolve of [() => { throw new TypeError("boom"); }, () => ({ file: 3, text: null })]) {
      const { diagnostics } = loadProgram("t.onset", INCLUDING, { resolve } as never);
      expect(diagnostics.map((d) => [d.code, d.span?.start])).toEqual([["include-missing", INCLUDING.indexOf('"part')]]);
    }
  });

  test("lineColumnAt with an offset that is not a whole number ≥ 0: bad-argument", () => {
    for (const offset of [NaN, -1, 1.5, Infinity]) expect(thrown(() => lineColumnAt("ab", offset)).diagnostic.code).toBe("bad-argument");
    expect(lineColumnAt("a\nb", 2)).toEqual({ line: 2, column: 1 });
  });
});

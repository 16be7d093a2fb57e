import { describe, expect, test } from "vitest";
import { elaborate, loadProgram, parseText } from "@onset/netlist-parser";
import { memoryResolver } from "./support/helpers.js";

describe("loadProgram(file, text, resolver)", () => {
  const files = {
    "main.onset": 'include "lib/parts.onset"\nuse N1 divider a gnd\nvsource V1 a gnd 5\n',
    "lib/parts.onset": 'include "values.onset"\nblock divider (top, bottom)\n  resistor Ra top mid (R)\n  resistor Rb mid bottom (R)\nend\n',
    "lib/values.onset": "param R = 10k\n",
  };

  test("follows includes relative to the including file and returns every source", () => {
    const r = loadProgram("main.onset", files["main.onset"], memoryResolver(files));
    expect(r.diagnostics).toEqual([]);
    expect([...r.sources.keys()]).toEqual(["main.onset", "lib/parts.onset", "lib/values.onset"]);
    const { circuit } = elaborate(r.program);
    expect(circuit?.parts.map((p) => `${p.name}=${p.value}`)).toEqual(["N1.Ra=10000", "N1.Rb=10000", "V1=5"]);
    expect(circuit?.parts[0]?.span?.file).toBe("lib/parts.onset");
  });

  test("a file included twice counts once (no duplicate definitions)", () => {
    const twice = { ...files, "main.onset": 'include "lib/values.onset"\n' + files["main.onset"] };
    const r = loadProgram("main.onset", twice["main.onset"], memoryResolver(twice));
    expect(r.diagnostics).toEqual([]);
    expect(elaborate(r.program).diagnostics).toEqual([]);
  });

  test("a cycle is a positioned error naming the chain", () => {
    const cyc = { "a.onset": 'include "b.onset"\n', "b.onset": 'param X = 1\ninclude "a.onset"\n' };
    const r = loadProgram("a.onset", cyc["a.onset"], memoryResolver(cyc));
    expect(r.diagnostics).toEqual([
      {
        severity: "error",
        stage: "input",
        code: "include-cycle",
        message: "including 'a.onset' leads back to 'a.onset'",
        span: { file: "b.onset", start: 20, end: 29 },
        hint: "move the shared definitions into a file that both include",
        notes: ["include chain: a.onset → b.onset → a.onset"],
      },
    ]);
  });

  test("a file including itself is a cycle", () => {
    const r = loadProgram("a.onset", 'include "a.onset"\n', memoryResolver({ "a.onset": 'include "a.onset"\n' }));
    expect(r.diagnostics.map((d) => d.message)).toEqual(["including 'a.onset' leads back to this file"]);
  });

  test("a missing file is a positioned error at the path", () => {
    const r = loadProgram("main.onset", 'param X = 1\ninclude "nope.onset"\n', memoryResolver({}));
    expect(r.diagnostics.map((d) => [d.code, d.span])).toEqual([["include-missing", { file: "main.onset", start: 20, end: 32 }]]);
  });

  test("parse errors of included files are reported with their own file", () => {
    const r = loadProgram("m.onset", 'include "x.onset"\n', memoryResolver({ "x.onset": "resistor R1 a 0 1k\n" }));
    expect(r.diagnostics.map((d) => [d.code, d.span?.file])).toEqual([["node-zero", "x.onset"]]);
  });

  test("elaborating a parsed (not loaded) program reports its include as not loaded", () => {
    const { program } = parseText('include "x.onset"\nresistor R a gnd 1k\n', "t.onset");
    expect(elaborate(program).diagnostics.map((d) => `${d.code}: ${d.message}`)).toEqual(["include-missing: included file 'x.onset' was not loaded"]);
  });

  test("a resolver that throws is treated as a missing file", () => {
    const r = loadProgram("m.onset", 'include "x.onset"\n', {
      resolve() {
        throw new Error("disk on fire");
      },
    });
    expect(r.diagnostics.map((d) => d.code)).toEqual(["include-missing"]);
  });
});

import { describe, expect, test } from "vitest";
import { lineColumnAt, parseText, tokenize, type Statement } from "@onset/netlist-parser";
import { shape } from "./support/helpers.js";

function statements(text: string): unknown {
  const r = parseText(text, "t.onset");
  expect(r.diagnostics).toEqual([]);
  return (shape(r.program) as { statements: Statement[] }).statements;
}

describe("tokenize(text, file)", () => {
  test("tokens carry offsets; numbers keep prefix and unit in one token; dotted names are one token", () => {
    const { tokens, comments } = tokenize("pot P1 o N1.m1 gnd 4.7kΩ at=.5 # wiper\n", "t.onset");
    expect(tokens.map((t) => `${t.kind}:${t.text}@${t.start}`)).toEqual([
      "name:pot@0",
      "name:P1@4",
      "name:o@7",
      "name:N1.m1@9",
      "name:gnd@15",
      "number:4.7kΩ@19",
      "name:at@25",
      "equals:=@27",
      "number:.5@28",
      "newline:\n@38",
      "eof:@39",
    ]);
    expect(comments).toEqual([{ start: 31, end: 38, text: "# wiper" }]);
  });

  test("a line end inside ( ) or [ ] does not end the statement", () => {
    const kinds = tokenize("transient probes=(a,\n  b)\nbias\n", "t.onset").tokens.map((t) => t.kind);
    expect(kinds.filter((k) => k === "newline")).toHaveLength(2);
  });

  test("ranges, tolerances, slew units, CRLF and a byte-order mark", () => {
    const { tokens, diagnostics } = tokenize("\uFEFFspec amplitude=3..5 f=1k±2%\r\nslew=0.5V/us\r\n", "t.onset");
    expect(diagnostics).toEqual([]);
    expect(tokens.map((t) => t.text)).toEqual(["spec", "amplitude", "=", "3", "..", "5", "f", "=", "1k", "±", "2%", "\n", "slew", "=", "0.5V/us", "\n", ""]);
  });

  test("a number followed by / and a name stays a division inside an expression", () => {
    expect(tokenize("(10k/R)", "t.onset").tokens.map((t) => t.text)).toEqual(["(", "10k", "/", "R", ")", ""]);
  });

  test("strings decode \\\" and \\\\", () => {
    expect(tokenize('title "a \\"b\\" \\\\ c"', "t.onset").tokens[1]!.value).toBe('a "b" \\ c');
  });
});

describe("parseText(text, file)", () => {
  test("a part line: kind, name, pins by the kind's schema, value with tolerance, options", () => {
    expect(statements("resistor Ra o m1 (R)+-1% \n")).toEqual([
      {
        kind: "part",
        partKind: "resistor",
        name: "Ra",
        pins: [{ name: "o" }, { name: "m1" }],
        value: {
          kind: "paren",
          negative: false,
          items: [{ kind: "name", name: "R" }],
          tolerance: { ascii: true, value: { kind: "number", literal: { text: "1%", mantissa: "1", unit: "%", symbol: "1", form: "percent", value: 0.01 } } },
        },
        options: [],
      },
    ]);
  });

  test("a negative value and a source without a value", () => {
    expect(statements("vsource V1 a gnd -12\nvsource V2 b gnd wave=sine amp=1 freq=1k\n")).toMatchObject([
      { kind: "part", value: { kind: "number", negative: true, literal: { value: 12 } } },
      { kind: "part", options: [{ key: "wave", value: { kind: "word", name: "sine" } }, { key: "amp" }, { key: "freq" }] },
    ]);
  });

  test("expressions: precedence, unary minus, calls, groups and lists", () => {
    expect(statements("param x = (-a^2 + f(1, b)*(c - d))\n")).toMatchObject([
      {
        value: {
          items: [
            {
              kind: "binary",
              op: "+",
              left: { kind: "unary", operand: { kind: "binary", op: "^", left: { name: "a" }, right: { literal: { value: 2 } } } },
              right: {
                kind: "binary",
                op: "*",
                left: { kind: "call", callee: { name: "f" }, args: [{ literal: { value: 1 } }, { name: "b" }] },
                right: { kind: "group", items: [{ kind: "binary", op: "-" }] },
              },
            },
          ],
        },
      },
    ]);
  });

  test("probe lists keep a difference's own parentheses", () => {
    expect(statements("transient until=1m probes=(a, (o, ref), R1.i)\n")).toMatchObject([
      {
        kind: "analysis",
        analysis: "transient",
        args: [
          { kind: "option", key: "until" },
          { kind: "option", key: "probes", value: { kind: "paren", items: [{ name: "a" }, { kind: "group", items: [{ name: "o" }, { name: "ref" }] }, { name: "R1.i" }] } },
        ],
      },
    ]);
  });

  test("option keys may contain dashes; sweep takes a target and the log flag", () => {
    expect(statements("startup probe=o max-step=1u\nsweep P1.at from=0.1 to=0.9 steps=5 log\n")).toMatchObject([
      { analysis: "startup", args: [{ key: "probe" }, { key: "max-step" }] },
      { analysis: "sweep", target: { name: "P1.at" }, args: [{ key: "from" }, { key: "to" }, { key: "steps" }, { kind: "flag", name: "log" }] },
    ]);
  });

  test("spec criteria: =, <, >, ranges and bands", () => {
    expect(statements("spec frequency=1k±2% thd<0.5% amplitude=3..5 yield>99%\n")).toMatchObject([
      {
        kind: "spec",
        criteria: [
          { metric: "frequency", op: "=", value: { tolerance: { ascii: false } } },
          { metric: "thd", op: "<" },
          { metric: "amplitude", op: "=", value: { literal: { value: 3 } }, high: { literal: { value: 5 } } },
          { metric: "yield", op: ">" },
        ],
      },
    ]);
  });

  test("points: rows of whitespace-separated items, signs allowed", () => {
    expect(statements("vsource V a gnd wave=steps points=[0 -1, 1m (2*x)]\n")).toMatchObject([
      { options: [{}, { key: "points", value: { kind: "points", rows: [[{ kind: "number" }, { kind: "unary" }], [{ kind: "number" }, { kind: "group" }]] } }] },
    ]);
  });

  test("blocks hold their body, ports and default or required parameters", () => {
    expect(statements("block b (x, y) R=1k C\n  resistor Ra x y (R)\n  use I c x\nend\n")).toMatchObject([
      {
        kind: "block",
        name: "b",
        ports: [{ name: "x" }, { name: "y" }],
        params: [{ name: "R", value: { literal: { value: 1000 } } }, { name: "C" }],
        body: [{ kind: "part" }, { kind: "use", name: "I", block: "c", nodes: [{ name: "x" }] }],
      },
    ]);
  });

  test("statement spans cover the statement; the renderer's positions come from lineColumnAt", () => {
    const text = "param R = 1k\n  resistor  Ra a gnd (R)  # c\n";
    const s = parseText(text, "t.onset").program.statements[1]!;
    expect(text.slice(s.span.start, s.span.end)).toBe("resistor  Ra a gnd (R)");
    expect(lineColumnAt(text, s.span.start)).toEqual({ line: 2, column: 3 });
  });
});

describe("lineColumnAt(text, offset)", () => {
  test("is 1-based and counts code points", () => {
    expect(lineColumnAt("ab\ncd", 0)).toEqual({ line: 1, column: 1 });
    expect(lineColumnAt("ab\ncd", 4)).toEqual({ line: 2, column: 2 });
    expect(lineColumnAt("😀x", 2)).toEqual({ line: 1, column: 2 });
    expect(lineColumnAt("µΩ x", 3)).toEqual({ line: 1, column: 4 });
    expect(lineColumnAt("abc", 99)).toEqual({ line: 1, column: 4 });
  });
});

import { describe, expect, test } from "vitest";
import { checkProgram, elaborate, formatText, loadProgram, parseText } from "@onset/netlist-parser";

// Inputs built to exhaust recursion are reported as `too-deep` instead of overflowing the stack.

describe("limits", () => {
  test("a very long operator chain is reported, not evaluated recursively", () => {
    const r = parseText(`resistor R1 a gnd (${Array.from({ length: 5000 }, () => "1").join("+")})\n`, "t.onset");
    expect(r.diagnostics.map((d) => d.code)).toEqual(["too-deep"]);
  });

  test("a long but reasonable sum is fine", () => {
    const { program } = parseText(`resistor R1 a gnd (${Array.from({ length: 1000 }, () => "1").join("+")})\nresistor R2 a gnd 1k\n`, "t.onset");
    expect(elaborate(program).circuit?.parts[0]?.value).toBe(1000);
    expect(formatText(`param x = (${Array.from({ length: 1000 }, () => "1").join("*")})\n`).text).toMatch(/^param x = \(1\*1/);
  });

  test("deep bracket nesting is reported", () => {
    expect(parseText(`param x = ${"(".repeat(10000)}1${")".repeat(10000)}\n`, "t.onset").diagnostics[0]?.code).toBe("too-deep");
  });

  test("a chain of thousands of parameters is reported, not recursed", () => {
    // Written last-first, so evaluating the first line walks the whole chain.
    const lines = [...Array.from({ length: 3000 }, (_, i) => `param p${3000 - i} = (p${2999 - i})`), "param p0 = 1", "resistor R1 a gnd (p3000)", "resistor R2 a gnd 1k"];
    const { program } = parseText(`${lines.join("\n")}\n`, "t.onset");
    expect(checkProgram(program).some((d) => d.code === "too-deep")).toBe(true);
  });

  test("each nesting limit can be raised; raised past what the stack holds, the statement is still a positioned too-deep, never a crash", () => {
    const brackets = (n: number) => `resistor R1 a gnd ${"(".repeat(n)}1k${")".repeat(n)}\nresistor R2 a gnd 1k\n`;
    expect(parseText(brackets(100), "t.onset").diagnostics.map((d) => d.message)).toEqual(["brackets nest deeper than 64 levels, past the expression-depth limit"]);
    expect(parseText(brackets(100), "t.onset", { maxExpressionDepth: 200 }).diagnostics).toEqual([]);
    const sum = (n: number) => `resistor R1 a gnd (${Array.from({ length: n }, () => "1").join("+")})\nresistor R2 a gnd 1k\n`;
    const loaded = loadProgram("t.onset", sum(5000), undefined, { maxOperators: 10_000 });
    expect(loaded.diagnostics).toEqual([]);
    // Mathematics: 5000 ones add to 5000.
    expect(elaborate(loaded.program).circuit?.parts[0]?.value).toBe(5000);
    const chain = (n: number) => [...Array.from({ length: n }, (_, i) => `param p${n - i} = (p${n - 1 - i})`), "param p0 = 1", `resistor R1 a gnd (p${n})`, "resistor R2 a gnd 1k", ""].join("\n");
    const raised = loadProgram("t.onset", chain(400), undefined, { maxParameterDepth: 500 });
    expect(elaborate(raised.program).circuit?.parts[0]?.value).toBe(1);
    // Raised without bound: the stack runs out first, and that is reported at the statement.
    const huge = 1_000_000;
    const deep = parseText(`${brackets(200_000)}`, "t.onset", { maxExpressionDepth: huge });
    expect(deep.diagnostics.map((d) => [d.code, d.message, d.span?.start])).toEqual([["too-deep", "the statement nests too deep to parse within this machine's stack", 0]]);
    const long = loadProgram("t.onset", sum(200_000), undefined, { maxOperators: huge });
    const evaluated = elaborate(long.program).diagnostics.filter((d) => d.severity === "error");
    expect(evaluated.map((d) => [d.code, d.message])).toEqual([["too-deep", "the expression is too deep to evaluate within this machine's stack"]]);
    const params = elaborate(loadProgram("t.onset", chain(50_000), undefined, { maxParameterDepth: huge }).program).diagnostics.filter((d) => d.severity === "error");
    expect(params.length).toBeGreaterThan(0);
    expect(params.every((d) => d.code === "too-deep" && d.span !== undefined)).toBe(true);
  });
});

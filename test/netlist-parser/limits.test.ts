import { describe, expect, test } from "vitest";
import { checkProgram, elaborate, formatText, parseText } from "@onset/netlist-parser";

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
});

import { describe, expect, test } from "vitest";
import { checkProgram, elaborate, loadProgram, parseText } from "@onset/netlist-parser";

/** A chain of n blocks, each using the next; the last holds one resistor. */
function useChain(n: number): string {
  const lines: string[] = [];
  for (let k = 0; k < n; k++) lines.push(`block b${k} (x)`, k < n - 1 ? `  use U b${k + 1} x` : "  resistor R x gnd 1k", "end");
  return [...lines, "vsource V1 a gnd 1", "use X b0 a", "bias", ""].join("\n");
}

/** n levels of blocks, each using the next twice: 2ⁿ copies of the last level's resistor. */
function doubling(n: number): string {
  const lines: string[] = [];
  for (let k = 0; k < n; k++) lines.push(`block b${k} (x)`, ...(k < n - 1 ? [`  use U b${k + 1} x`, `  use W b${k + 1} x`] : ["  resistor R x gnd 1k"]), "end");
  return [...lines, "vsource V1 a gnd 1", "use X b0 a", "bias", ""].join("\n");
}

const errorsOf = (text: string, limits = {}) => {
  const loaded = loadProgram("t.onset", text, undefined, limits);
  return elaborate(loaded.program).diagnostics.filter((d) => d.severity === "error");
};

describe("use-line nesting (checked without recursion)", () => {
  test("a chain of 3000 blocks is too-deep at the top-level use, naming the limit, the chain and how to raise it", () => {
    const text = useChain(3000);
    const [d, ...rest] = errorsOf(text);
    expect(rest).toEqual([]);
    expect([d!.code, d!.message, d!.hint]).toEqual([
      "too-deep",
      "instance X nests use lines more than 64 deep, past the use-depth limit",
      "raise the limit with --limit use-depth=128 (API: limits.maxUseDepth)",
    ]);
    expect(d!.span).toEqual({ file: "t.onset", start: text.indexOf("b0 a"), end: text.indexOf("b0 a") + 2 });
    expect(d!.notes![0]).toMatch(/^uses: b0 → b1 → .* → b64$/);
  });

  test("a chain as deep as the limit elaborates; the limit given to loadProgram stays with the program", () => {
    expect(errorsOf(useChain(64))).toEqual([]);
    expect(errorsOf(useChain(65)).map((d) => d.code)).toEqual(["too-deep"]);
    expect(errorsOf(useChain(200), { maxUseDepth: 200 })).toEqual([]);
  });

  test("a block used twice at each of 40 levels (2⁴⁰ copies) is too-many-parts before anything is flattened", () => {
    const [d] = errorsOf(doubling(40));
    expect([d!.code, d!.message]).toEqual(["too-many-parts", "with instance X the circuit holds more than 250000 parts and instances, past the parts limit"]);
    expect(errorsOf(doubling(8))).toEqual([]);
  });

  test("a cycle of blocks is still block-cycle", () => {
    const text = "block a (x)\n  use U b x\nend\nblock b (x)\n  use V a x\nend\nuse X a n\nbias\n";
    expect(errorsOf(text).map((d) => d.code)).toEqual(["block-cycle"]);
  });
});

describe("diagnostics per file", () => {
  const text = "block b (x)\n".repeat(20000);

  test("20 000 unclosed blocks give the first 100 problems and one 'and N more', at the first left out", () => {
    const { diagnostics } = loadProgram("t.onset", text);
    expect(diagnostics).toHaveLength(101);
    const more = diagnostics[100]!;
    expect([more.code, more.severity, more.message]).toEqual(["more-problems", "error", "and 19900 more problems in 't.onset' (the first 100 are shown)"]);
    expect(more.hint).toBe("fix these and check again, or see more: raise the limit with --limit diagnostics=1000 (API: limits.maxDiagnostics)");
    expect(more.span!.start).toBe(text.indexOf("block", 100 * 12));
  });

  test("the limit can be raised; parsing stays linear in the file (every problem is still found)", () => {
    expect(loadProgram("t.onset", text, undefined, { maxDiagnostics: 50_000 }).diagnostics).toHaveLength(20000);
    expect(parseText(text, "t.onset").diagnostics).toHaveLength(20000);
  });

  test("checkProgram caps too", () => {
    const dupes = Array.from({ length: 300 }, () => "resistor R1 a gnd 1k").join("\n") + "\nbias\n";
    const d = checkProgram(loadProgram("t.onset", dupes).program);
    expect(d.filter((x) => x.code === "duplicate-name")).toHaveLength(100);
    expect(d.find((x) => x.code === "more-problems")?.message).toBe("and 199 more problems in 't.onset' (the first 100 are shown)");
  });
});

describe("values too small or too large to compute with", () => {
  test.each([
    ["delay=1e-311", "delay= of vsource V1 is 1e-311 s, too small to compute with (nonzero values lie between 1e-300 and 1e300 in size)"],
    ["delay=1e301", "delay= of vsource V1 is 1e+301 s, too large to compute with (nonzero values lie between 1e-300 and 1e300 in size)"],
  ])("%s is refused at its option", (option, message) => {
    const text = `vsource V1 in gnd wave=pulse low=0 high=1 ${option} rise=1u width=1m\nresistor R1 in gnd 1k\ntransient until=1m\n`;
    const [d] = errorsOf(text);
    expect([d!.code, d!.message]).toEqual(["unrepresentable", message]);
    expect(d!.span!.start).toBe(text.indexOf(option.split("=")[1]!));
  });

  test("zero stays allowed", () => {
    expect(errorsOf("vsource V1 in gnd wave=pulse low=0 high=1 delay=0 rise=1u width=1m\nresistor R1 in gnd 1k\ntransient until=1m\n")).toEqual([]);
  });
});

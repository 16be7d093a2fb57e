import { describe, expect, test } from "vitest";
import { elaborate, parseText } from "@onset/netlist-parser";

const net = "resistor R1 o gnd 1k\ncapacitor C1 o gnd 1u\n";

function elaborated(line: string, overrides: Record<string, string | number> = {}) {
  const { program, diagnostics } = parseText(`${net}${line}\n`, "t.onset");
  expect(diagnostics).toEqual([]);
  return elaborate(program, { overrides });
}

describe("the steady statement", () => {
  test("steady probe=o from=poles cycles=8 harmonics=10 accuracy=1e-5 elaborates to its SteadyAnalysis", () => {
    const r = elaborated("steady probe=o from=poles cycles=8 harmonics=10 accuracy=1e-5 max-step=1u");
    expect(r.diagnostics).toEqual([]);
    expect(r.circuit!.analyses[0]).toMatchObject({ kind: "steady", probe: { kind: "node", node: "o" }, from: "poles", cycles: 8, harmonics: 10, accuracy: 1e-5, maxStep: 1e-6 });
  });

  test("from= defaults to startup; --set steady.cycles=12 reaches the option", () => {
    const r = elaborated("steady probe=o", { "steady.cycles": 12 });
    expect(r.circuit!.analyses[0]).toMatchObject({ kind: "steady", from: "startup", cycles: 12 });
  });

  test("steady needs probe=, at the keyword", () => {
    const r = elaborated("steady from=poles");
    // The span is the keyword, at the start of the third line.
    expect(r.diagnostics.map((d) => [d.code, d.message, d.span?.start, d.span?.end])).toEqual([["missing-option", "steady needs probe=", net.length, net.length + "steady".length]]);
  });

  test("from=noise is not a choice, with the choices in the hint", () => {
    const r = elaborated("steady probe=o from=noise");
    expect(r.diagnostics[0]).toMatchObject({ code: "bad-word", message: "from=noise is not a choice for steady", hint: "from= is one of startup, poles" });
  });

  test("harmonics= and bandwidth= together are a conflict", () => {
    const r = elaborated("steady probe=o harmonics=10 bandwidth=20k");
    expect(r.diagnostics[0]).toMatchObject({ code: "conflicting-options", message: "steady takes harmonics= or bandwidth=, not both" });
  });
});

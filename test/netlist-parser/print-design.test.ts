import { describe, expect, test } from "vitest";
import type { DesignedFile } from "@onset/core";
import { elaborate, formatText, parseText, printDesignedFile } from "@onset/netlist-parser";

const file: DesignedFile = {
  header: ["a workshop tuning reference", "", "sized by hand"],
  title: "tuning reference, 440Hz",
  parts: [
    { kind: "resistor", name: "R1", nodes: ["o", "s"], value: 11e3, tolerance: 0.01 },
    { kind: "capacitor", name: "C1", nodes: ["s", "gnd"], value: 33e-9, tolerance: 0.05, comment: "the timing capacitor" },
    { kind: "resistor", name: "Rg", nodes: ["n", "gnd"], value: 10e3 },
    { kind: "resistor", name: "Rf", nodes: ["n", "o"], value: 22e3 },
    { kind: "opamp", name: "U1", nodes: ["s", "n", "o"], options: { gbw: 1e6, rails: [-12, 12] } },
  ],
  analyses: [{ keyword: "startup", options: [["probe", "o"], ["until", "auto"], ["max-step", 20e-6]] }, { keyword: "poles" }],
  spec: [
    { metric: "frequency", test: "within", value: 440, tolerance: 0.02 },
    { metric: "thd", test: "below", value: 0.005, percent: true },
    { metric: "startup", test: "below", value: 0.25 },
  ],
};

describe("printDesignedFile(file)", () => {
  const text = printDesignedFile(file);

  test("writes the header, title, parts, analyses and spec in the formatter's canonical layout", () => {
    expect(text).toBe(
      [
        "# a workshop tuning reference",
        "#",
        "# sized by hand",
        "",
        'title "tuning reference, 440Hz"',
        "",
        "resistor  R1 o s   11k±1%",
        "capacitor C1 s gnd 33n±5%  # the timing capacitor",
        "resistor  Rg n gnd 10k",
        "resistor  Rf n o   22k",
        "opamp     U1 s n   o      gbw=1M rails=(-12, 12)",
        "",
        "startup probe=o until=auto max-step=20u",
        "poles",
        "spec frequency=440±2% thd<0.5% startup<250m",
        "",
      ].join("\n"),
    );
    expect(formatText(text).text).toBe(text);
  });

  test("reads back as the parts, analyses and spec it was given (print → parse → elaborate)", () => {
    const { program, diagnostics } = parseText(text, "design.onset");
    expect(diagnostics).toEqual([]);
    const { circuit } = elaborate(program);
    expect(circuit!.parts.map((p) => [p.name, p.kind, p.nodes, p.value])).toEqual(file.parts.map((p) => [p.name, p.kind, p.nodes, p.value]));
    expect(circuit!.tolerances.map((t) => [t.target, t.relative])).toEqual([["R1", 0.01], ["C1", 0.05]]);
    expect(circuit!.parts.find((p) => p.name === "U1")!.options).toMatchObject({ gbw: 1e6, rails: [-12, 12] });
    const startup = circuit!.analyses[0]!;
    expect(startup).toMatchObject({ kind: "startup", probe: { kind: "node", node: "o" }, until: "auto", maxStep: 20e-6 });
    const spec = circuit!.analyses.find((a) => a.kind === "spec")!;
    expect(spec.kind === "spec" && spec.criteria.map((c) => ("limit" in c ? [c.metric, c.test, c.limit] : [c.metric, c.test, c.low, c.high]))).toEqual([
      ["frequency", "within", 440 * 0.98, 440 * 1.02],
      ["thd", "below", 0.005],
      ["startup", "below", 0.25],
    ]);
  });
});

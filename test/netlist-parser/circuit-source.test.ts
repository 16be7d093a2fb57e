import { describe, expect, test } from "vitest";
import { analysisOf, isOnsetError, runStartup } from "@onset/core";
import { buildCircuit, loadSource, SourceError } from "@onset/netlist-parser";
import { thrownBy } from "../support/thrown.js";
import { memoryResolver } from "./support/helpers.js";

const thrown = (f: () => unknown): SourceError => thrownBy(SourceError, f);

describe("loadSource and buildCircuit (the API's front door)", () => {
  test("a file with includes loads through the caller's reader and builds without assertions", () => {
    const files = { "osc.onset": 'include "values.onset"\nvsource V1 a gnd 5\nresistor R1 a gnd (R)\nbias\n', "values.onset": "param R = 10k\n" };
    const source = loadSource("osc.onset", files["osc.onset"], { reader: memoryResolver(files) });
    const { circuit, warnings } = buildCircuit(source, { overrides: { R: "20k" } });
    expect(circuit.parts.map((p) => p.value)).toEqual([5, 20e3]);
    expect(warnings).toEqual([]);
  });

  test("every error comes in one SourceError, an OnsetError whose diagnostic is the first, rendered with lines and carets", () => {
    const e = thrown(() => loadSource("bad.onset", "resistor R1 a 0 1k\nresistr R2 a gnd 1k\n"));
    expect(isOnsetError(e)).toBe(true);
    expect(e.diagnostics.map((d) => d.code)).toEqual(["node-zero", "unknown-kind"]);
    expect(e.diagnostic.code).toBe("node-zero");
    expect(e.message).toBe(`${e.diagnostics[0]!.message} (and 1 more error)`);
    expect(e.render().split("\n").slice(0, 3)).toEqual(["bad.onset:1:15: error: " + e.diagnostics[0]!.message, "  resistor R1 a 0 1k", "                ^"]);
  });

  test("an include without a reader is an error, not a silent skip", () => {
    expect(thrown(() => loadSource("m.onset", 'include "x.onset"\n')).diagnostic.code).toBe("include-missing");
  });

  test("elaboration errors and wiring faults are thrown by buildCircuit", () => {
    expect(thrown(() => buildCircuit(loadSource("m.onset", "resistor R1 a gnd (Rx)\n"))).diagnostic.code).toBe("unknown-param");
    const floating = loadSource("f.onset", "vsource V1 a gnd 1\ncapacitor C1 a b 1n\nresistor R1 b c 1k\nresistor R2 c b 1k\n");
    expect(thrown(() => buildCircuit(floating)).diagnostic.code).toBe("no-dc-path");
  });

  test("analysisOf gives the typed analysis, or a missing-analysis OnsetError", () => {
    const { circuit } = buildCircuit(loadSource("m.onset", "vsource V1 a gnd 1\nresistor R1 a gnd 1k\nbias\n"));
    expect(analysisOf(circuit, "bias").kind).toBe("bias");
    expect(() => runStartup(circuit, analysisOf(circuit, "startup"))).toThrow(expect.objectContaining({ diagnostic: expect.objectContaining({ code: "missing-analysis", message: "the circuit has no startup analysis" }) }));
  });
});

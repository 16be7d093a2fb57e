import { describe, expect, test } from "vitest";
import { analysisOf, runBias, type Circuit } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";

const build = (text: string): Circuit => buildCircuit(loadSource("t.onset", text)).circuit;

describe("implausible operating points", () => {
  test("a diode with series=0 straight across 1 kV is reported as a warning naming the part, at its line", () => {
    const text = "vsource V1 a gnd 1k\ndiode D1 a gnd series=0\nbias\n";
    const circuit = build(text);
    const r = runBias(circuit, analysisOf(circuit, "bias"));
    const warnings = r.warnings ?? [];
    expect(warnings.map((w) => [w.part, w.diagnostic.code, w.diagnostic.severity])).toEqual([
      ["V1", "implausible-operation", "warning"],
      ["D1", "implausible-operation", "warning"],
    ]);
    const diode = warnings[1]!.diagnostic;
    expect(diode.message).toMatch(/^diode D1 carries \d\.\d{3}e\+\d+ A at the bias point, far outside any physical operating point$/);
    expect(diode.span).toEqual({ file: "t.onset", start: text.indexOf("diode"), end: text.indexOf("\n", text.indexOf("diode")) });
  });

  test("an ordinary operating point has no warnings (a diode at a few milliamperes)", () => {
    // 5 V through 1 kΩ into a diode: about 4.3 mA (Ohm's law with a ~0.7 V drop).
    const circuit = build("vsource V1 a gnd 5\nresistor R1 a k 1k\ndiode D1 k gnd\nbias\n");
    expect(runBias(circuit, analysisOf(circuit, "bias")).warnings).toBeUndefined();
  });
});

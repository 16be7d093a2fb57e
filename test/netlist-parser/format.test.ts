import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { formatText, parseText } from "@onset/netlist-parser";
import { programTextArb } from "./support/generators.js";
import { shape } from "./support/helpers.js";

describe("formatText: the canonical layout", () => {
  test("aligns part columns, keeps number spellings and comments, one blank line between sections", () => {
    const source = `# Twin-T reference
title   "Twin-T, 1 kHz"
param R=10.7k   # from the design table
param Cbig  =  33n
resistor Ra o m1 (R)±1%
capacitor   Cs m1 gnd (2*Cbig)+-5%  # shunt
pot P1 o p gnd 10k at=0.08

# the amplifier
opamp U1 p n o preset=general gbw=1M
block notch (in,out,ref) R=11k C
  resistor Ra in m1 (R)
    capacitor Cb m2 out (C)   # inner
end  # done
use N1 notch o n gnd R=10.7k C=33n
transient until=10m probes=(o,
    (o, p), Ra.i)
spec frequency=1k±2% amplitude=3..5
`;
    expect(formatText(source).text).toBe(`# Twin-T reference
title "Twin-T, 1 kHz"

param R    = 10.7k  # from the design table
param Cbig = 33n

resistor  Ra o  m1  (R)±1%
capacitor Cs m1 gnd (2*Cbig)+-5%  # shunt
pot       P1 o  p   gnd          10k at=0.08

# the amplifier
opamp U1 p n o preset=general gbw=1M

block notch (in, out, ref) R=11k C
  resistor  Ra in m1  (R)
  capacitor Cb m2 out (C)  # inner
end  # done

use N1 notch o n gnd R=10.7k C=33n

transient until=10m probes=(o, (o, p), Ra.i)
spec frequency=1k±2% amplitude=3..5
`);
  });

  test("comments inside a wrapped statement move above it", () => {
    expect(formatText("transient until=1m probes=(a,  # first\n  b)\n").text).toBe("# first\ntransient until=1m probes=(a, b)\n");
  });

  test("an empty file stays empty; a file of comments keeps them", () => {
    expect(formatText("").text).toBe("");
    expect(formatText("\n\n# a\n\n\n# b\n").text).toBe("# a\n\n# b\n");
  });

  test("a file with syntax errors is not formatted", () => {
    const r = formatText("resistor R1 a 0 1k\n", "x.onset");
    expect(r.text).toBeUndefined();
    expect(r.diagnostics.map((d) => d.code)).toEqual(["node-zero"]);
  });
});

describe("formatter properties (fast-check)", () => {
  test("generated files parse cleanly, and parse → format → parse gives the same tree", () => {
    fc.assert(
      fc.property(programTextArb, (text) => {
        const parsed = parseText(text, "g.onset");
        expect(parsed.diagnostics).toEqual([]);
        const before = parsed.program;
        const formatted = formatText(text).text!;
        const after = parseText(formatted, "g.onset");
        expect(after.diagnostics).toEqual([]);
        expect(shape(after.program)).toEqual(shape(before));
      }),
      { numRuns: 1500 },
    );
  });

  test("format is idempotent", () => {
    fc.assert(
      fc.property(programTextArb, (text) => {
        const once = formatText(text).text!;
        expect(formatText(once).text).toBe(once);
      }),
      { numRuns: 1000 },
    );
  });
});

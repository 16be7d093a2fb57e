import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { OnsetError, type Diagnostic } from "@onset/core";
import { checkProgram, formatText, loadProgram, renderDiagnostic } from "@onset/netlist-parser";
import { mutationsArb, programTextArb } from "./support/generators.js";
import { memoryResolver } from "./support/helpers.js";

// Whatever the input, the language's functions return typed diagnostics; they never throw
// (an OnsetError would be a typed error too, but none is expected to escape).

const example = `title "Wien bridge, 1 kHz"
param R = 15.9k±1%
param C = 10n±5%
preset soft opamp gbw=3M slew=1V/us
block arm (a, b, m) R=(R) C=(C)
  resistor  Rs a  x  (R)
  capacitor Cs x  m  (C)
  resistor  Rp m  b  (R)
  capacitor Cp m  b  (C)
end
use W arm o gnd p
opamp U1 p n o preset=soft rails=(-12, 12)
resistor Rf o n 20.5k
resistor Rg n gnd 10k
diode D1 o n series=10
vsource Vk k gnd wave=pulse low=0 high=10m width=10u
resistor Rk k p 1M
transient until=20m probes=(o, (o, p), Rf.i, W.x)
startup probe=o until=auto kick=noise
sweep Rf from=19k to=22k steps=4
tolerance runs=50
spec frequency=1k±5% thd<2% amplitude=1..12 yield>90%
`;

function isDiagnostic(d: Diagnostic): boolean {
  return (
    (d.severity === "error" || d.severity === "warning") &&
    d.stage === "input" &&
    typeof d.code === "string" &&
    /^[a-z]+(-[a-z]+)*$/.test(d.code) &&
    typeof d.message === "string" &&
    d.message.length > 0
  );
}

/** Runs every entry point on a text; fails the property on any throw or malformed diagnostic. */
function exercise(text: string): void {
  try {
    const loaded = loadProgram("f.onset", text, memoryResolver({ "f.onset": text, "lib.onset": "param X = 1\n" }));
    const all: Diagnostic[] = [...loaded.diagnostics];
    // checkProgram elaborates (with overrides, to exercise them) and adds topology and warnings.
    all.push(...checkProgram(loaded.program, { overrides: { R: "12k", "U1.gbw": 1e6 } }));
    all.push(...formatText(text, "f.onset").diagnostics);
    // Plain checks here: an expect() per diagnostic would dominate the run time.
    for (const d of all) {
      if (!isDiagnostic(d)) throw new Error(`malformed diagnostic ${JSON.stringify(d)}`);
      if (d.span) {
        const length = (loaded.sources.get(d.span.file) ?? "").length;
        if (!(d.span.start >= 0 && d.span.end >= d.span.start && d.span.end <= length)) throw new Error(`span out of the file: ${JSON.stringify(d)}`);
      }
      if (typeof renderDiagnostic(d, loaded.sources, { color: true }) !== "string") throw new Error("render failed");
    }
  } catch (e) {
    if (e instanceof OnsetError) throw new Error(`an OnsetError escaped: ${e.message}`);
    throw e;
  }
}

describe("robustness: never a throw, only typed diagnostics", () => {
  test("the example file itself checks clean of errors", () => {
    const loaded = loadProgram("f.onset", example);
    expect(checkProgram(loaded.program).filter((d) => d.severity === "error")).toEqual([]);
  });

  test("arbitrary byte strings (decoded as UTF-8 and as Latin-1)", () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 200 }), fc.boolean(), (bytes, utf8) => {
        exercise(new TextDecoder(utf8 ? "utf-8" : "latin1").decode(bytes));
      }),
      { numRuns: 3000 },
    );
  });

  test("arbitrary strings of the language's characters", () => {
    const chars = fc.constantFrom(..."resistor capacitor opamp block use end param spec sweep ( ) [ ] = , + - * / ^ ± < > .. # \" \\ \n \t 0 1 9 k m M µ Ω % dB e gnd a b R1 N1. inf log".split(" "), " ", "\n");
    fc.assert(
      fc.property(fc.array(chars, { maxLength: 80 }), (parts) => {
        exercise(parts.join(""));
      }),
      { numRuns: 2500 },
    );
  });

  test("mutations of a valid example file", () => {
    fc.assert(
      fc.property(mutationsArb(example), (text) => {
        exercise(text);
      }),
      { numRuns: 3000 },
    );
  });

  test("mutations of generated valid files", () => {
    fc.assert(
      fc.property(programTextArb.chain((t) => mutationsArb(t)), (text) => {
        exercise(text);
      }),
      { numRuns: 1500 },
    );
  });
});

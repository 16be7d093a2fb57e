import { describe, expect, test } from "vitest";
import type { Circuit, PartSpec } from "@onset/core";
import { elaborate, overrideTargets, parseText, type Program } from "@onset/netlist-parser";

function program(text: string): Program {
  const { program, diagnostics } = parseText(text, "t.onset");
  expect(diagnostics).toEqual([]);
  return program;
}
function circuit(p: Program, overrides: Record<string, string | number> = {}): Circuit {
  const r = elaborate(p, { overrides });
  expect(r.diagnostics).toEqual([]);
  return r.circuit!;
}
function part(c: Circuit, name: string): PartSpec {
  const found = c.parts.find((p) => p.name === name);
  if (!found) throw new Error(`no part ${name}`);
  return found;
}

const twinT = program(`param R = 11k±1%
param C = 33n
block notch (in, out, ref) R=11k C=33n k=0.5
  resistor  Ra in m1  (R)
  resistor  Rb m1 out (R)
  capacitor Cs m1 ref (2*C)±5%
  capacitor Ca in m2  (C)
  capacitor Cb m2 out (C)
  resistor  Rs m2 ref (k*R)
  pot       P1 m2 w ref 1k at=0.5
end
use N1 notch o n gnd R=(R) k=0.46±2%
opamp U1 gnd n o gbw=1M
resistor Rl o gnd 10k
resistor Rd w2 gnd (R/2)
resistor Rw N1w gnd 1k
`);

describe("expressions", () => {
  test("precedence: ^ binds tighter than unary minus, and is right-associative; functions and pi", () => {
    const c = circuit(
      program(`param a = (-2^2)
param b = (2^3^2)
param c = (1 - 2 - 3)
param d = (12/2/3)
param e = (min(3, 1, 2) + max(4, 5) + abs(-1) + sqrt(16) + exp(0) + ln(1) + log10(1000) + atan(0) + sin(0) + cos(0) + tan(0))
param f = (1/(2*pi*10k*10n))
vsource Va a gnd (a)
vsource Vb b gnd (b)
vsource Vc c gnd (c)
vsource Vd d gnd (d)
vsource Ve e gnd (e)
vsource Vf f gnd (f)
`),
    );
    expect(c.parts.map((p) => p.value)).toEqual([-4, 512, -4, 2, 1 + 5 + 1 + 4 + 1 + 0 + 3 + 0 + 0 + 1 + 0, 1 / (2 * Math.PI * 10e3 * 10e-9)]);
  });

  test("parameters may be used before they are defined, and see overrides of the ones they use", () => {
    const p = program("param R2 = (2*R)\nparam R = 1k\nresistor Ra a gnd (R2)\n");
    expect(part(circuit(p), "Ra").value).toBe(2000);
    expect(part(circuit(p, { R: "3k" }), "Ra").value).toBe(6000);
  });

  test("a unit on a parameter's plain literal is checked where the parameter is used alone", () => {
    expect(part(circuit(program("param C = 33nF\ncapacitor C1 a gnd (C)\nresistor R1 a gnd 1k\n")), "C1").value).toBe(33e-9);
  });
});

describe("blocks", () => {
  test("instances flatten with hierarchical part and node names; ports map to outer nodes", () => {
    const c = circuit(twinT);
    expect(part(c, "N1.Ra").nodes).toEqual(["o", "N1.m1"]);
    expect(part(c, "N1.Rb").nodes).toEqual(["N1.m1", "n"]);
    expect(part(c, "N1.Cs").nodes).toEqual(["N1.m1", "gnd"]);
    expect(part(c, "N1.P1").nodes).toEqual(["N1.m2", "N1.w", "gnd"]);
    expect(part(c, "N1.Rs").value).toBeCloseTo(0.46 * 11e3, 9);
  });

  test("parts inside an instance carry the span of their line inside the block", () => {
    const c = circuit(twinT);
    const span = part(c, "N1.Ra").span!;
    expect(twinT.text.slice(span.start, span.end)).toBe("resistor  Ra in m1  (R)");
  });

  test("nested instances join names with dots", () => {
    const c = circuit(
      program(`block leg (a, b) R=1k
  resistor Rx a mid (R)
  resistor Ry mid b (R)
end
block pair (p, q)
  use L1 leg p q R=2k
  use L2 leg p q
end
use X pair n1 gnd
resistor R0 n1 gnd 1k
`),
    );
    expect(c.parts.map((p) => `${p.name}:${p.nodes.join(",")}:${p.value}`)).toEqual([
      "X.L1.Rx:n1,X.L1.mid:2000",
      "X.L1.Ry:X.L1.mid,gnd:2000",
      "X.L2.Rx:n1,X.L2.mid:1000",
      "X.L2.Ry:X.L2.mid,gnd:1000",
      "R0:n1,gnd:1000",
    ]);
  });

  test("a block default may read the file parameter of the same name: R=(R)", () => {
    const c = circuit(program("param R = 15k\nblock arm (a) R=(R) C2=(2*R)\n  resistor Ra a gnd (R)\n  resistor Rb a gnd (C2)\nend\nuse A arm x\nuse B arm x R=1k\n"));
    expect(c.parts.map((p) => `${p.name}=${p.value}`)).toEqual(["A.Ra=15000", "A.Rb=30000", "B.Ra=1000", "B.Rb=2000"]);
  });

  test("node-pair options resolve like pins inside an instance", () => {
    const c = circuit(
      program(`block amp (i, o, vee, vcc)
  opamp U i o o supply=(vee, vcc)
  resistor Rload o local 1k
  resistor Rg local gnd 1k
end
use A amp x y vm vp
vsource Vm vm gnd -12
vsource Vp vp gnd 12
resistor Rx x gnd 1k
`),
    );
    expect(part(c, "A.U").options.supply).toEqual(["vm", "vp"]);
    expect(part(c, "A.Rload").nodes).toEqual(["y", "A.local"]);
  });
});

describe("presets", () => {
  test("a file preset merges under explicit options and stays named in the options", () => {
    const c = circuit(program("preset quick opamp gbw=10M slew=15V/us\nopamp U1 p n o preset=quick gbw=5M\nresistor R o n 1k\nresistor Rp p gnd 1k\nresistor Rn n gnd 1k\n"));
    expect(part(c, "U1").options).toMatchObject({ preset: "quick", gbw: 5e6, slew: 15e6, gain: 200e3 });
  });

  test("a built-in preset supplies its values, explicit options win", () => {
    const c = circuit(program("opamp U1 p n o preset=ideal rout=1\nresistor R o n 1k\nresistor Rp p gnd 1k\nresistor Rn n gnd 1k\n"));
    expect(part(c, "U1").options).toMatchObject({ preset: "ideal", gain: 1e7, gbw: 1e9, slew: Infinity, rin: Infinity, rout: 1 });
  });

  test("defaults are filled in from the schema, words included", () => {
    const c = circuit(program("pot P1 a w gnd 10k\ninductor L1 a gnd 1m\n"));
    expect(part(c, "P1").options).toEqual({ at: 0.5, taper: "linear" });
    expect(part(c, "L1").options).toEqual({ initial: 0, series: 0 });
  });

  test("inf is Infinity where the option allows it", () => {
    const c = circuit(program("opamp U1 p n o slew=inf rin=inf\nresistor R o n 1k\nresistor Rp p gnd 1k\nresistor Rn n gnd 1k\n"));
    expect(part(c, "U1").options).toMatchObject({ slew: Infinity, rin: Infinity });
  });
});

describe("overrides (--set)", () => {
  test("a parameter, an instance parameter, a part value, a part option and an inner option", () => {
    const c = circuit(twinT, { R: "12k", "N1.k": 0.5, Rl: "22k", "U1.gbw": "3M", "N1.P1.at": "0.25" });
    expect(part(c, "N1.Ra").value).toBe(12e3); // N1's R= is (R), which follows the file parameter
    expect(part(c, "N1.Rs").value).toBe(6e3);
    expect(part(c, "Rd").value).toBe(6e3);
    expect(part(c, "Rl").value).toBe(22e3);
    expect(part(c, "U1").options.gbw).toBe(3e6);
    expect(part(c, "N1.P1").options.at).toBe(0.25);
  });

  test("an instance parameter override shadows the value given on the use line", () => {
    const c = circuit(twinT, { "N1.R": "10k" });
    expect(part(c, "N1.Ra").value).toBe(10e3);
    expect(part(c, "Rd").value).toBe(5.5e3);
  });

  test("a param written inside a block is set per instance as INSTANCE.NAME", () => {
    const p = program("block b (x)\n  param Rl = 2k\n  resistor Ra x gnd (Rl)\nend\nuse A b n\nuse B b n\n");
    const c = circuit(p, { "B.Rl": "3k" });
    expect(c.parts.map((x) => `${x.name}=${x.value}`)).toEqual(["A.Ra=2000", "B.Ra=3000"]);
    expect(overrideTargets(p)).toEqual(expect.arrayContaining(["A.Rl", "B.Rl", "A.Ra", "B.Ra"]));
  });

  test("an option that is not written can still be set (its default is replaced)", () => {
    expect(part(circuit(twinT, { "U1.slew": "1V/us" }), "U1").options.slew).toBe(1e6);
  });

  test("an unknown name is reported with the closest target, and no circuit is made", () => {
    const r = elaborate(twinT, { overrides: { "N1.Rx": "1k" } });
    expect(r.circuit).toBeUndefined();
    expect(r.diagnostics.map((d) => d.message)).toEqual([
      "cannot set 'N1.Rx': no parameter, part value, part option or analysis option has that name (did you mean 'N1.R'?)",
    ]);
  });

  test("a rule across analysis options broken by a set value is reported at the keyword (the value is not on the line)", () => {
    const text = "vsource V1 a gnd 1\nresistor R1 a gnd 1k\nresponse from=V1 to=a start=1k\n";
    const r = elaborate(program(text), { overrides: { "response.stop": "100" } });
    expect(r.diagnostics.map((d) => ({ code: d.code, message: d.message, at: text.slice(d.span!.start, d.span!.end), hint: d.hint }))).toEqual([
      { code: "out-of-range", message: "response stop= must be above start=, got 1000 Hz to 100 Hz", at: "response", hint: "swap start= and stop=" },
    ]);
  });

  test("an override value in the wrong unit, or out of range, is an error", () => {
    expect(elaborate(twinT, { overrides: { Rl: "1uF" } }).diagnostics.map((d) => d.code)).toEqual(["unit-mismatch"]);
    expect(elaborate(twinT, { overrides: { "N1.P1.at": "1.5" } }).diagnostics.map((d) => d.code)).toEqual(["out-of-range"]);
    expect(elaborate(twinT, { overrides: { Rl: -5 } }).diagnostics.map((d) => d.code)).toEqual(["out-of-range"]);
  });

  test("override problems are typed diagnostics without a span", () => {
    expect(elaborate(twinT, { overrides: { Rl: "12 k" } }).diagnostics).toEqual([
      { severity: "error", stage: "input", code: "bad-quantity", message: "the value set for Rl: '12 k' is not a number", hint: "write a number such as 2.5k, 33n, 10% or 106dB" },
    ]);
    expect(elaborate(twinT, { overrides: { Rl: Number.NaN } }).diagnostics).toEqual([
      { severity: "error", stage: "input", code: "bad-override", message: "the value set for Rl is not a finite number", hint: "give a number such as 10k" },
    ]);
  });

  test("overrideTargets lists parameters, instance parameters, part values and numeric options", () => {
    const names = overrideTargets(twinT);
    for (const n of ["R", "C", "N1.R", "N1.C", "N1.k", "N1.Ra", "N1.P1", "N1.P1.at", "U1.gbw", "U1.gain", "U1.slew", "Rl", "N1.Cs.initial"]) expect(names).toContain(n);
    expect(names).not.toContain("U1.taper");
    expect(names).not.toContain("U1.preset");
  });

  test("elaboration is repeatable: the same program gives the same circuit, and overrides do not leak", () => {
    const a = circuit(twinT);
    circuit(twinT, { R: "99k" });
    expect(circuit(twinT)).toEqual(a);
  });
});

describe("tolerances for Monte Carlo", () => {
  test("entries keep the written nominal; targets are override names", () => {
    const c = circuit(twinT);
    expect(c.tolerances.map(({ span: _s, ...t }) => t)).toEqual([
      { target: "R", nominal: 11e3, relative: 0.01, unit: "Ω" },
      { target: "N1.k", nominal: 0.46, relative: 0.02 },
      { target: "N1.Cs", nominal: 66e-9, relative: 0.05, unit: "F" },
    ]);
  });

  test("giving a target back as an override sets exactly that value (shared for a param, per part otherwise)", () => {
    const c = circuit(twinT, { R: 11.1e3, "N1.Cs": 70e-9, "N1.k": 0.47 });
    expect(part(c, "N1.Ra").value).toBe(11.1e3);
    expect(part(c, "N1.Rb").value).toBe(11.1e3);
    expect(part(c, "Rd").value).toBe(11.1e3 / 2);
    expect(part(c, "N1.Cs").value).toBe(70e-9);
    expect(part(c, "N1.Rs").value).toBeCloseTo(0.47 * 11.1e3, 9);
    // The entries themselves stay as written.
    expect(c.tolerances.map((t) => t.nominal)).toEqual([11e3, 0.46, 66e-9]);
  });

  test("a tolerance on a part option is kept under PART.option", () => {
    const c = circuit(program("opamp U1 p n o gbw=1M±20%\nresistor R o n 1k\nresistor Rp p gnd 1k\nresistor Rn n gnd 1k\n"));
    expect(c.tolerances.map(({ span: _s, ...t }) => t)).toEqual([{ target: "U1.gbw", nominal: 1e6, relative: 0.2, unit: "Hz" }]);
  });

  test("an absolute tolerance is in the value's unit and checked against it", () => {
    const c = circuit(program("vsource V1 a gnd 5±10mV\nresistor R a gnd 1k\n"));
    expect(c.tolerances[0]).toMatchObject({ target: "V1", nominal: 5, absolute: 10e-3 });
    expect(elaborate(program("vsource V1 a gnd 5±10mA\nresistor R a gnd 1k\n")).diagnostics.map((d) => d.code)).toEqual(["unit-mismatch"]);
  });
});

describe("per-use draws: param … each", () => {
  const wien = program(`param R = 15.8k±1% each
param C = 10n±5% each
param R2 = (R*2)
block arm (a, b)
  resistor Rx a b (R)
end
resistor  R1  o   s    (R)
capacitor C1  s   p    (C)
resistor  R2x p   gnd  (R)
capacitor C2  p   gnd  (2*C)
resistor  Rf  o   n    (R2)
use A1 arm n gnd
vsource   V1  o   gnd  1
transient until=(R*1e-7)
`);

  test("each use gets its own entry PARAM@PLACE around the nominal, in the order the uses are read", () => {
    const c = circuit(wien);
    expect(c.tolerances.map(({ span: _s, ...t }) => t)).toEqual([
      { target: "R@R2", nominal: 15.8e3, relative: 0.01, unit: "Ω" },
      { target: "R@R1", nominal: 15.8e3, relative: 0.01, unit: "Ω" },
      { target: "C@C1", nominal: 10e-9, relative: 0.05, unit: "F" },
      { target: "R@R2x", nominal: 15.8e3, relative: 0.01, unit: "Ω" },
      { target: "C@C2", nominal: 10e-9, relative: 0.05, unit: "F" },
      { target: "R@A1.Rx", nominal: 15.8e3, relative: 0.01, unit: "Ω" },
    ]);
    expect(overrideTargets(wien)).toEqual(expect.arrayContaining(["R", "C", "R@R1", "R@R2x", "R@A1.Rx", "C@C2", "R@R2"]));
  });

  test("setting a per-use name moves only that use; setting the parameter moves every nominal", () => {
    const c = circuit(wien, { "R@R1": 15.7e3, "C@C2": 11e-9, "R@R2": 16e3 });
    expect(part(c, "R1").value).toBe(15.7e3);
    expect(part(c, "R2x").value).toBe(15.8e3);
    expect(part(c, "C2").value).toBe(22e-9);
    expect(part(c, "C1").value).toBe(10e-9);
    // R2 = (R*2) reads R once, as one use: every part that reads R2 sees that one draw.
    expect(part(c, "Rf").value).toBe(32e3);
    expect(part(c, "A1.Rx").value).toBe(15.8e3);
    const shifted = circuit(wien, { R: 16e3 });
    expect(part(shifted, "R1").value).toBe(16e3);
    expect(shifted.tolerances.find((t) => t.target === "R@A1.Rx")?.nominal).toBe(16e3);
  });

  test("an analysis option reads the nominal, not a draw", () => {
    const c = circuit(wien, { "R@R1": 1 });
    expect(c.analyses[0]).toMatchObject({ kind: "transient", until: 15.8e3 * 1e-7 });
  });

  test("a shared draw under a tolerance study warns; each, a single user or no study does not", () => {
    const warn = (text: string) => elaborate(program(text)).diagnostics.filter((d) => d.code === "shared-tolerance").map((d) => d.message);
    const parts = "resistor R1 a gnd (R)\nresistor R2 a gnd (2*R)\nvsource V1 a gnd 1\n";
    expect(warn(`param R = 10k±1%\n${parts}tolerance runs=5\n`)).toEqual(["parameter R is drawn once per sample and shared by 2 parts (R1, R2)"]);
    expect(warn(`param R = 10k±1% each\n${parts}tolerance runs=5\n`)).toEqual([]);
    expect(warn(`param R = 10k±1%\n${parts}`)).toEqual([]);
    expect(warn("param R = 10k±1%\nresistor R1 a gnd (R)\nvsource V1 a gnd 1\ntolerance runs=5\n")).toEqual([]);
    // Through another parameter and a block instance, and not when the study sweeps it.
    const deep = "param R = 10k±1%\nparam Rh = (R/2)\nblock b (x)\n  resistor Ri x gnd (R)\nend\nuse B1 b a\nresistor R1 a gnd (Rh)\nvsource V1 a gnd 1\ntolerance runs=5\n";
    expect(warn(deep)).toEqual(["parameter R is drawn once per sample and shared by 2 parts (R1, B1.Ri)"]);
    expect(warn(`${deep}sweep R from=9k to=11k steps=2\n`)).toEqual([]);
  });
});

describe("units of drawn values", () => {
  test("a parameter without a written unit takes the unit of the places it stands in, alone or scaled", () => {
    const c = circuit(program("param R = 10k±1%\nparam C = 1n±5%\nparam k = 0.5±2%\nresistor R1 a gnd (R/2)\ncapacitor C1 a gnd ((3*C))\nresistor R2 a gnd (k*R)\nvsource V1 a gnd 1\n"));
    expect(c.tolerances.map((t) => [t.target, t.unit])).toEqual([
      ["R", "Ω"],
      ["C", "F"],
      ["k", undefined],
    ]);
    const mixed = circuit(program("param x = 1k±1%\nresistor R1 a gnd (x)\nvsource V1 a gnd (x)\n"));
    expect(mixed.tolerances[0]!.unit).toBeUndefined();
    // Standing alone wins over scaled uses; analysis options do not count.
    const both = circuit(program("param R = 1k±1%\nresistor R1 a gnd (R)\ncapacitor C1 a gnd (R*1e-12)\nvsource V1 a gnd 1\ntransient until=(R*1e-6)\n"));
    expect(both.tolerances[0]!.unit).toBe("Ω");
  });
});

describe("accuracy options of the time-domain analyses", () => {
  test("transient and startup take accuracy= and accuracy-floor=, and --set reaches them", () => {
    const text = "resistor R1 a gnd 1k\ncapacitor C1 a gnd 1u\nvsource V1 a gnd 1\ntransient until=1m accuracy=1e-6 accuracy-floor=1n\nstartup probe=a accuracy=1e-5\n";
    const c = circuit(program(text));
    expect(c.analyses[0]).toMatchObject({ kind: "transient", accuracy: 1e-6, accuracyFloor: 1e-9 });
    expect(c.analyses[1]).toMatchObject({ kind: "startup", accuracy: 1e-5 });
    expect(circuit(program(text), { "transient.accuracy": "1e-8" }).analyses[0]).toMatchObject({ accuracy: 1e-8 });
  });

  test("an accuracy outside 1e-10 … 0.1 is out-of-range at the option's value", () => {
    const text = "resistor R1 a gnd 1k\nvsource V1 a gnd 1\ntransient until=1m accuracy=0.5\n";
    const r = elaborate(program(text));
    expect(r.diagnostics.map((d) => d.code)).toEqual(["out-of-range"]);
    expect(text.slice(r.diagnostics[0]!.span!.start, r.diagnostics[0]!.span!.end)).toBe("0.5");
  });
});

describe("node pairs", () => {
  test("supply= takes node names; a number there is expected-node", () => {
    const r = elaborate(program("opamp U1 p n o supply=(1, vcc)\nresistor R o n 1k\n"));
    expect(r.diagnostics.map((d) => `${d.code}: ${d.message}`)).toEqual(["expected-node: supply= of opamp U1 takes node names, not '1'"]);
  });
});

describe("several independent errors are all reported", () => {
  test("one diagnostic per faulty line, in order", () => {
    const r = elaborate(program("resistor R1 a gnd -1k\ncapacitor C1 a gnd 1nH\npot P1 a w gnd 1k at=2\nresistor R2 a gnd 1k\n"));
    expect(r.diagnostics.map((d) => `${d.code}@${d.span?.start}`)).toEqual(["out-of-range@18", "unit-mismatch@41", "out-of-range@66"]);
  });

  test("parse errors on several lines are all reported (recovery at the next line)", () => {
    const r = parseText("resistor R1 a 0 1k\nresistr R2 a b 1k\ncapacitor C1 a b 1meg\nresistor R3 a b 1k\n", "t.onset");
    expect(r.diagnostics.map((d) => d.code)).toEqual(["node-zero", "unknown-kind", "bad-prefix"]);
    expect(r.program.statements.map((s) => s.kind)).toEqual(["part"]);
  });
});

describe("state probes", () => {
  test("PART.state names a state the part's kind lists; a difference may take voltage states", () => {
    const c = circuit(
      program(`resistor R1 o k 1k
diode D1 o k series=2
resistor R2 k gnd 1k
opamp U1 gnd k o
transient until=1m probes=(o, U1.pole, D1.junction, (D1.junction, k), R1.i)
`),
    );
    const t = c.analyses[0]!;
    expect(t.kind === "transient" && t.probes).toEqual([
      { kind: "node", node: "o" },
      { kind: "state", part: "U1", state: "pole" },
      { kind: "state", part: "D1", state: "junction" },
      { kind: "difference", plus: "D1.junction", minus: "k" },
      { kind: "current", part: "R1" },
    ]);
  });
});

describe("what a study measures", () => {
  test("sweep … measure=steady elaborates to measure: steady; startup, or none written, leaves it out (the start-up run)", () => {
    const sweepOf = (options: string) => circuit(program(`resistor R1 a gnd 1k\nvsource V1 a gnd 1\nsweep R1 from=1k to=2k steps=3${options}\n`)).analyses.find((a) => a.kind === "sweep");
    expect(sweepOf(" measure=steady")).toMatchObject({ kind: "sweep", target: "R1", measure: "steady" });
    expect(sweepOf(" measure=startup")).not.toHaveProperty("measure");
    expect(sweepOf("")).not.toHaveProperty("measure");
  });
});

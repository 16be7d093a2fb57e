import { describe, expect, test } from "vitest";
import { diagnose, report } from "./support/helpers.js";

// Failure tests: for every error kind, the exact rendered message, position, caret and hint.
// A source with several problems reports only the first kind named here as its first diagnostic.

interface Case {
  readonly code: string;
  readonly source: string;
  readonly files?: Record<string, string>;
  readonly warnings?: boolean;
  readonly expected: string;
}

const cases: readonly Case[] = [
  {
    code: "bad-character",
    source: "resistor R1 a gnd 1k ; x",
    expected: [
      "t.onset:1:22: error: unexpected character ';'",
      "  resistor R1 a gnd 1k ; x",
      "                       ^",
      "hint: one statement per line; options are written key=value",
      "",
      "t.onset:1:24: error: expected an option key=value, found 'x'",
      "  resistor R1 a gnd 1k ; x",
      "                         ^",
      "hint: options are written key=value, e.g. at=0.5",
    ].join("\n"),
  },
  {
    code: "unterminated-string",
    source: "title \"abc",
    expected: [
      "t.onset:1:7: error: string is not closed before the end of the line",
      "  title \"abc",
      "        ^~~~",
      "hint: end the string with \" on the same line",
    ].join("\n"),
  },
  {
    code: "bad-escape",
    source: "title \"a\\qb\"",
    expected: [
      "t.onset:1:9: error: unknown escape '\\q' in a string",
      "  title \"a\\qb\"",
      "          ^~",
      "hint: only \\\" and \\\\ are escapes; write other characters as they are",
    ].join("\n"),
  },
  {
    code: "unclosed-bracket",
    source: "transient until=1m probes=(a,\nresistor R1 a gnd 1k",
    expected: [
      "t.onset:1:27: error: '(' is not closed on this statement",
      "  transient until=1m probes=(a,",
      "                            ^",
      "hint: add the closing ')' before the line ends",
      "",
      "t.onset:1:30: error: expected a number, a name or '(', found the end of the line",
      "  transient until=1m probes=(a,",
      "                               ^",
      "hint: expressions use numbers, parameter names, + - * / ^, functions and parentheses",
    ].join("\n"),
  },
  {
    code: "expected",
    source: "resistor R1 a gnd 1k extra",
    expected: [
      "t.onset:1:22: error: expected an option key=value, found 'extra'",
      "  resistor R1 a gnd 1k extra",
      "                       ^~~~~",
      "hint: options are written key=value, e.g. at=0.5",
    ].join("\n"),
  },
  {
    code: "unexpected",
    source: "param R = 1k 2k",
    expected: [
      "t.onset:1:14: error: unexpected '2k' at the end of the statement",
      "  param R = 1k 2k",
      "               ^~",
      "hint: one statement per line; options are written key=value",
    ].join("\n"),
  },
  {
    code: "too-deep",
    source: "resistor R1 a gnd ((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((1))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))",
    expected: [
      "t.onset:1:83: error: brackets nest deeper than 64 levels, past the expression-depth limit",
      "  resistor R1 a gnd ((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((1))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))",
      "                                                                                    ^",
      "hint: split the expression with param lines, or raise the limit with --limit expression-depth=128 (API: limits.maxExpressionDepth)",
    ].join("\n"),
  },
  {
    code: "unknown-kind",
    source: "resistr R1 a b 1k",
    expected: [
      "t.onset:1:1: error: unknown part kind 'resistr' (did you mean 'resistor'?)",
      "  resistr R1 a b 1k",
      "  ^~~~~~~",
      "hint: a part line starts with its kind: resistor, capacitor, inductor, pot, diode, vsource, isource, vcvs, vccs, opamp, lamp, thermistor, jfet",
    ].join("\n"),
  },
  {
    code: "unknown-kind",
    source: "R1 a b 1k",
    expected: [
      "t.onset:1:1: error: unknown part kind 'R1'",
      "  R1 a b 1k",
      "  ^~",
      "hint: a part line starts with its kind: resistor, capacitor, inductor, pot, diode, vsource, isource, vcvs, vccs, opamp, lamp, thermistor, jfet",
    ].join("\n"),
  },
  {
    code: "pin-count",
    source: "resistor R1 a 1k",
    expected: [
      "t.onset:1:15: error: resistor R1 has 2 pins (a, b), but 1 is written",
      "  resistor R1 a 1k",
      "                ^~",
      "hint: write 2 node names after the part name",
    ].join("\n"),
  },
  {
    code: "pin-count",
    source: "resistor R1 a b c 1k",
    expected: [
      "t.onset:1:17: error: resistor R1 has 2 pins (a, b), but 3 are written",
      "  resistor R1 a b c 1k",
      "                  ^",
      "hint: the value follows the 2 nodes; a value is a number or an expression in ( )",
    ].join("\n"),
  },
  {
    code: "node-zero",
    source: "resistor R1 a 0 1k",
    expected: [
      "t.onset:1:15: error: node '0' is not ground in this language",
      "  resistor R1 a 0 1k",
      "                ^",
      "hint: write gnd for the ground node",
    ].join("\n"),
  },
  {
    code: "dotted-name",
    source: "resistor R1.x a gnd 1k",
    expected: [
      "t.onset:1:10: error: 'R1.x': a part name cannot contain '.'",
      "  resistor R1.x a gnd 1k",
      "           ^~~~",
      "hint: dots join hierarchical names (N1.Ra) and are made by use; write a plain name here",
    ].join("\n"),
  },
  {
    code: "unexpected-value",
    source: "opamp U1 p n o 5\nresistor R o gnd 1k",
    expected: [
      "t.onset:1:16: error: opamp U1 takes no value after its pins",
      "  opamp U1 p n o 5",
      "                 ^",
      "hint: set opamp parameters as options, e.g. gain=…",
    ].join("\n"),
  },
  {
    code: "not-in-block",
    source: "block b (x)\n  transient until=1m\nend",
    expected: [
      "t.onset:2:3: error: 'transient' cannot appear inside a block",
      "    transient until=1m",
      "    ^~~~~~~~~",
      "hint: write analyses outside the block, at the top level of the file",
    ].join("\n"),
  },
  {
    code: "stray-end",
    source: "end",
    expected: [
      "t.onset:1:1: error: 'end' without a block to close",
      "  end",
      "  ^~~",
      "hint: remove this line, or start the block with: block NAME (ports)",
    ].join("\n"),
  },
  {
    code: "unclosed-block",
    source: "block b (x)\n  resistor R x gnd 1k\n",
    expected: [
      "t.onset:1:1: error: block 'b' has no 'end'",
      "  block b (x)",
      "  ^~~~~",
      "hint: close the block with a line holding only: end",
    ].join("\n"),
  },
  {
    code: "ground-port",
    source: "block b (x, gnd)\nend",
    expected: [
      "t.onset:1:13: error: gnd cannot be a port: it is the same node everywhere",
      "  block b (x, gnd)",
      "              ^~~",
      "hint: remove gnd from the ports; parts inside the block reach gnd directly",
    ].join("\n"),
  },
  {
    code: "bad-prefix",
    source: "resistor R1 a b 1meg",
    expected: [
      "t.onset:1:17: error: 'meg' in '1meg' is not an SI prefix",
      "  resistor R1 a b 1meg",
      "                  ^~~~",
      "hint: write M for mega (1M = 1e6); lower-case m is milli",
    ].join("\n"),
  },
  {
    code: "bad-prefix",
    source: "resistor R1 a b 10mil",
    expected: [
      "t.onset:1:17: error: 'mil' in '10mil' is not an SI prefix",
      "  resistor R1 a b 10mil",
      "                  ^~~~~",
      "hint: write m for milli (10m = 10e-3); the language has no length units",
    ].join("\n"),
  },
  {
    code: "bad-unit",
    source: "resistor R1 a gnd 1kOhm",
    expected: [
      "t.onset:1:19: error: unknown unit 'kOhm' in '1kOhm' (did you mean 'kohm'?)",
      "  resistor R1 a gnd 1kOhm",
      "                    ^~~~~",
      "hint: units are Ω (or ohm), F, H, V, A, S, s, Hz, V/s, V/rtHz (or V/√Hz), W/K, rad, deg, % and dB, after an optional prefix f p n u µ m k M G T",
    ].join("\n"),
  },
  {
    code: "bad-unit",
    source: "capacitor C1 a gnd 1m%",
    expected: [
      "t.onset:1:20: error: '%' in '1m%' cannot take a prefix",
      "  capacitor C1 a gnd 1m%",
      "                     ^~~",
      "hint: write 0.001% instead",
    ].join("\n"),
  },
  {
    code: "bad-number",
    source: "resistor R1 a gnd 4k7",
    expected: [
      "t.onset:1:19: error: '4k7' is not a number",
      "  resistor R1 a gnd 4k7",
      "                    ^~~",
      "hint: write the decimal point: 4.7k",
    ].join("\n"),
  },
  {
    code: "unit-mismatch",
    source: "capacitor C1 a gnd 47nH\nresistor R a gnd 1k",
    expected: [
      "t.onset:1:20: error: unit mismatch: '47nH' is in henries (H), but the value of capacitor C1 is in farads (F)",
      "  capacitor C1 a gnd 47nH",
      "                     ^~~~",
      "hint: write 47n or 47nF",
    ].join("\n"),
  },
  {
    code: "unit-mismatch",
    source: "resistor R1 a gnd 10%",
    expected: [
      "t.onset:1:19: error: unit mismatch: '10%' is in percent, but the value of resistor R1 is in ohms (Ω)",
      "  resistor R1 a gnd 10%",
      "                    ^~~",
      "hint: write 10 or 10Ω",
    ].join("\n"),
  },
  {
    code: "unit-mismatch",
    source: "vcvs E1 o gnd a gnd 2dB\nresistor R o gnd 1k\nresistor R2 a gnd 1k",
    expected: [
      "t.onset:1:21: error: unit mismatch: '2dB' is in decibels, but the value of vcvs E1 is a plain ratio",
      "  vcvs E1 o gnd a gnd 2dB",
      "                      ^~~",
      "hint: write a plain number such as 2 or a percentage",
    ].join("\n"),
  },
  {
    code: "unit-mismatch",
    source: "param C = 33nF\nresistor R1 a gnd (C)",
    expected: [
      "t.onset:2:20: error: unit mismatch: parameter C is in farads (F), but the value of resistor R1 is in ohms (Ω)",
      "  resistor R1 a gnd (C)",
      "                     ^",
      "hint: use a parameter in ohms (Ω) here",
    ].join("\n"),
  },
  {
    code: "unit-mismatch",
    source: "resistor R1 a gnd 1k\nsweep R1 from=1V to=2k steps=3",
    expected: [
      "t.onset:2:15: error: unit mismatch: '1V' is in volts (V), but from= of sweep is in ohms (Ω)",
      "  sweep R1 from=1V to=2k steps=3",
      "                ^~",
      "hint: write 1 or 1Ω",
    ].join("\n"),
  },
  {
    code: "unit-in-expression",
    source: "resistor R1 a gnd (2*1kΩ)",
    expected: [
      "t.onset:1:22: error: unit 'Ω' inside an expression",
      "  resistor R1 a gnd (2*1kΩ)",
      "                       ^~~",
      "hint: write 1k without the unit: units are checked where a value stands alone",
    ].join("\n"),
  },
  {
    code: "out-of-range",
    source: "resistor R1 a gnd -1k",
    expected: [
      "t.onset:1:19: error: the value of resistor R1 must be greater than 0 Ω, got -1k Ω",
      "  resistor R1 a gnd -1k",
      "                    ^~~",
      "hint: the value is the resistance",
    ].join("\n"),
  },
  {
    code: "out-of-range",
    source: "pot P1 a w gnd 10k at=1.2\nresistor R a gnd 1k",
    expected: [
      "t.onset:1:23: error: at= of pot P1 must be between 0 and 1, got 1.2",
      "  pot P1 a w gnd 10k at=1.2",
      "                        ^~~",
      "hint: at= is the wiper position, measured from end1: the fraction of the track between end1 and the wiper (0 at end1, 1 at end2)",
    ].join("\n"),
  },
  {
    code: "out-of-range",
    source: "vsource V1 a gnd 1\npot P1 a w gnd 10k\nresistor R w gnd 1k\nbias\nsweep P1.at from=0 to=1.5 steps=3",
    expected: [
      "t.onset:5:23: error: to= of sweep P1.at must be between 0 and 1, got 1.5",
      "  sweep P1.at from=0 to=1.5 steps=3",
      "                        ^~~",
      "hint: P1.at is the wiper position, measured from end1: the fraction of the track between end1 and the wiper (0 at end1, 1 at end2)",
    ].join("\n"),
  },
  {
    code: "out-of-range",
    source: "opamp U1 p n o rails=(-1, 1)\nresistor R o gnd 1k\nresistor Rp p gnd 1k\nresistor Rn n gnd 1k",
    expected: [
      "t.onset:1:1: error: opamp U1: rails (-1, 1) V leave no output range with headroom 1.5 V",
      "  opamp U1 p n o rails=(-1, 1)",
      "  ^~~~~~~~~~~~~~~~~~~~~~~~~~~~",
      "hint: write rails=(neg, pos) with neg < pos and more than 2·headroom between them",
    ].join("\n"),
  },
  {
    code: "out-of-range",
    source: "diode D1 a gnd emission=0\nresistor R a gnd 1k",
    expected: [
      "t.onset:1:25: error: emission= of diode D1 must be greater than 0, got 0",
      "  diode D1 a gnd emission=0",
      "                          ^",
      "hint: emission= is the emission coefficient n",
    ].join("\n"),
  },
  {
    code: "not-integer",
    source: "resistor R1 a gnd 1k\ntolerance runs=2.5",
    expected: [
      "t.onset:2:16: error: runs= of tolerance must be a whole number, got 2.5",
      "  tolerance runs=2.5",
      "                 ^~~",
      "hint: runs= is the number of Monte Carlo samples",
    ].join("\n"),
  },
  {
    code: "duplicate-name",
    source: "resistor R1 a gnd 1k\nresistor R2 a gnd 1k\nresistor R1 a gnd 2k",
    expected: [
      "t.onset:3:10: error: 'R1' is already defined, as resistor R1",
      "  resistor R1 a gnd 2k",
      "           ^~",
      "hint: parameters, parts and instances share one set of names: give each its own",
      "note: first defined at t.onset:1",
    ].join("\n"),
  },
  {
    code: "duplicate-name",
    source: "param R = 1k\nresistor R a gnd (R)",
    expected: [
      "t.onset:2:10: error: 'R' is already defined, as parameter R",
      "  resistor R a gnd (R)",
      "           ^",
      "hint: parameters, parts and instances share one set of names: give each its own",
      "note: first defined at t.onset:1",
    ].join("\n"),
  },
  {
    code: "duplicate-name",
    source: "block b (x)\nend\nblock b (y)\nend",
    expected: [
      "t.onset:3:7: error: block 'b' is already defined",
      "  block b (y)",
      "        ^",
      "hint: give each one its own name",
      "note: first defined at t.onset:1",
    ].join("\n"),
  },
  {
    code: "duplicate-title",
    source: "title \"x\"\ntitle \"y\"",
    expected: [
      "t.onset:2:1: error: the program already has a title",
      "  title \"y\"",
      "  ^~~~~~~~~",
      "hint: keep one title line",
      "note: first title at t.onset:1",
    ].join("\n"),
  },
  {
    code: "duplicate-option",
    source: "pot P1 a w gnd 10k at=0.5 at=0.6\nresistor R a gnd 1k",
    expected: [
      "t.onset:1:27: error: at= is given twice on pot P1",
      "  pot P1 a w gnd 10k at=0.5 at=0.6",
      "                            ^~",
      "hint: keep one of them",
    ].join("\n"),
  },
  {
    code: "reserved-name",
    source: "param pi = 3",
    expected: [
      "t.onset:1:7: error: 'pi' is reserved and cannot name a parameter",
      "  param pi = 3",
      "        ^~",
      "hint: choose another name",
    ].join("\n"),
  },
  {
    code: "unknown-option",
    source: "resistor R1 a gnd 1k tol=1%",
    expected: [
      "t.onset:1:22: error: resistor R1 has no option 'tol='",
      "  resistor R1 a gnd 1k tol=1%",
      "                       ^~~",
      "hint: options of resistor: none",
    ].join("\n"),
  },
  {
    code: "unknown-option",
    source: "vsource V1 a gnd wave=sine amp=1 freq=1k low=0\nresistor R a gnd 1k",
    expected: [
      "t.onset:1:42: error: vsource V1 has no option 'low='",
      "  vsource V1 a gnd wave=sine amp=1 freq=1k low=0",
      "                                           ^~~",
      "hint: low= belongs to wave=pulse",
    ].join("\n"),
  },
  {
    code: "unknown-option",
    source: "resistor R1 a gnd 1k\ntransient until=1m foo=2",
    expected: [
      "t.onset:2:20: error: transient has no option 'foo='",
      "  transient until=1m foo=2",
      "                     ^~~",
      "hint: options of transient: until= max-step= start= probes= accuracy= accuracy-floor=",
    ].join("\n"),
  },
  {
    code: "unknown-option",
    source: "resistor R1 a gnd 1k\nbias until=1m",
    expected: [
      "t.onset:2:6: error: bias has no option 'until='",
      "  bias until=1m",
      "       ^~~~~",
      "hint: bias takes no options",
    ].join("\n"),
  },
  {
    code: "unknown-option",
    source: "resistor R1 a gnd 1k\nsweep R1 from=1k to=2k steps=3 lin",
    expected: [
      "t.onset:2:32: error: sweep has no flag 'lin'",
      "  sweep R1 from=1k to=2k steps=3 lin",
      "                                 ^~~",
      "hint: the only flag of sweep is log",
    ].join("\n"),
  },
  {
    code: "missing-value",
    source: "resistor R1 a gnd\nresistor R2 a gnd 1k",
    expected: [
      "t.onset:1:1: error: resistor R1 needs a value (resistance in Ω)",
      "  resistor R1 a gnd",
      "  ^~~~~~~~~~~~~~~~~",
      "hint: write the value after the 2 nodes, e.g. resistor R1 a gnd 10k",
    ].join("\n"),
  },
  {
    code: "missing-option",
    source: "vsource V1 a gnd wave=sine amp=1\nresistor R a gnd 1k",
    expected: [
      "t.onset:1:1: error: vsource V1 with wave=sine needs freq=",
      "  vsource V1 a gnd wave=sine amp=1",
      "  ^~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~",
      "hint: freq= is the frequency",
    ].join("\n"),
  },
  {
    code: "missing-option",
    source: "resistor R1 a gnd 1k\ntransient",
    expected: [
      "t.onset:2:1: error: transient needs until=",
      "  transient",
      "  ^~~~~~~~~",
      "hint: until= is the end time",
    ].join("\n"),
  },
  {
    code: "missing-option",
    source: "resistor R1 a gnd 1k\nsweep R1 from=1k to=2k",
    expected: [
      "t.onset:2:1: error: sweep needs steps= or step=",
      "  sweep R1 from=1k to=2k",
      "  ^~~~~",
      "hint: steps= counts the values (both ends included); step= is the increment",
    ].join("\n"),
  },
  {
    code: "conflicting-options",
    source: "vsource V1 a gnd 1 wave=sine amp=1 freq=1k\nresistor R a gnd 1k",
    expected: [
      "t.onset:1:18: error: vsource V1 has both a DC value and wave=sine",
      "  vsource V1 a gnd 1 wave=sine amp=1 freq=1k",
      "                   ^",
      "hint: remove the value, or remove wave= for a DC source",
    ].join("\n"),
  },
  {
    code: "conflicting-options",
    source: "resistor R1 a gnd 1k\nsweep R1 from=1k to=2k steps=3 step=1k",
    expected: [
      "t.onset:2:32: error: sweep takes steps= or step=, not both",
      "  sweep R1 from=1k to=2k steps=3 step=1k",
      "                                 ^~~~~~~",
      "hint: keep one of them",
    ].join("\n"),
  },
  {
    code: "bad-word",
    source: "pot P1 a w gnd 10k taper=log\nresistor R a gnd 1k",
    expected: [
      "t.onset:1:26: error: taper=log is not a choice for pot P1",
      "  pot P1 a w gnd 10k taper=log",
      "                           ^~~",
      "hint: taper= is one of linear, audio",
    ].join("\n"),
  },
  {
    code: "bad-word",
    source: "resistor R1 a gnd 1k\ntransient until=1m start=cold",
    expected: [
      "t.onset:2:26: error: start=cold is not a choice for transient",
      "  transient until=1m start=cold",
      "                           ^~~~",
      "hint: start= is one of bias, rest",
    ].join("\n"),
  },
  {
    code: "expected-word",
    source: "pot P1 a w gnd 10k taper=1\nresistor R a gnd 1k",
    expected: [
      "t.onset:1:26: error: taper= of pot P1 takes a word, not '1'",
      "  pot P1 a w gnd 10k taper=1",
      "                           ^",
      "hint: write one of: linear, audio",
    ].join("\n"),
  },
  {
    code: "expected-number",
    source: "pot P1 a w gnd 10k at=half\nresistor R a gnd 1k",
    expected: [
      "t.onset:1:23: error: at= of pot P1 takes a number, not 'half'",
      "  pot P1 a w gnd 10k at=half",
      "                        ^~~~",
      "hint: write a number such as 10k, or an expression in ( )",
    ].join("\n"),
  },
  {
    code: "expected-pair",
    source: "opamp U1 p n o rails=12\nresistor R o gnd 1k\nresistor Rp p gnd 1k\nresistor Rn n gnd 1k",
    expected: [
      "t.onset:1:22: error: rails= of opamp U1 takes two numbers in parentheses",
      "  opamp U1 p n o rails=12",
      "                       ^~",
      "hint: write e.g. rails=(-12, 12)",
    ].join("\n"),
  },
  {
    code: "expected-points",
    source: "vsource V1 a gnd wave=steps points=5\nresistor R a gnd 1k",
    expected: [
      "t.onset:1:36: error: points= of vsource V1 takes a list of points in [ ]",
      "  vsource V1 a gnd wave=steps points=5",
      "                                     ^",
      "hint: write e.g. points=[0 0, 1m 5, 2m 0]",
    ].join("\n"),
  },
  {
    code: "bad-points",
    source: "vsource V1 a gnd wave=steps points=[0 0 1]\nresistor R a gnd 1k",
    expected: [
      "t.onset:1:37: error: each point of points= is a time and a level, but this one has 3 numbers",
      "  vsource V1 a gnd wave=steps points=[0 0 1]",
      "                                      ^~~~~",
      "hint: separate points with commas: [t0 v0, t1 v1, ...]",
    ].join("\n"),
  },
  {
    code: "unexpected-list",
    source: "resistor R1 a gnd (1k, 2k)",
    expected: [
      "t.onset:1:19: error: the value of resistor R1 takes one number, not a list of 2",
      "  resistor R1 a gnd (1k, 2k)",
      "                    ^~~~~~~~",
      "hint: remove the commas, or write the list where a pair is expected",
    ].join("\n"),
  },
  {
    code: "tolerance-here",
    source: "resistor R1 a gnd 1k\ntransient until=1m±1%",
    expected: [
      "t.onset:2:19: error: until= of transient cannot have a tolerance",
      "  transient until=1m±1%",
      "                    ^~~",
      "hint: tolerances go on part values, part options and parameters",
    ].join("\n"),
  },
  {
    code: "tolerance-here",
    source: "resistor R1 a gnd 1k\nspec thd<0.5%±1%",
    expected: [
      "t.onset:2:14: error: thd<… takes a plain limit, not a tolerance",
      "  spec thd<0.5%±1%",
      "               ^~~",
      "hint: write thd=value±band for a band",
    ].join("\n"),
  },
  {
    code: "unknown-param",
    source: "param Rbase = 1k\nresistor R1 a gnd (Rbse*2)",
    expected: [
      "t.onset:2:20: error: unknown parameter 'Rbse' (did you mean 'Rbase'?)",
      "  resistor R1 a gnd (Rbse*2)",
      "                     ^~~~",
      "hint: define it with: param Rbse = …",
    ].join("\n"),
  },
  {
    code: "param-cycle",
    source: "param R = (R2)\nparam R2 = (R)\nresistor R1 a gnd (R)",
    expected: [
      "t.onset:1:7: error: parameter 'R' depends on itself",
      "  param R = (R2)",
      "        ^",
      "hint: a parameter's expression cannot use it, directly or through others",
    ].join("\n"),
  },
  {
    code: "unknown-function",
    source: "resistor R1 a gnd (sqr(2))",
    expected: [
      "t.onset:1:20: error: unknown function 'sqr' (did you mean 'sqrt'?)",
      "  resistor R1 a gnd (sqr(2))",
      "                     ^~~",
      "hint: functions are sqrt, exp, ln, log10, sin, cos, tan, atan, abs, min, max",
    ].join("\n"),
  },
  {
    code: "bad-arity",
    source: "resistor R1 a gnd (sqrt(1, 2))",
    expected: [
      "t.onset:1:20: error: sqrt() takes 1 argument, got 2",
      "  resistor R1 a gnd (sqrt(1, 2))",
      "                     ^~~~~~~~~~",
      "hint: write sqrt(x)",
    ].join("\n"),
  },
  {
    code: "math-error",
    source: "resistor R1 a gnd (1/0)",
    expected: [
      "t.onset:1:20: error: division by zero",
      "  resistor R1 a gnd (1/0)",
      "                     ^~~",
      "hint: check the parameters used in the divisor",
    ].join("\n"),
  },
  {
    code: "math-error",
    source: "resistor R1 a gnd (sqrt(-1))",
    expected: [
      "t.onset:1:20: error: sqrt(-1) is not a finite real number",
      "  resistor R1 a gnd (sqrt(-1))",
      "                     ^~~~~~~~",
      "hint: check the argument's range",
    ].join("\n"),
  },
  {
    code: "unknown-preset",
    source: "opamp U1 p n o preset=genral\nresistor R o gnd 1k",
    expected: [
      "t.onset:1:23: error: unknown preset 'genral' for opamp U1 (did you mean 'general'?)",
      "  opamp U1 p n o preset=genral",
      "                        ^~~~~~",
      "hint: presets for opamp: general, fast, precision, ideal",
    ].join("\n"),
  },
  {
    code: "preset-kind",
    source: "preset p vsource wave=sine amp=1 freq=1k\nopamp U1 p n o preset=p\nresistor R o gnd 1k",
    expected: [
      "t.onset:2:23: error: preset p is for vsource parts, not opamp",
      "  opamp U1 p n o preset=p",
      "                        ^",
      "hint: use a preset defined for opamp parts here",
    ].join("\n"),
  },
  {
    code: "unknown-block",
    source: "block notch (a, b)\nend\nuse N1 noch a b\nresistor R a gnd 1k",
    expected: [
      "t.onset:3:8: error: unknown block 'noch' (did you mean 'notch'?)",
      "  use N1 noch a b",
      "         ^~~~",
      "hint: define it with: block noch (ports) … end",
    ].join("\n"),
  },
  {
    code: "port-count",
    source: "block b (x, y) R=1k\n  resistor Ra x y (R)\nend\nuse N1 b a\n",
    expected: [
      "t.onset:4:10: error: block b has 2 ports (x, y), but 1 node is written for N1",
      "  use N1 b a",
      "           ^",
      "hint: write one node per port after the block name: use N1 b x y",
    ].join("\n"),
  },
  {
    code: "unknown-block-param",
    source: "block b (x, y) R=1k\n  resistor Ra x y (R)\nend\nuse N1 b a gnd Q=2\nresistor R a gnd 1k",
    expected: [
      "t.onset:4:16: error: block b has no parameter 'Q' (did you mean 'R'?)",
      "  use N1 b a gnd Q=2",
      "                 ^",
      "hint: parameters of b: R",
    ].join("\n"),
  },
  {
    code: "missing-block-param",
    source: "block b (x) R\n  resistor Ra x gnd (R)\nend\nuse N1 b o\nresistor R o gnd 1k",
    expected: [
      "t.onset:4:5: error: N1 needs R= (block b gives it no default)",
      "  use N1 b o",
      "      ^~",
      "hint: write R=… on the use line",
    ].join("\n"),
  },
  {
    code: "block-cycle",
    source: "block a (x)\n  use B1 b x\nend\nblock b (y)\n  use A1 a y\nend\nuse N1 a o\nresistor R o gnd 1k",
    expected: [
      "t.onset:5:10: error: block 'a' uses itself",
      "    use A1 a y",
      "           ^",
      "hint: a block cannot contain an instance of itself, directly or through other blocks",
      "note: uses: a → b → a",
    ].join("\n"),
  },
  {
    code: "unknown-node",
    source: "resistor R1 n1 gnd 1k\ntransient until=1m probes=(n2)",
    expected: [
      "t.onset:2:28: error: unknown node 'n2' (did you mean 'n1'?)",
      "  transient until=1m probes=(n2)",
      "                             ^~",
      "hint: a probe names a node that a part touches (hierarchical inside instances: N1.m1), a difference (o, ref), a current R1.i or a part's state such as U1.pole",
    ].join("\n"),
  },
  {
    code: "unknown-state",
    source: "resistor R1 o gnd 1k\nopamp U1 gnd o o\ntransient until=1m probes=(o, U1.pol)",
    expected: [
      "t.onset:3:31: error: opamp U1 has no state 'pol' (did you mean 'U1.pole'?)",
      "  transient until=1m probes=(o, U1.pol)",
      "                                ^~~~~~",
      "hint: U1 can be probed as U1.pole, U1.i",
    ].join("\n"),
  },
  {
    code: "unknown-node",
    source: "resistor R1 o gnd 1k\nstartup probe=out",
    expected: [
      "t.onset:2:15: error: unknown node 'out' (did you mean 'o'?)",
      "  startup probe=out",
      "                ^~~",
      "hint: a probe names a node that a part touches (hierarchical inside instances: N1.m1), a difference (o, ref), a current R1.i or a part's state such as U1.pole",
    ].join("\n"),
  },
  {
    code: "unknown-part",
    source: "resistor R1 a gnd 1k\ntransient until=1m probes=(Rx.i)",
    expected: [
      "t.onset:2:28: error: unknown part 'Rx' in probe 'Rx.i' (did you mean 'R1'?)",
      "  transient until=1m probes=(Rx.i)",
      "                             ^~~~",
      "hint: a current probe names a part: R1.i is the current through R1 from its first pin to its second",
    ].join("\n"),
  },
  {
    code: "unknown-part",
    source: "resistor R1 a gnd 1k\nresponse from=V9 to=a",
    expected: [
      "t.onset:2:15: error: unknown part 'V9'",
      "  response from=V9 to=a",
      "                ^~",
      "hint: from= names a vsource or isource of the circuit",
    ].join("\n"),
  },
  {
    code: "not-a-source",
    source: "resistor R1 a gnd 1k\nresponse from=R1 to=a",
    expected: [
      "t.onset:2:15: error: from= of response must name a vsource or isource, but R1 is a resistor",
      "  response from=R1 to=a",
      "                ^~",
      "hint: add a source where the small signal enters",
    ].join("\n"),
  },
  {
    code: "bad-probe",
    source: "resistor R1 a gnd 1k\ntransient until=1m probes=(a, (a, 1))",
    expected: [
      "t.onset:2:35: error: '1' is not a probe",
      "  transient until=1m probes=(a, (a, 1))",
      "                                    ^",
      "hint: a probe is a node (o), a difference (o, ref), a current (R1.i) or a part's state (U1.pole)",
    ].join("\n"),
  },
  {
    code: "unknown-target",
    source: "resistor R1 a gnd 1k\nsweep Rx from=1k to=2k steps=3",
    expected: [
      "t.onset:2:7: error: cannot sweep 'Rx': no parameter, part value or part option has that name (did you mean 'R1'?)",
      "  sweep Rx from=1k to=2k steps=3",
      "        ^~",
      "hint: sweep a parameter (R), a part's value (Ra), a part option (P1.at) or an instance parameter (N1.R)",
    ].join("\n"),
  },
  {
    code: "unknown-metric",
    source: "resistor R1 a gnd 1k\nspec freq=1k±1%",
    expected: [
      "t.onset:2:6: error: unknown spec metric 'freq' (did you mean 'frequency'?)",
      "  spec freq=1k±1%",
      "       ^~~~",
      "hint: metrics are frequency, amplitude, thd, startup, settling, offset, rms, peak-to-peak, yield",
    ].join("\n"),
  },
  {
    code: "spec-form",
    source: "resistor R1 a gnd 1k\nspec frequency=1k",
    expected: [
      "t.onset:2:6: error: frequency=… needs a band",
      "  spec frequency=1k",
      "       ^~~~~~~~~~~~",
      "hint: write frequency=value±tolerance or frequency=low..high, or use < or >",
    ].join("\n"),
  },
  {
    code: "bad-range",
    source: "resistor R1 a gnd 1k\nspec amplitude=5..3",
    expected: [
      "t.onset:2:6: error: the range of amplitude runs backwards (amplitude=5..3)",
      "  spec amplitude=5..3",
      "       ^~~~~~~~~~~~~~",
      "hint: write the lower limit first",
    ].join("\n"),
  },
  {
    code: "include-missing",
    source: "include \"parts/x.onset\"\nresistor R a gnd 1k",
    expected: [
      "t.onset:1:9: error: cannot find included file 'parts/x.onset'",
      "  include \"parts/x.onset\"",
      "          ^~~~~~~~~~~~~~~",
      "hint: the path is relative to the folder of the including file",
    ].join("\n"),
  },
  {
    code: "include-cycle",
    source: "include \"b.onset\"\nresistor R a gnd 1k", files: {"b.onset": "include \"t.onset\"\n"},
    expected: [
      "b.onset:1:9: error: including 't.onset' leads back to 't.onset'",
      "  include \"t.onset\"",
      "          ^~~~~~~~~",
      "hint: move the shared definitions into a file that both include",
      "note: include chain: t.onset → b.onset → t.onset",
    ].join("\n"),
  },
  {
    code: "no-dc-path",
    source: "capacitor C1 a gnd 1n\nisource I1 gnd a 1m",
    expected: [
      "t.onset:1:1: error: node 'a' has no DC path to gnd",
      "  capacitor C1 a gnd 1n",
      "  ^~~~~~~~~~~~~~~~~~~~~",
      "hint: only capacitors or current sources reach these nodes, so their DC voltage is undefined: add a resistor to gnd (a large one is enough)",
      "note: capacitor C1 touches 'a'",
      "note: isource I1 touches 'a'",
    ].join("\n"),
  },
  {
    code: "voltage-loop",
    source: "vsource V1 a gnd 1\nvsource V2 a gnd 2",
    expected: [
      "t.onset:2:1: error: parts 'V2', 'V1' form a loop of voltage sources",
      "  vsource V2 a gnd 2",
      "  ^~~~~~~~~~~~~~~~~~",
      "hint: a loop of ideal voltage constraints has no unique current: add a series resistance (inductor series=) or remove one source",
      "note: vsource V2 between 'a' and 'gnd'",
      "note: vsource V1 between 'a' and 'gnd'",
    ].join("\n"),
  },
  {
    code: "dangling-node",
    source: "resistor R1 a gnd 1k\nresistor R2 a b 1k", warnings: true,
    expected: [
      "t.onset:2:1: warning: node 'b' is touched by one pin only (resistor R2)",
      "  resistor R2 a b 1k",
      "  ^~~~~~~~~~~~~~~~~~",
      "hint: check the node name for a typo, or connect the pin",
    ].join("\n"),
  },
  {
    code: "ground-case",
    source: "resistor R1 a Gnd 1k\nresistor R2 a gnd 1k", warnings: true,
    expected: [
      "t.onset:1:1: warning: node 'Gnd' is not ground: names are case-sensitive",
      "  resistor R1 a Gnd 1k",
      "  ^~~~~~~~~~~~~~~~~~~~",
      "hint: write gnd for the ground node",
      "",
      "t.onset:1:1: warning: node 'Gnd' is touched by one pin only (resistor R1)",
      "  resistor R1 a Gnd 1k",
      "  ^~~~~~~~~~~~~~~~~~~~",
      "hint: check the node name for a typo, or connect the pin",
    ].join("\n"),
  },
  {
    code: "yield-without-tolerance",
    source: "resistor R1 a gnd 1k\nspec yield>99%", warnings: true,
    expected: [
      "t.onset:2:6: warning: yield is only measured under a tolerance analysis",
      "  spec yield>99%",
      "       ^~~~~~~~~",
      "hint: add a line such as: tolerance runs=200",
      "",
      "t.onset:1:1: warning: node 'a' is touched by one pin only (resistor R1)",
      "  resistor R1 a gnd 1k",
      "  ^~~~~~~~~~~~~~~~~~~~",
      "hint: check the node name for a typo, or connect the pin",
    ].join("\n"),
  },
  {
    code: "shared-tolerance",
    source: "param R = 15.8k±1%\nresistor R1 a gnd (R)\nresistor R2 a gnd (R)\nvsource V1 a gnd 1\ntolerance runs=10", warnings: true,
    expected: [
      "t.onset:1:11: warning: parameter R is drawn once per sample and shared by 2 parts (R1, R2)",
      "  param R = 15.8k±1%",
      "            ^~~~~~~~",
      "hint: one draw suits matched parts (a resistor network, a dual capacitor); for separate components write: param R = 15.8k±1% each",
    ].join("\n"),
  },
  {
    code: "each-without-tolerance",
    source: "param R = 15.8k each\nresistor R1 a gnd (R)",
    expected: [
      "t.onset:1:17: error: parameter R is marked each but has no tolerance to draw",
      "  param R = 15.8k each",
      "                  ^~~~",
      "hint: write a tolerance on the value, e.g. param R = 10k±1% each, or remove each",
    ].join("\n"),
  },
  {
    code: "conflicting-options",
    source: "resistor R1 o gnd 1k\nstartup probe=o harmonics=20 bandwidth=20k",
    expected: [
      "t.onset:2:30: error: startup takes harmonics= or bandwidth=, not both",
      "  startup probe=o harmonics=20 bandwidth=20k",
      "                               ^~~~~~~~~",
      "hint: harmonics= counts orders 2 … N; bandwidth= counts the harmonics below a frequency",
    ].join("\n"),
  },
  {
    code: "bad-word",
    source: "resistor R1 o gnd 1k\nsweep R1 from=1k to=2k steps=3 measure=steadyy",
    expected: [
      "t.onset:2:40: error: measure=steadyy is not a choice for sweep (did you mean 'steady'?)",
      "  sweep R1 from=1k to=2k steps=3 measure=steadyy",
      "                                         ^~~~~~~",
      "hint: measure= is one of startup, steady",
    ].join("\n"),
  },
  {
    code: "bad-word",
    source: "resistor R1 o gnd 1k\nstartup probe=o kick=termal",
    expected: [
      "t.onset:2:22: error: kick=termal is not a choice for startup (did you mean 'thermal'?)",
      "  startup probe=o kick=termal",
      "                       ^~~~~~",
      "hint: kick= is one of thermal, power-on, noise, none",
    ].join("\n"),
  },
  {
    code: "out-of-range",
    source: "resistor R1 o gnd 1k\nstartup probe=o temperature=-300",
    expected: [
      "t.onset:2:29: error: temperature= of startup must be greater than -273.15 and at most 1k, got -300",
      "  startup probe=o temperature=-300",
      "                              ^~~~",
      "hint: temperature= is the temperature in °C of the resistances (their noise under kick=thermal and power-on) and the ambient of lamps and thermistors",
    ].join("\n"),
  },
  {
    code: "out-of-range",
    source: "resistor R1 o gnd 1k\nsteady probe=o temperature=-273.15",
    expected: [
      "t.onset:2:28: error: temperature= of steady must be greater than -273.15 and at most 1k, got -273.15",
      "  steady probe=o temperature=-273.15",
      "                             ^~~~~~~",
      "hint: temperature= is the temperature in °C: the ambient of lamps and thermistors, and of the resistances' noise the predicted start-up time grows from (default 27)",
    ].join("\n"),
  },
  {
    code: "out-of-range",
    source: "lamp L1 a gnd 50 hot=40 rated=12 tau=0.1\nresistor R1 a gnd 1k",
    expected: [
      "t.onset:1:1: error: lamp L1: the hot resistance (40 Ω) must exceed the cold resistance (50 Ω)",
      "  lamp L1 a gnd 50 hot=40 rated=12 tau=0.1",
      "  ^~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~",
      "hint: a filament's resistance rises as it heats: hot= is typically 5 to 15 times the cold value",
    ].join("\n"),
  },
  {
    code: "missing-option",
    source: "lamp L1 a gnd 50 hot=500 tau=0.1\nresistor R1 a gnd 1k",
    expected: [
      "t.onset:1:1: error: lamp L1 needs rated=",
      "  lamp L1 a gnd 50 hot=500 tau=0.1",
      "  ^~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~",
      "hint: add rated= (rated voltage, at which the resistance is hot=)",
    ].join("\n"),
  },
  {
    code: "out-of-range",
    source: "jfet J1 d g gnd idss=8m pinchoff=2\nresistor R1 d gnd 1k\nresistor R2 g gnd 1k",
    expected: [
      "t.onset:1:1: error: jfet J1: the pinch-off voltage of a type=n jfet must be negative, got 2 V",
      "  jfet J1 d g gnd idss=8m pinchoff=2",
      "  ^~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~",
      "hint: an n-channel part pinches off with its gate below its source: write e.g. pinchoff=-2 (or type=p)",
    ].join("\n"),
  },
  {
    code: "unit-mismatch",
    source: "thermistor TH1 a gnd 10k beta=3500 dissipation=2mV tau=1\nresistor R1 a gnd 1k",
    expected: [
      "t.onset:1:48: error: unit mismatch: '2mV' is in volts (V), but dissipation= of thermistor TH1 is in watts per kelvin (W/K, e.g. 2mW/K)",
      "  thermistor TH1 a gnd 10k beta=3500 dissipation=2mV tau=1",
      "                                                 ^~~",
      "hint: write 2m or 2mW/K",
    ].join("\n"),
  },
  {
    code: "not-integer",
    source: "resistor R1 o gnd 1k\nstartup probe=o seeds=2.5",
    expected: [
      "t.onset:2:23: error: seeds= of startup must be a whole number, got 2.5",
      "  startup probe=o seeds=2.5",
      "                        ^~~",
      "hint: seeds= is the number of seeds (seed, seed+1, …) the start-up runs with, for the spread of the start-up time",
    ].join("\n"),
  },
  {
    code: "out-of-range",
    source: "resistor R1 o gnd 1k\nstartup probe=o seeds=0",
    expected: [
      "t.onset:2:23: error: seeds= of startup must be between 1 and 10000, got 0",
      "  startup probe=o seeds=0",
      "                        ^",
      "hint: seeds= is the number of seeds (seed, seed+1, …) the start-up runs with, for the spread of the start-up time",
    ].join("\n"),
  },
  {
    code: "out-of-range",
    source: "resistor R1 o gnd 1k\nsteady probe=o harmonics=1",
    expected: [
      "t.onset:2:26: error: harmonics= of steady must be between 2 and 1000, got 1",
      "  steady probe=o harmonics=1",
      "                           ^",
      "hint: harmonics= is the highest harmonic order the THD counts, from 2 (default 30)",
    ].join("\n"),
  },
  {
    code: "out-of-range",
    source: "resistor R1 o gnd 1k\nsteady probe=o bandwidth=0",
    expected: [
      "t.onset:2:26: error: bandwidth= of steady must be greater than 0 Hz, got 0 Hz",
      "  steady probe=o bandwidth=0",
      "                           ^",
      "hint: bandwidth= is the frequency below which the THD counts the harmonics (at most 1000 of them), instead of harmonics=",
    ].join("\n"),
  },
  {
    code: "out-of-range",
    source: "resistor R1 o gnd 1k\nstartup probe=o settle-within=0",
    expected: [
      "t.onset:2:31: error: settle-within= of startup must be greater than 0 s, got 0 s",
      "  startup probe=o settle-within=0",
      "                                ^",
      "hint: settle-within= is the longest an until=auto run may go before it must have settled (default 4000 predicted periods)",
    ].join("\n"),
  },
  {
    code: "out-of-range",
    source: "resistor R1 o gnd 1k\nstartup probe=o ramp=-1m kick=power-on",
    expected: [
      "t.onset:2:22: error: ramp= of startup must be at least 0 s, got -1m s",
      "  startup probe=o ramp=-1m kick=power-on",
      "                       ^~~",
      "hint: ramp= is the time the DC levels take to rise from 0 (kick=power-on)",
    ].join("\n"),
  },
  {
    code: "unused-option",
    source: "capacitor C1 o gnd 1u\nresistor R1 o gnd 1k\nstartup probe=o kick=thermal ramp=2m", warnings: true,
    expected: [
      "t.onset:3:30: warning: ramp= has no effect with kick=thermal",
      "  startup probe=o kick=thermal ramp=2m",
      "                               ^~~~",
      "hint: ramp= is the time the DC levels take to rise from 0 (kick=power-on); it acts with kick=power-on",
    ].join("\n"),
  },
  {
    code: "unused-option",
    source: "capacitor C1 o gnd 1u\nresistor R1 o gnd 1k\nstartup probe=o until=10m settle-within=2", warnings: true,
    expected: [
      "t.onset:3:27: warning: settle-within= has no effect with a fixed until=",
      "  startup probe=o until=10m settle-within=2",
      "                            ^~~~~~~~~~~~~",
      "hint: settle-within= bounds until=auto; with until= a time, the run stops there",
    ].join("\n"),
  },
  {
    code: "unit-mismatch",
    source: "opamp U1 p gnd o noise=20nV\nresistor R1 o p 1k",
    expected: [
      "t.onset:1:24: error: unit mismatch: '20nV' is in volts (V), but noise= of opamp U1 is in volts per root hertz (V/rtHz or V/√Hz, e.g. 20nV/rtHz)",
      "  opamp U1 p gnd o noise=20nV",
      "                         ^~~~",
      "hint: write 20n or 20nV/√Hz",
    ].join("\n"),
  },
  {
    code: "conflicting-options",
    source: "opamp U1 p gnd o noise=20nV/rtHz gbw=inf\nresistor R1 o p 1k",
    expected: [
      "t.onset:1:1: error: opamp U1: gbw=inf leaves the slew limit nothing to act on",
      "  opamp U1 p gnd o noise=20nV/rtHz gbw=inf",
      "  ^~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~",
      "hint: the slew rate limits how fast the pole's capacitance charges; with gbw=inf write slew=inf too (or give a finite gbw=)",
    ].join("\n"),
  },
  {
    code: "out-of-range",
    source: "vsource V1 a gnd wave=pulse low=0 high=1 rise=1m fall=1m width=0.5m period=2m\nresistor R1 a gnd 1k",
    expected: [
      "t.onset:1:1: error: vsource V1: rise + width + fall (0.0025 s) is longer than the period (0.002 s)",
      "  vsource V1 a gnd wave=pulse low=0 high=1 rise=1m fall=1m width=0.5m period=2m",
      "  ^~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~~",
      "hint: shorten width= or the edges: width = period − rise − fall leaves no time at low; width=0 with rise + fall = period is a triangle",
    ].join("\n"),
  },
];

describe("diagnostics: exact text and position for every error kind", () => {
  for (const c of cases) {
    test(`${c.code}: ${JSON.stringify(c.source.split("\n")[0])}`, () => {
      const options = { files: c.files ?? {}, warnings: c.warnings ?? false };
      expect(diagnose(c.source, options).diagnostics[0]?.code).toBe(c.code);
      expect(report(c.source, options)).toBe(c.expected);
    });
  }
});

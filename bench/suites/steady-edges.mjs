// Issue 15's edges: the steady analysis, its studies and --sample given hostile and degenerate
// inputs, each run through the built command in a process of its own: what it ends in, its wall
// time and peak memory. test/hostile/hostile-input.test.ts and test/core/analyses/steady-edges.test.ts
// assert the outcomes; this prints the figures.
import { rmSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { commandDir, measure, outcomeOf } from "../command-run.mjs";
import { printTable } from "../table.mjs";

export const title = "Steady analysis at its edges: what each input ends in, its time and its peak memory";

/** A diode-limited Wien bridge of our own (2.4 kHz), then `tail`. */
const wien = (tail) => `title "Steady edges bench source"
resistor  R1 o  s   13.7k±1%
capacitor C1 s  p   4.7n±5%
resistor  R2 p  gnd 13.7k±1%
capacitor C2 p  gnd 4.7n±5%
resistor  Rg n  gnd 10k±1%
resistor  Rf n  f   15.5k±1%
resistor  Rd f  o   5.6k±1%
diode     D1 f  o
diode     D2 o  f
opamp     U1 p  n   o  preset=general rails=(-12, 12)
${tail}`;

/** An LC tank held by a clip, of quality factor Q at f (Hz): L = 1 mH. */
function tank(q, f) {
  const L = 1e-3;
  const C = 1 / (L * (2 * Math.PI * f) ** 2);
  const R = q * Math.sqrt(L / C);
  return `inductor L1 v gnd ${L}\ncapacitor C1 v gnd ${C}\nresistor R1 v gnd ${R}\nopamp U1 v n o preset=ideal rails=(-1, 1)\nresistor Rf o n 2k\nresistor Rg n gnd 1k\nresistor Rfb o v ${0.4 * R}\nsteady probe=v\n`;
}

/** N sections of 100 Ω and 1 nF loading the Wien's output. */
function ladder(n) {
  const lines = ["resistor Rb o l0 10k"];
  for (let i = 1; i <= n; i++) lines.push(`resistor Rl${i} l${i - 1} l${i} 100`, `capacitor Cl${i} l${i} gnd 1n`);
  return wien(`${lines.join("\n")}\nsteady probe=o\n`);
}

const RC_DRIVEN = (freq) => `vsource V1 a gnd wave=sine amp=1 freq=${freq}\nresistor R1 a v 1k\ncapacitor C1 v gnd 1\nsteady probe=v\n`;

/** A diode-limited Wien bridge block (gain 3.67), for circuits of several oscillators. */
const WIEN_BLOCK = `block wien (o) R=10k C=10n
  resistor  R1 o s (R)
  capacitor C1 s p (C)
  resistor  R2 p gnd (R)
  capacitor C2 p gnd (C)
  resistor  Rg n gnd 10k
  resistor  Rf1 n f 22k
  resistor  Rf2 f o 4.7k
  diode     D1 f o
  diode     D2 o f
  opamp     U1 p n o preset=general rails=(-12, 12)
end
`;

/** A double-scroll circuit: C1, R, C2 ∥ L and a negative resistance of two op-amp converters. */
const DOUBLE_SCROLL = `capacitor C1 v gnd 10n
resistor R v w 1.85k
capacitor C2 w gnd 100n
inductor L w gnd 18m series=10
opamp U1 v n1 o1 preset=general rails=(-8.3, 8.3)
resistor R1 o1 n1 220
resistor R2 n1 gnd 220
resistor R3 o1 v 2.2k
opamp U2 v n2 o2 preset=general rails=(-8.3, 8.3)
resistor R4 o2 n2 22k
resistor R5 n2 gnd 22k
resistor R6 o2 v 3.3k
steady probe=v
`;

/** A Wien bridge of gain 5 held only by its rails. */
const RAIL_WIEN = (from) => `resistor R1 o s 10k\ncapacitor C1 s p 10n\nresistor R2 p gnd 10k\ncapacitor C2 p gnd 10n\nresistor Rg n gnd 10k\nresistor Rf n o 40k\nopamp U1 p n o preset=general rails=(-12, 12)\nsteady probe=o from=${from}\n`;

/** A Wien bridge whose gain is set by a lamp of thermal time constant tau (s). */
const LAMP_WIEN = (tau) => `resistor R1 o s 5.6k\ncapacitor C1 s p 10n\nresistor R2 p gnd 5.6k\ncapacitor C2 p gnd 10n\nresistor Rf o n 470\nlamp L1 n gnd 120 hot=900 rated=10 tau=${tau}\nopamp U1 p n o preset=general rails=(-12, 12)\nsteady probe=o\n`;

/** [input, file text, extra command arguments]. */
const ROWS = [
  ["steady (nominal)", wien("steady probe=o\n"), []],
  ["bandwidth=1e10", wien("steady probe=o bandwidth=1e10\n"), []],
  ["max-step=1e-15", wien("steady probe=o max-step=1e-15\n"), []],
  ["max-step=1e30", wien("steady probe=o max-step=1e30\n"), []],
  ["from=poles cycles=100000", wien("steady probe=o from=poles cycles=100000\n"), []],
  ["probe on a node that does not swing", wien("vsource Vs s5 gnd 5\nresistor Ra s5 m 1k\nresistor Rb m gnd 1k\nsteady probe=m\n"), []],
  ["LC tank Q = 10⁴", tank(1e4, 15.9e3), []],
  ["LC tank at 10 MHz", tank(30, 10e6), []],
  ["RC of 1000 s driven at 1 kHz (10⁶ periods)", RC_DRIVEN("1k"), []],
  ["two drives, 1 kHz and 1.41421356 kHz", "vsource V1 a gnd wave=sine amp=1 freq=1k\nvsource V2 b gnd wave=sine amp=1 freq=1.41421356k\nresistor R1 a v 1k\nresistor R2 b v 1k\ncapacitor C1 v gnd 100n\nsteady probe=v\n", []],
  ["two independent Wien bridges, 1.5 and 2.4 kHz (quasi-periodic)", `${WIEN_BLOCK}use A wien a\nuse B wien b R=6.18034k\nsteady probe=a\n`, []],
  ["ten independent Wien bridges", `${WIEN_BLOCK}${Array.from({ length: 10 }, (_, i) => `use W${i} wien o${i} R=${10000 + 737 * i}`).join("\n")}\nsteady probe=o0\n`, []],
  ["a 1 Hz Wien bridge", `${WIEN_BLOCK}use A wien a R=15.9k C=10u\nsteady probe=a\n`, []],
  ["a double scroll (saddle-focus bias point)", DOUBLE_SCROLL, []],
  ["Wien held only by its rails, from=startup", RAIL_WIEN("startup"), []],
  ["Wien held only by its rails, from=poles", RAIL_WIEN("poles"), []],
  ["driven varactor resonator that period-doubles", "vsource V1 in gnd wave=sine amp=5 freq=120k\nresistor R1 in a 50\ninductor L1 a k 10m\ndiode D1 k gnd junction=100p saturation=1n emission=1.5\nsteady probe=k\n", []],
  ["lamp Wien, tau = 40 ms (110 periods)", LAMP_WIEN("40m"), []],
  ["lamp Wien, tau = 10 s (28 000 periods)", LAMP_WIEN("10"), []],
  ["Wien loading a 300-section RC ladder (313 unknowns)", ladder(300), []],
  ["Wien loading a 1000-section RC ladder (1013 unknowns)", ladder(1000), []],
  ["tolerance runs=10⁶ measure=steady", wien("steady probe=o\ntolerance runs=1000000 measure=steady\n"), []],
  ["tolerance runs=2000 measure=steady, --jobs 1", wien("steady probe=o\ntolerance runs=2000 measure=steady\n"), ["--jobs", "1", "--results", "r.jsonl"]],
  ["--sample 1999 of a 2000-run study", wien("steady probe=o\ntolerance runs=2000 measure=steady\n"), ["--sample", "1999"]],
];

/** The steady result's answer (its orbit's verdict and frequency, or no orbit), or the command's outcome. */
function answerOf(r) {
  try {
    const result = JSON.parse(r.stdout).results?.find((x) => x.analysis === "steady");
    if (result) return result.found ? `orbit ${result.stability.verdict}, ${Number(result.frequency.toPrecision(5))} Hz` : "no orbit";
  } catch {
    // not one JSON document: the outcome below says what it is
  }
  return outcomeOf(r);
}

export async function run() {
  const dir = commandDir("onset-steady-edges-");
  const rows = [];
  try {
    for (const [what, text, extra] of ROWS) {
      writeFileSync(join(dir, "a.onset"), text);
      const r = measure(dir, ["run", "a.onset", "--json", ...extra]);
      rows.push({ input: what, "ends in": answerOf(r), status: r.status, "wall s": (r.ms / 1000).toFixed(2), "peak MB": r.peakMB.toFixed(0) });
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  printTable(rows);
  console.log("\nEach row is one fresh process of the built command (Node's own start-up, about 0.1 s and 45 MB, included).");
}

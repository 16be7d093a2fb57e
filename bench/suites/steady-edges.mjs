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
  ["Wien loading a 300-section RC ladder (313 unknowns)", ladder(300), []],
  ["Wien loading a 1000-section RC ladder (1013 unknowns)", ladder(1000), []],
  ["tolerance runs=10⁶ measure=steady", wien("steady probe=o\ntolerance runs=1000000 measure=steady\n"), []],
  ["tolerance runs=2000 measure=steady, --jobs 1", wien("steady probe=o\ntolerance runs=2000 measure=steady\n"), ["--jobs", "1", "--results", "r.jsonl"]],
  ["--sample 1999 of a 2000-run study", wien("steady probe=o\ntolerance runs=2000 measure=steady\n"), ["--sample", "1999"]],
];

export async function run() {
  const dir = commandDir("onset-steady-edges-");
  const rows = [];
  try {
    for (const [what, text, extra] of ROWS) {
      writeFileSync(join(dir, "a.onset"), text);
      const r = measure(dir, ["run", "a.onset", "--json", ...extra]);
      rows.push({ input: what, "ends in": outcomeOf(r), status: r.status, "wall s": (r.ms / 1000).toFixed(2), "peak MB": r.peakMB.toFixed(0) });
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  printTable(rows);
  console.log("\nEach row is one fresh process of the built command (Node's own start-up, about 0.1 s and 45 MB, included).");
}

// Issue 19: the table of hostile inputs, each run through the built command as a stranger's file
// would be, in a process of its own: what it ends in (the error code, or the result), its wall
// time and its peak resident memory. test/hostile/hostile-input.test.ts asserts the outcomes under
// a memory cap; this prints the figures. The RC ladders are in the scaling suite.
import { readFileSync, rmSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { printTable } from "../table.mjs";
import { commandDir, measure, outcomeOf } from "../command-run.mjs";

export const title = "Hostile inputs: what each ends in, its time and its peak memory";

/** A Wien-bridge source of our own (the workshop tuning reference's topology, bench values), then `tail`. */
const wien = (tail) => `title "Hostile-input bench source"
resistor  R1 o  s   15k±1%
capacitor C1 s  p   4.7n±5%
resistor  R2 p  gnd 15k±1%
capacitor C2 p  gnd 4.7n±5%
resistor  Rf o  n   21k±1%
resistor  Rg n  gnd 10k±1%
opamp     U1 p  n   o  preset=general
${tail}`;

function chain(blocks) {
  const lines = [];
  for (let k = 0; k < blocks; k++) lines.push(`block b${k} (x)`, k < blocks - 1 ? `  use U b${k + 1} x` : "  resistor R x gnd 1k", "end");
  return [...lines, "vsource V1 a gnd 1", "use X b0 a", "bias", ""].join("\n");
}

const RC = "resistor R1 in o 1k\ncapacitor C1 o gnd 1u\n";

/** [row of the table, files to write, command arguments]. */
const ROWS = [
  ['include "/dev/zero"', { "a.onset": 'include "/dev/zero"\n' }, ["run", "a.onset", "--json", "--include-root", "/dev"]],
  ["include of a system file", { "a.onset": 'include "/etc/passwd"\n' }, ["run", "a.onset", "--json"]],
  ["sweep steps=10¹²", { "a.onset": wien("startup probe=o until=auto\nsweep Rf from=15k to=30k steps=1000000000000\n") }, ["run", "a.onset", "--json"]],
  ["tolerance runs=10¹²", { "a.onset": wien("startup probe=o until=auto\ntolerance runs=1000000000000\n") }, ["run", "a.onset", "--json"]],
  ["3000 blocks, each using the next", { "a.onset": chain(3000) }, ["run", "a.onset", "--json"]],
  ["20 000 lines of an unclosed block", { "a.onset": "block b (x)\n".repeat(20000) }, ["check", "a.onset"]],
  ["startup until=1e-9", { "a.onset": wien("startup probe=o until=1e-9\n") }, ["run", "a.onset", "--json"]],
  ["pulse delay=1e-311", { "a.onset": `vsource V1 in gnd wave=pulse low=0 high=1 delay=1e-311 rise=1u width=1m\n${RC}transient until=1m\n` }, ["run", "a.onset", "--json"]],
  ["transient until=100 max-step=1n", { "a.onset": `vsource V1 in gnd 1\n${RC}transient until=100 max-step=1n\n` }, ["run", "a.onset", "--json"]],
  ["transient of 10⁶ steps", { "a.onset": `vsource V1 in gnd wave=pulse low=0 high=1 delay=1u rise=1u width=1m\n${RC}transient until=1 max-step=1u\n` }, ["run", "a.onset", "--json"]],
  ["diode series=0 across 1 kV", { "a.onset": "vsource V1 a gnd 1k\ndiode D1 a gnd series=0\nbias\ntransient until=1m\n" }, ["run", "a.onset", "--json"]],
  ["tolerance without a start-up analysis", { "a.onset": wien("bias\ntolerance runs=20\n") }, ["run", "a.onset", "--json"]],
];

/** The merge row: two shards, one record's drawn value edited, then `onset merge`. */
function mergeRow(dir) {
  writeFileSync(join(dir, "mc.onset"), wien("startup probe=o until=auto\ntolerance runs=4\n"));
  for (const shard of ["0/2", "1/2"]) measure(dir, ["run", "mc.onset", "--jobs", "1", "--shard", shard, "--results", `s${shard[0]}.jsonl`]);
  const lines = readFileSync(join(dir, "s1.jsonl"), "utf8").split("\n");
  writeFileSync(join(dir, "edited.jsonl"), lines.map((l, k) => (k === 2 ? l.replace(/"R1":(\d)/, (_, d) => `"R1":${(Number(d) + 1) % 10}`) : l)).join("\n"));
  const r = measure(dir, ["merge", "s0.jsonl", "edited.jsonl"]);
  return { r, outcome: r.stderr.split("\n")[0].slice(0, 70) };
}

export async function run() {
  const dir = commandDir("onset-hostile-");
  const rows = [];
  try {
    for (const [what, files, args] of ROWS) {
      for (const [name, text] of Object.entries(files)) writeFileSync(join(dir, name), text);
      const r = measure(dir, args);
      rows.push({ input: what, "ends in": outcomeOf(r), status: r.status, "wall s": (r.ms / 1000).toFixed(2), "peak MB": r.peakMB.toFixed(0) });
    }
    const { r, outcome } = mergeRow(dir);
    rows.push({ input: "onset merge of an edited results file", "ends in": outcome, status: r.status, "wall s": (r.ms / 1000).toFixed(2), "peak MB": r.peakMB.toFixed(0) });
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  printTable(rows);
  console.log("\nEach row is one fresh process of the built command (Node's own start-up, about 0.1 s and 45 MB, included).");
}

// Onset's settled figures on the validation cases and their errors against the scipy references,
// one JSON line per run on stdout. Uses the built packages of the checkout it sits in
// (`npx -y pnpm@12.4.2 build` first), so test/validation/ can be copied into an older checkout
// to measure its engine the same way.
//
//   node test/validation/onset-figures.mjs [--steps 1,4,10] [--long] [case…]
//
// --steps: runs at max-step = (default max-step)/k for each k (1 = default settings);
// --long:  also a run at default steps with until = 3 × the auto run's length, which measures a
//          later, better-settled window (separates settling from integration error).
import { caseCircuit, compareRows, runCase, validationCases } from "./validation-cases.mjs";

const args = process.argv.slice(2);
let divisors = [1];
let long = false;
const only = [];
for (let i = 0; i < args.length; i++) {
  if (args[i] === "--steps") divisors = args[++i].split(",").map(Number);
  else if (args[i] === "--long") long = true;
  else only.push(args[i]);
}

function figures(c, { result: r, ms }) {
  return {
    verdict: r.verdict,
    frequency: r.frequency,
    amplitude: r.amplitude,
    rms: r.rms,
    offset: r.offset,
    thd: r.thd,
    harmonics: r.harmonics.map((h) => h.amplitude),
    numericalError: r.numericalError ?? null,
    thdOrders: r.thdOrders ?? null,
    error: c.reference ? Object.fromEntries(compareRows(c.reference, r).map((row) => [row.metric, row.error])) : null,
    until: r.run.until,
    maxStep: r.run.maxStep,
    steps: r.run.solver.accepted,
    ms,
  };
}

for (const c of validationCases()) {
  if (only.length > 0 && !only.includes(c.name)) continue;
  const circuit = caseCircuit(c.file);
  const base = runCase(circuit);
  for (const k of divisors) {
    const run = k === 1 ? base : runCase(circuit, { maxStep: base.result.run.maxStep / k });
    console.log(JSON.stringify({ case: c.name, run: `step/${k}`, ...figures(c, run) }));
  }
  if (long) console.log(JSON.stringify({ case: c.name, run: "long", ...figures(c, runCase(circuit, { until: 3 * base.result.run.until })) }));
}

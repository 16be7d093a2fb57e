// The validation table's cases and references, shared by the tests (test/validation/*.ts), the
// bench suite (bench/suites/validation.mjs) and onset-figures.mjs. Plain JavaScript, so the
// bench can load it in Node without a build step; types in validation-cases.d.mts.
import { readFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { runStartup, startupAnalysisOf } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const here = dirname(fileURLToPath(import.meta.url));
export const repositoryRoot = join(here, "..", "..");

/** The headline metrics, in table order. */
export const METRICS = ["frequency", "amplitude", "rms", "thd"];

/**
 * Issue 18's accuracy at default settings, relative to the reference: frequency 0.01 %,
 * amplitude and r.m.s. 0.1 %, THD 1 % of itself (only where the THD is above 0.01 %).
 */
export const LIMITS = { frequency: 1e-4, amplitude: 1e-3, rms: 1e-3, thd: 1e-2 };
export const THD_FLOOR = 1e-4;

/** Cases of cases.json with their reference from references.json (undefined until computed). */
export function validationCases() {
  const { cases } = JSON.parse(readFileSync(join(here, "cases.json"), "utf8"));
  const { cases: references, source } = JSON.parse(readFileSync(join(here, "references.json"), "utf8"));
  return cases.map((c) => ({ ...c, source, reference: references.find((r) => r.name === c.name) }));
}

/** The elaborated circuit of a case's file (`file` relative to the repository root). */
export function caseCircuit(file, overrides = {}) {
  const path = join(repositoryRoot, file);
  const { program, diagnostics } = loadProgram(path, readFileSync(path, "utf8"));
  const { circuit } = elaborate(program, { overrides });
  if (!circuit) throw new Error(`${file}: ${diagnostics.map((d) => d.message).join("; ")}`);
  return circuit;
}

/** Runs the file's startup analysis, with `changes` applied to it (e.g. a max-step); wall time in ms. */
export function runCase(circuit, changes = {}, options = {}) {
  const analysis = { ...startupAnalysisOf(circuit), ...changes };
  const started = performance.now();
  const cpu = process.cpuUsage();
  const result = runStartup(circuit, analysis, options);
  const used = process.cpuUsage(cpu);
  return { result, ms: performance.now() - started, cpuMs: (used.user + used.system) / 1000 };
}

/** THD_F of the reference over harmonics 2 … N (N ≤ 30, the harmonics it carries). */
export function referenceThd(reference, orders = [2, 10]) {
  const [from, to] = orders;
  if (from === 2 && to === 10) return reference.thd;
  if (from === 2 && to === 30) return reference.thd30;
  const h = reference.harmonics;
  if (to > h.length) return null;
  let sum = 0;
  for (let k = from; k <= to; k++) sum += h[k - 1] ** 2;
  return Math.sqrt(sum) / h[0];
}

/**
 * One row per metric: the reference, Onset's value, the relative error, the error bar Onset
 * reports (`numericalError`, absolute, or null while the result has none), the limit and
 * whether the row is judged (THD only above THD_FLOOR).
 */
export function compareRows(reference, result) {
  const bars = result.numericalError ?? null;
  return METRICS.map((metric) => {
    const ref = metric === "thd" ? referenceThd(reference, result.thdOrders ?? [2, 10]) : reference[metric];
    const onset = result[metric];
    const error = onset === null || ref === null ? null : (onset - ref) / Math.abs(ref);
    const bar = bars && typeof bars[metric] === "number" ? bars[metric] : null;
    return {
      metric,
      reference: ref,
      onset,
      error,
      bar,
      covered: bar === null || onset === null ? null : Math.abs(onset - ref) <= bar,
      limit: LIMITS[metric],
      judged: metric !== "thd" || ref > THD_FLOOR,
    };
  });
}

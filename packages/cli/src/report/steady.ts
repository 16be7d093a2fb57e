import { RITZ_TOLERANCE, type Multiplier, type SteadyResult } from "@onset/core";
import type { Paint } from "../color.js";
import { formatPlain, formatWithError } from "../format/index.js";
import { harmonicLines } from "./startup.js";
import { pairs } from "./table.js";
import { perSecond, si, withBar } from "./values.js";

/** How many non-trivial multipliers the report lists. */
const LISTED_MULTIPLIERS = 4;

/**
 * A multiplier as `0.8412` or `0.61 ± 0.12j`, its magnitude after a complex one; with its error
 * bar (a distance in the complex plane, so it bounds the magnitude's error too) as
 * `0.8412 ± 0.0003`, or on the magnitude, `(|μ| 0.6200 ± 0.0010)`.
 */
function multiplierText(m: Multiplier, bar: number | undefined): string {
  const size = Math.hypot(m.re, m.im);
  const shown = (x: number) => (bar === undefined ? formatPlain(x, 4) : formatWithError(x, bar, ""));
  if (Math.abs(m.im) <= 1e-12 * Math.max(1, size)) return shown(m.re);
  return `${formatPlain(m.re, 4)} ± ${formatPlain(Math.abs(m.im), 4)}j (|μ| ${shown(size)})`;
}

/**
 * Where the shooting started, in words; without an orbit only the transient run (whether a
 * shooting ran, and why it failed, the explanation says).
 */
function startText(r: SteadyResult): string {
  const t = r.transient;
  const run = `${t.periods} periods of transient (${si(t.until, "s")})`;
  const then = (shooting: string) => (r.found ? `, then shooting ${shooting}` : "");
  if (r.hardStart || (r.from !== "driven" && !r.found && !r.predicted.starts && t.periods > 0)) return `a large kick in the decaying pair's mode (a hard start), ${run}${then("from the measured period")}`;
  switch (r.from) {
    case "driven":
      return `${run} from the bias point${then("with the sources' period")}`;
    case "poles":
      return `the growing mode at the poles' frequency, ${run}${then("from the poles' period (from the measured one after a shooting that failed)")}`;
    case "startup":
      return `the growing mode, ${run}${then("from the measured period")}`;
  }
}

/**
 * The steady-state report: what was found (or why nothing), the figures over one period with
 * their error bars, the harmonics, the orbit's stability from its Floquet multipliers, the
 * linear prediction, and how the orbit was found.
 */
export function steadyReport(r: SteadyResult, p: Paint): string[] {
  const head = `${p.bold(`steady state on ${r.probe}`)}: `;
  const unit = r.unit;
  if (!r.found) {
    const lines = [`${head}${p.red("no orbit")}`, `  ${r.explanation}`];
    if (r.predicted.frequency !== null) lines.push(p.dim(`  poles: dominant pair ${si(r.predicted.frequency, "Hz")}, growth rate ${perSecond(r.predicted.growthRate)}`));
    if (r.transient.periods > 0) lines.push(p.dim(`  tried: ${startText(r)}`));
    return lines;
  }
  const s = r.stability!;
  const verdict = s.verdict === "stable" ? p.green("stable orbit") : s.verdict === "unstable" ? p.red("unstable orbit") : p.yellow("marginal orbit");
  const e = r.numericalError ?? undefined;
  const [, lastOrder] = r.thdOrders;
  const lines = [`${head}${verdict}${r.kind === "driven" ? p.dim(" (driven)") : r.hardStart ? p.yellow(" (hard start)") : ""}`, `  ${r.explanation}`, ""];
  lines.push(
    ...pairs([
      ["frequency", withBar(r.frequency, e?.frequency, "Hz")],
      ["amplitude", `${withBar(r.amplitude, e?.amplitude, unit)} peak`],
      ["peak-to-peak", si(r.peakToPeak, unit)],
      ["rms", withBar(r.rms, e?.rms, unit)],
      ["offset", si(r.offset, unit, 3)],
      [`THD (2–${lastOrder})`, withBar(r.thd, e?.thd, "1")],
    ]),
  );
  lines.push(...harmonicLines(r.harmonics, lastOrder, unit, p));
  const left = r.kind === "autonomous" ? ", the trivial one left out" : "";
  lines.push("", `  stability (Floquet multipliers${left}${r.shooting === "matrix-free" ? "; the dominant ones an Arnoldi run converged on" : ""})`);
  // A complex pair is written once, as a ± b·j.
  const shown = r.multipliers.flatMap((m, k) => (m.im < -1e-12 * Math.max(1, Math.hypot(m.re, m.im)) ? [] : [{ m, bar: r.multiplierError?.[k] }]));
  const listed = shown.slice(0, LISTED_MULTIPLIERS).map(({ m, bar }) => multiplierText(m, bar));
  const more = shown.length > LISTED_MULTIPLIERS ? `, … (${r.multipliers.length} in all)` : "";
  const entries: [string, string][] = [["multipliers", listed.length > 0 ? `${listed.join(", ")}${more}` : "none above 1e-10: a disturbance dies out within a period"]];
  if (unconverged(r)) entries.push(["not converged", "the Arnoldi run reached its limit first: the bars include the Ritz residuals (a backward error), and smaller multipliers are not listed"]);
  if (r.trivialMultiplier) entries.push(["trivial", `${formatPlain(Math.hypot(r.trivialMultiplier.re, r.trivialMultiplier.im), 8)} (a shift along the orbit: 1 but for the grid's error)`]);
  if (s.rate !== null) entries.push([s.verdict === "unstable" ? "disturbance grows" : "disturbance decays", perSecond(Math.abs(s.rate))]);
  if (s.cyclesToSettle !== null) entries.push(["to 1 % in", `${formatPlain(s.cyclesToSettle, 3)} periods (${si(s.cyclesToSettle * r.period!, "s", 3)})`]);
  lines.push(...pairs(entries, "    "));
  if (r.kind === "autonomous") {
    lines.push("", "  linear prediction at the bias point");
    const predicted: [string, string][] = [
      ["frequency", si(r.predicted.frequency, "Hz")],
      ["growth rate", perSecond(r.predicted.growthRate)],
    ];
    if (r.predicted.startupTime !== null) predicted.push(["start-up time", `${si(r.predicted.startupTime, "s")} (predicted: growth at that rate from the thermal noise to 90 % of the amplitude)`]);
    lines.push(...pairs(predicted, "    "));
  }
  const t = r.transient.solver;
  lines.push(
    "",
    p.dim(`  found from ${startText(r)}; Newton ${r.iterations![0]} + ${r.iterations![1]} periods${r.shooting === "matrix-free" ? " (matrix-free: GMRES on tangent passes)" : ""} on ${r.points![0]} and ${r.points![1]} points per period, extrapolated (± bounds the numerical error)`),
    p.dim(`  solver (transient): ${t.accepted} steps, ${t.rejected} rejected, ${t.newtonIterations} Newton iterations, largest step ${si(r.transient.maxStep, "s", 3)}`),
  );
  for (const w of r.warnings) lines.push(p.yellow(`  warning: ${w.message}`), p.dim(`    hint: ${w.hint}`));
  return lines;
}

/** Whether a matrix-free run's listed multipliers (or its trivial one) include a Ritz value its Arnoldi run did not converge on (residual above `RITZ_TOLERANCE`). */
function unconverged(r: SteadyResult): boolean {
  const residual = (m: Multiplier) => ("residual" in m && typeof m.residual === "number" ? m.residual : 0);
  return [...r.multipliers, ...(r.trivialMultiplier ? [r.trivialMultiplier] : [])].some((m) => residual(m) > RITZ_TOLERANCE);
}

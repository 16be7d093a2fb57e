import type { QuantityUnit, StartupResult } from "@onset/core";
import type { Paint } from "../color.js";
import { formatDecibel } from "../format/index.js";
import { SPECTRUM_FLOOR_DBC } from "../plot/index.js";
import { pairs, table } from "./table.js";
import { percent, perSecond, si } from "./values.js";

/** How each verdict reads in a report, and its colour. */
export function verdictText(verdict: StartupResult["verdict"], p: Paint): string {
  switch (verdict) {
    case "settled":
      return p.green("settled");
    case "growing":
      return p.yellow("still growing");
    case "unsettled":
      return p.yellow("unsettled");
    case "decaying":
      return p.red("decaying");
    case "silent":
      return p.red("silent");
  }
}

/** A harmonic's level below the fundamental; levels under the spectrum floor are rounding noise. */
function level(dBc: number): string {
  return dBc < SPECTRUM_FLOOR_DBC ? `< ${formatDecibel(SPECTRUM_FLOOR_DBC, "dBc", 0)}` : formatDecibel(dBc, "dBc");
}

/**
 * The start-up report: the verdict and its one-line explanation first, then every metric with
 * its unit, the harmonics table and the solver's counts.
 */
export function startupReport(r: StartupResult, unit: QuantityUnit, p: Paint): string[] {
  const lines = [`${p.bold(`start-up on ${r.probe}`)}: ${verdictText(r.verdict, p)}`, `  ${r.explanation}`, ""];
  const entries: [string, string][] = [
    ["frequency", si(r.frequency, "Hz")],
    ["frequency spread", si(r.frequencySpread, "Hz", 3)],
    ["amplitude", r.amplitude === null ? si(null, unit) : `${si(r.amplitude, unit)} peak`],
    ["peak-to-peak", si(r.peakToPeak, unit)],
    ["rms", si(r.rms, unit)],
    ["offset", si(r.offset, unit, 3)],
    ["start-up time", si(r.startupTime, "s")],
    ["settling time", si(r.settlingTime, "s")],
    ["growth rate", perSecond(r.growthRate)],
    ["THD", percent(r.thd)],
    ["cycles", String(r.cycles)],
  ];
  if (r.suggestedExtraTime !== undefined) entries.push(["run longer by", si(r.suggestedExtraTime, "s", 3)]);
  lines.push(...pairs(entries));
  if (r.harmonics.length > 0) {
    lines.push("", "  harmonics");
    lines.push(
      ...table(
        [{ header: "order", align: "right" }, { header: "frequency", align: "right" }, { header: "amplitude", align: "right" }, { header: "level", align: "right" }],
        r.harmonics.map((h) => [String(h.order), si(h.frequency, "Hz"), si(h.amplitude, unit), level(h.dBc)]),
        "    ",
      ),
    );
  }
  const s = r.run.solver;
  const kick = r.run.kick.kind === "noise" ? `noise kick ${si(r.run.kick.level, "A", 3)} rms into ${r.run.kick.node} for ${si(r.run.kick.duration, "s", 3)}` : "no kick";
  lines.push(
    "",
    p.dim(`  simulated ${si(r.run.until, "s")} (${kick}, seed ${r.run.kick.seed}, largest step ${si(r.run.maxStep, "s", 3)})`),
    p.dim(`  solver: ${s.accepted} steps, ${s.rejected} rejected, ${s.newtonIterations} Newton iterations, ${s.factorizations} factorizations`),
  );
  return lines;
}

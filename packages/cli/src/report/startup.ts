import type { Excitation, Harmonic, QuantityUnit, StartupResult, StartupTimeSpread } from "@onset/core";
import type { Paint } from "../color.js";
import { formatDecibel, formatPlain } from "../format/index.js";
import { SPECTRUM_FLOOR_DBC } from "../plot/index.js";
import { pairs, table } from "./table.js";
import { percent, perSecond, si, withBar } from "./values.js";

/** How each verdict reads in a report, and its colour. */
export function verdictText(verdict: StartupResult["verdict"], p: Paint): string {
  switch (verdict) {
    case "settled":
      return p.green("settled");
    case "relaxation":
      return p.yellow("relaxation");
    case "parasitic":
      return p.yellow("parasitic");
    case "latched":
      return p.red("latched");
    case "growing":
      return p.yellow("still growing");
    case "unsettled":
      return p.yellow("unsettled");
    case "decaying":
      return p.red("decaying");
    case "bouncing":
      return p.red("bouncing");
    case "silent":
      return p.red("silent");
  }
}

/** A harmonic's level below the fundamental; levels under the spectrum floor are rounding noise. */
function level(dBc: number): string {
  return dBc < SPECTRUM_FLOOR_DBC ? `< ${formatDecibel(SPECTRUM_FLOOR_DBC, "dBc", 0)}` : formatDecibel(dBc, "dBc");
}

/** One line saying how the run was excited and what that left at the probe. */
export function excitationText(e: Excitation, unit: QuantityUnit): string {
  const atProbe = e.noiseAtProbe === null ? "" : `, ${si(e.noiseAtProbe, unit, 3)} rms at the probe`;
  const band = e.band === null ? "" : `band ${si(e.band, "Hz", 3)}, seed ${e.seed}`;
  switch (e.kind) {
    case "thermal":
      return `thermal noise of ${e.sources} sources at ${formatPlain(e.temperature!, 4)} °C (${band})${atProbe}`;
    case "power-on":
      return `power-on: DC levels rise over ${si(e.ramp, "s", 3)}, with thermal noise of ${e.sources} sources at ${formatPlain(e.temperature!, 4)} °C (${band})${atProbe}`;
    case "noise":
      return `noise current ${si(e.level, "A", 3)} rms into ${e.node} for ${si(e.duration, "s", 3)} (${band})${atProbe}`;
    case "none":
      return "no excitation (kick=none)";
  }
}

/**
 * The start-up report: the verdict and its one-line explanation first, then every metric with
 * its unit, the harmonics table, the excitation and the solver's counts; warnings last.
 */
/** How many harmonics the table lists; THD may count more (see `thdOrders`). */
const LISTED_HARMONICS = 10;

export function startupReport(r: StartupResult, unit: QuantityUnit, p: Paint): string[] {
  const lines = [`${p.bold(`start-up on ${r.probe}`)}: ${verdictText(r.verdict, p)}`, `  ${r.explanation}`, ""];
  const e = r.numericalError ?? undefined;
  const [, lastOrder] = r.thdOrders;
  const entries: [string, string][] = [
    ["frequency", withBar(r.frequency, e?.frequency, "Hz")],
    ["frequency spread", si(r.frequencySpread, "Hz", 3)],
    ["amplitude", r.amplitude === null ? si(null, unit) : `${withBar(r.amplitude, e?.amplitude, unit)} peak`],
    ["peak-to-peak", si(r.peakToPeak, unit)],
    ["rms", withBar(r.rms, e?.rms, unit)],
    ["offset", si(r.offset, unit, 3)],
    ["start-up time", si(r.startupTime, "s")],
    ...(r.startupTimeSpread ? [spreadEntry(r.startupTimeSpread)] : []),
    ["settling time", si(r.settlingTime, "s")],
    ["envelope bounce", bounceText(r)],
    ["growth rate", perSecond(r.growthRate)],
    [`THD (2–${lastOrder})`, withBar(r.thd, e?.thd, "1")],
    // THD+N is the run's own: its noise over its last cycles (the orbit is noiseless).
    ...(r.thdPlusNoise !== null && (r.run.excitation.kind === "thermal" || r.run.excitation.kind === "power-on")
      ? [[`THD+N (to ${lastOrder}·f)`, percent(r.thdPlusNoise)] as [string, string]]
      : []),
    ...(r.dutyCycle === null ? [] : [["duty cycle", percent(r.dutyCycle)] as [string, string]]),
    ["cycles", String(r.cycles)],
  ];
  if (r.suggestedExtraTime !== undefined) entries.push(["run longer by", si(r.suggestedExtraTime, "s", 3)]);
  lines.push(...pairs(entries));
  lines.push(...harmonicLines(r.harmonics, lastOrder, unit, p));
  const s = r.run.solver;
  const x = r.run.excitation;
  const first = x.firstCycleRms === null ? "" : `; ${si(x.firstCycleRms, unit, 3)} rms at the probe over the first cycle${x.kind === "power-on" ? " after the ramp" : ""}`;
  lines.push("");
  if (r.run.judgedAt !== undefined) lines.push(p.dim(`  judged at: node ${r.run.judgedAt}, where the oscillation swings most (verdict, start-up and settling times); the figures are the probe's`));
  lines.push(p.dim(`  settled figures: ${settledText(r)}`));
  lines.push(
    p.dim(`  excitation: ${excitationText(x, unit)}${first}`),
    p.dim(`  simulated ${si(r.run.until, "s")}, largest step ${si(r.run.maxStep, "s", 3)}`),
    p.dim(`  solver: ${s.accepted} steps, ${s.rejected} rejected, ${s.newtonIterations} Newton iterations, ${s.factorizations} factorizations`),
  );
  for (const w of r.warnings) lines.push(p.yellow(`  warning: ${w.message}`), p.dim(`    hint: ${w.hint}`));
  return lines;
}

/** The harmonics table (the first few orders) and one line for the rest up to THD's last order. */
export function harmonicLines(harmonics: readonly Harmonic[], lastOrder: number, unit: QuantityUnit, p: Paint): string[] {
  const lines: string[] = [];
  if (harmonics.length > 0) {
    lines.push("", "  harmonics");
    lines.push(
      ...table(
        [{ header: "order", align: "right" }, { header: "frequency", align: "right" }, { header: "amplitude", align: "right" }, { header: "level", align: "right" }],
        harmonics.slice(0, LISTED_HARMONICS).map((h) => [String(h.order), si(h.frequency, "Hz"), si(h.amplitude, unit), level(h.dBc)]),
        "    ",
      ),
    );
  }
  const rest = harmonics.slice(LISTED_HARMONICS);
  if (rest.length > 0) {
    const loudest = Math.max(...rest.map((h) => h.dBc));
    lines.push(p.dim(`    harmonics ${LISTED_HARMONICS + 1}–${lastOrder}: each ${level(loudest).startsWith("<") ? level(loudest) : `at most ${level(loudest)}`}`));
  }
  return lines;
}

/** The envelope's own oscillation: its frequency and damping ratio, or why there is none. */
function bounceText(r: StartupResult): string {
  const e = r.envelope;
  if (e.bounceFrequency === null || e.dampingRatio === null) return r.verdict === "settled" || r.verdict === "relaxation" || r.verdict === "parasitic" ? "none (settles without bouncing)" : "—";
  const zeta = Math.abs(e.dampingRatio) < 5e-4 ? 0 : e.dampingRatio;
  return `${si(e.bounceFrequency, "Hz", 4)}, damping ratio ${zeta.toFixed(3)}`;
}

/** `min … max (median m) over N seeds`, and how many did not settle. */
function spreadEntry(s: StartupTimeSpread): [string, string] {
  const missing = s.times.filter((x) => x === null).length;
  const tail = missing > 0 ? `; ${missing} of ${s.seeds.length} seeds did not settle` : "";
  return ["start-up spread", `${si(s.min, "s")} … ${si(s.max, "s")}, median ${si(s.median, "s")} over ${s.seeds.length} seeds${tail}`];
}

/** Where the settled figures come from and what their ± means. */
function settledText(r: StartupResult): string {
  const s = r.settled;
  if (s.from === "orbit" && s.points && s.iterations) {
    return `the periodic orbit next to the run, found by shooting on ${s.points[0]} and ${s.points[1]} points per period and extrapolated; ± is how far the extrapolation moved each figure, a bound on its numerical error${s.note ? `; ${s.note}` : ""}`;
  }
  return s.note ?? "the run's last cycles";
}

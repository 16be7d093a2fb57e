import { METRIC_LABELS, metric, percent, si, withBar } from "../report/values.js";
import type { Json } from "../json/results.js";
import { tag, textTag } from "./markup.js";
import { verdictBadge } from "./plain-sections.js";
import { dataTable, field, list, num, outcomeCell, str, type Cell } from "./tables.js";

/** How many worst samples the page lists (the text report lists 5; the page has room). */
const WORST_SHOWN = 10;

function note(text: string): string {
  return textTag("p", { class: "note" }, text);
}

/** A setting's steady state as a badge: its orbit's stability, or `no orbit`. */
function orbitBadge(r: Json | undefined): Cell {
  if (!r) return "";
  const stability = str(field(r, "stability"), "verdict");
  const tone = field(r, "found") !== true ? "bad" : stability === "stable" ? "good" : stability === "unstable" ? "bad" : "warn";
  return { html: textTag("span", { class: `verdict ${tone}` }, field(r, "found") === true ? (stability ?? "marginal") : "no orbit") };
}

/** A steady figure with its error bar (`value ± bar`) from the result's `numericalError`. */
function barred(r: Json | undefined, key: "frequency" | "amplitude" | "thd", unit: string): string {
  return withBar(num(r, key), num(field(r, "numericalError"), key) ?? undefined, unit);
}

/** The rows of a `sweep … measure=steady`: each setting's orbit, its figures with their error bars, the predicted start-up time and the poles' growth rate. */
function steadyRows(d: Json, unit: string): { headers: string[]; rows: Cell[][]; notes: string[] } {
  const target = str(d, "target") ?? "";
  const notes: string[] = [];
  const rows = list(d, "points").map((p): Cell[] => {
    const st = list(p, "results").find((r) => str(r, "analysis") === "steady");
    const spec = field(p, "spec");
    if (st && field(st, "found") !== true) notes.push(`${target} = ${si(num(p, "value"), unit)}: ${str(st, "explanation") ?? ""}`);
    const predicted = field(st, "predicted");
    return [
      si(num(p, "value"), unit),
      orbitBadge(st),
      barred(st, "frequency", "Hz"),
      barred(st, "amplitude", str(st, "unit") ?? "V"),
      barred(st, "thd", "1"),
      metric("startupTime", num(predicted, "startupTime")),
      metric("growthRate", num(predicted, "growthRate")),
      spec ? outcomeCell(field(spec, "pass") === true) : "",
    ];
  });
  notes.push("figures: the periodic steady state at each setting (shooting on two grids, extrapolated; ± bounds the numerical error); start-up times are predicted from the poles and the thermal noise, not simulated");
  return { headers: [target, "orbit", "frequency", "amplitude", "THD", "start-up (predicted)", "growth rate (poles)", "spec"], rows, notes };
}

/** The rows of a start-up sweep: each setting's first start-up run. */
function startupRows(d: Json, unit: string): { headers: string[]; rows: Cell[][]; notes: string[] } {
  const rows = list(d, "points").map((p): Cell[] => {
    const st = list(p, "results").find((r) => str(r, "analysis") === "startup");
    const spec = field(p, "spec");
    return [
      si(num(p, "value"), unit),
      st ? { html: verdictBadge(str(st, "verdict") ?? "") } : "",
      metric("frequency", num(st, "frequency")),
      metric("amplitude", num(st, "amplitude")),
      metric("thd", num(st, "thd")),
      metric("startupTime", num(st, "startupTime")),
      metric("growthRate", num(st, "growthRate")),
      spec ? outcomeCell(field(spec, "pass") === true) : "",
    ];
  });
  return { headers: [str(d, "target") ?? "", "verdict", "frequency", "amplitude", "THD", "start-up", "growth rate", "spec"], rows, notes: [] };
}

/** The sweep: every setting with its verdict (or orbit) and metrics (silent ones too), and the start threshold. */
export function sweepSection(d: Json): string {
  const target = str(d, "target") ?? "";
  const unit = str(d, "unit") ?? "";
  const steady = str(d, "measure") === "steady";
  const { headers, rows, notes } = steady ? steadyRows(d, unit) : startupRows(d, unit);
  const t = field(d, "threshold");
  const named = steady ? "start threshold (poles)" : "start threshold";
  let threshold = `${named}: not crossed within the sweep (the verdict does not change between settings)`;
  if (t) {
    threshold = `${named}: ${target} = ${si(num(t, "value"), unit)} ± ${si(num(t, "precision"), unit, 2)} (${field(t, "startsAbove") === true ? "oscillates above it" : "oscillates below it"})`;
    const margin = num(t, "margin");
    if (num(t, "nominal") !== null && margin !== null) threshold += `; nominal ${si(num(t, "nominal"), unit)}: margin ${percent(margin, 3)}, the nominal ${margin > 0 ? "starts" : "does not start"}`;
  }
  return (
    tag("h3", {}, `sweep of ${textTag("code", {}, target)}${steady ? " (periodic steady state)" : ""}`) +
    textTag("p", { class: "explanation" }, threshold) +
    tag("div", { class: "tables" }, dataTable(headers, rows, [true, false, true, true, true, true, true, false])) +
    notes.map(note).join("")
  );
}

const PERCENTILES = ["min", "p1", "p5", "median", "p95", "p99", "max"] as const;

function percentileTable(summary: Json | undefined, probeUnit: string | undefined): string {
  const percentiles = field(summary, "percentiles");
  const rows = Object.keys((percentiles ?? {}) as object).map((key): Cell[] => {
    const p = field(percentiles, key);
    return [METRIC_LABELS[key] ?? key, ...PERCENTILES.map((n) => metric(key, num(p, n), probeUnit))];
  });
  return dataTable(["metric", ...PERCENTILES], rows, [false, ...PERCENTILES.map(() => true)], "spread over the samples");
}

function yieldText(y: Json | undefined): string {
  const interval = field(y, "interval");
  return `yield ${percent(num(y, "value"))} (${num(y, "passed")} of ${num(y, "runs")} pass), 95 % Wilson interval ${percent(num(interval, "low"))} to ${percent(num(interval, "high"))}`;
}

function studyLine(d: Json): string {
  const dist = str(d, "dist") === "normal" ? "normal, σ = tolerance/3, cut at ±tolerance" : "uniform over ±tolerance";
  const shard = field(d, "shard");
  return `${num(d, "runs")} runs, seed ${num(d, "seed")}, ${dist}${shard ? `, shard ${num(shard, "index")}/${num(shard, "count")}` : ""}`;
}

/** A tolerance study: verdict counts, percentiles, the yield, and the worst samples with the command that reruns each. */
export function toleranceSection(d: Json): string {
  const summary = field(d, "summary");
  const tolerances = list(d, "tolerances");
  const samples = list(d, "samples");
  const commands = new Map(list(d, "reproduce").map((r) => [num(r, "index"), str(r, "command") ?? ""]));
  const verdicts = Object.entries((field(summary, "verdicts") ?? {}) as Record<string, Json>).map(([v, n]) => `${v} ${n}`);
  const worst = list(summary, "worst")
    .slice(0, WORST_SHOWN)
    .map((i) => samples.find((s) => num(s, "index") === i))
    .filter((s): s is Json => s !== undefined)
    .map((s): Cell[] => {
      const m = field(s, "metrics");
      const failures = list(s, "failures").map(String);
      const drawn = tolerances.map((t) => `${str(t, "target")} = ${si(num(field(s, "drawn"), str(t, "target") ?? ""), str(t, "unit") ?? "")}`).join(", ");
      const error = str(s, "error");
      return [
        `#${num(s, "index")}`,
        field(s, "pass") === true ? outcomeCell(true, "passes") : { html: textTag("span", { class: "bad" }, `fails: ${failures.join(", ")}${error ? ` (${error})` : ""}`) },
        `f ${metric("frequency", num(m, "frequency"))}, amplitude ${metric("amplitude", num(m, "amplitude"), str(d, "probeUnit") ?? undefined)}, THD ${metric("thd", num(m, "thd"))}, start-up ${metric("startupTime", num(m, "startupTime"))}`,
        drawn,
        { html: tag("code", { class: "command" }, commands.get(num(s, "index")) ?? "") },
      ];
    });
  const missing = list(d, "missing").length;
  return (
    tag("h3", {}, "Monte Carlo tolerance study") +
    note(studyLine(d)) +
    textTag("p", { class: "explanation" }, `${num(summary, "runs")} samples done; verdicts: ${verdicts.join(", ") || "none"}. ${yieldText(field(summary, "yield"))}`) +
    (missing > 0 ? textTag("p", { class: "warning" }, `${missing} samples are not done yet: rerun with --resume to finish them`) : "") +
    tag("div", { class: "tables" }, percentileTable(summary, str(d, "probeUnit") ?? undefined)) +
    (worst.length > 0 ? tag("div", { class: "tables" }, dataTable(["sample", "outcome", "measured", "drawn", "reproduce"], worst, [], "worst samples")) : "")
  );
}

/** A design window: the yield at each setting and the settings that reach the required yield. */
export function windowSection(d: Json): string {
  const target = str(d, "target") ?? "";
  const unit = str(d, "unit") ?? "";
  const rows = list(d, "points").map((p): Cell[] => {
    const summary = field(p, "summary");
    const y = field(summary, "yield");
    const interval = field(y, "interval");
    const percentiles = field(summary, "percentiles");
    return [
      si(num(p, "value"), unit),
      percent(num(y, "value")),
      `${percent(num(interval, "low"), 3)} to ${percent(num(interval, "high"), 3)}`,
      metric("frequency", num(field(percentiles, "frequency"), "median")),
      metric("amplitude", num(field(percentiles, "amplitude"), "median"), str(d, "probeUnit") ?? undefined),
      outcomeCell(field(p, "pass") === true, "meets", "short"),
    ];
  });
  const w = field(d, "window");
  const line = w ? `window: ${target} from ${si(num(w, "from"), unit)} to ${si(num(w, "to"), unit)} meets the required yield of ${percent(num(d, "required"))}` : `no setting of ${target} reaches the required yield of ${percent(num(d, "required"))}`;
  return (
    tag("h3", {}, `design window over ${textTag("code", {}, target)}`) +
    note(studyLine(d)) +
    textTag("p", { class: "explanation" }, line) +
    tag("div", { class: "tables" }, dataTable([target, "yield", "95 % interval", "median f", "median amplitude", ""], rows, [true, true, true, true, true, false]))
  );
}

/** The spec table: each criterion, what was measured (or its yield), and the outcome. */
export function specSection(spec: Json): string {
  const criteria = list(spec, "criteria");
  const overall = criteria.find((c) => field(c, "combined") === true);
  const pass = field(spec, "pass") === true;
  const head = tag("h3", {}, `spec ${textTag("span", { class: `verdict ${pass ? "good" : "bad"}` }, pass ? "met" : "NOT met")}`);
  if (overall) {
    const rows = criteria.map((c): Cell[] => {
      const interval = field(c, "interval");
      return [
        field(c, "combined") === true ? `all together (${str(c, "text")})` : (str(c, "text") ?? ""),
        percent(num(c, "measured")),
        interval ? `${percent(num(interval, "low"))} to ${percent(num(interval, "high"))}` : "",
        num(c, "passed") === null ? "" : `${num(c, "passed")} of ${num(c, "runs")}`,
        outcomeCell(field(c, "pass") === true),
      ];
    });
    return head + tag("div", { class: "tables" }, dataTable(["criterion", "yield", "95 % interval", "samples", "result"], rows, [false, true, true, true, false]));
  }
  const met = criteria.filter((c) => field(c, "pass") === true).length;
  const rows = criteria.map((c): Cell[] => [str(c, "text") ?? "", metric(str(c, "metric") ?? "", num(c, "measured"), str(c, "unit") ?? undefined), outcomeCell(field(c, "pass") === true)]);
  return head + note(`${met} of ${criteria.length} criteria pass (checked on ${str(spec, "on") ?? ""})`) + tag("div", { class: "tables" }, dataTable(["criterion", "measured", "result"], rows, [false, true, false]));
}

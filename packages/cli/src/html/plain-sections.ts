import type { Excitation, QuantityUnit } from "@onset/core";
import { formatDecibel } from "../format/index.js";
import type { Json } from "../json/results.js";
import { numericalFloorDbc } from "../plot/index.js";
import { excitationText } from "../report/startup.js";
import { percent, perSecond, si, withBar as figureWithBar } from "../report/values.js";
import { tag, textTag } from "./markup.js";
import { dataTable, field, list, num, pairsTable, str, type Cell } from "./tables.js";

const VERDICT_TONE: Readonly<Record<string, string>> = { settled: "good", bouncing: "bad", relaxation: "warn", parasitic: "warn", growing: "warn", unsettled: "warn", latched: "bad", decaying: "bad", silent: "bad" };

/** A verdict as a badge coloured by how good it is. */
export function verdictBadge(verdict: string): string {
  return textTag("span", { class: `verdict ${VERDICT_TONE[verdict] ?? "warn"}` }, verdict === "growing" ? "still growing" : verdict);
}

/** A settled figure with its error bar `value ± bar` when the run has one. */
function withBar(value: number | null, bar: number | null, unit: string): string {
  return figureWithBar(value, bar ?? undefined, unit);
}

function note(text: string): string {
  return textTag("p", { class: "note" }, text);
}

/** Harmonics the first table lists, as the text report does; the rest fold out below it. */
const LISTED_HARMONICS = 10;

function harmonicTables(rows: readonly Cell[][], floor: number): string {
  if (rows.length === 0) return "";
  const headers = ["order", "frequency", "amplitude", "level"];
  const numeric = [true, true, true, true];
  const first = dataTable(headers, rows.slice(0, LISTED_HARMONICS), numeric, `harmonics (numerical floor ${formatDecibel(floor, "dBc", 0)})`);
  const rest = rows.slice(LISTED_HARMONICS);
  if (rest.length === 0) return tag("div", {}, first);
  const more = tag("details", { class: "more" }, textTag("summary", {}, `harmonics ${LISTED_HARMONICS + 1}–${LISTED_HARMONICS + rest.length}`) + dataTable(headers, rest, numeric));
  return tag("div", {}, first + more);
}

function startupSection(d: Json): string {
  const unit = (str(d, "unit") ?? "V") as QuantityUnit;
  const e = field(d, "numericalError");
  const bar = (key: string) => num(e, key);
  const orders = list(d, "thdOrders");
  const last = typeof orders[1] === "number" ? orders[1] : 0;
  const rows: [string, Cell][] = [
    ["frequency", withBar(num(d, "frequency"), bar("frequency"), "Hz")],
    ["frequency spread", si(num(d, "frequencySpread"), "Hz", 3)],
    ["amplitude (peak)", withBar(num(d, "amplitude"), bar("amplitude"), unit)],
    ["peak-to-peak", si(num(d, "peakToPeak"), unit)],
    ["rms", withBar(num(d, "rms"), bar("rms"), unit)],
    ["offset", si(num(d, "offset"), unit, 3)],
    ["start-up time (90 %)", si(num(d, "startupTime"), "s")],
  ];
  const spread = field(d, "startupTimeSpread");
  if (spread) rows.push(["start-up spread", `${si(num(spread, "min"), "s")} … ${si(num(spread, "max"), "s")}, median ${si(num(spread, "median"), "s")} over ${list(spread, "seeds").length} seeds`]);
  rows.push(["settling time", si(num(d, "settlingTime"), "s")], ["growth rate", perSecond(num(d, "growthRate"))], [`THD (2–${last})`, withBar(num(d, "thd"), bar("thd"), "1")]);
  const kind = str(field(d, "excitation"), "kind");
  if (num(d, "thdPlusNoise") !== null && (kind === "thermal" || kind === "power-on")) rows.push([`THD+N (to ${last}·f)`, percent(num(d, "thdPlusNoise"))]);
  if (num(d, "dutyCycle") !== null) rows.push(["duty cycle", percent(num(d, "dutyCycle"))]);
  rows.push(["cycles", String(num(d, "cycles") ?? "—")]);
  if (num(d, "suggestedExtraTime") !== null) rows.push(["run longer by", si(num(d, "suggestedExtraTime"), "s", 3)]);
  const harmonics = list(d, "harmonics");
  const fundamental = num(harmonics[0], "amplitude") ?? 0;
  const floor = numericalFloorDbc(fundamental, bar("amplitude") ?? undefined);
  const harmonicRows = harmonics.map((h): Cell[] => {
    const level = num(h, "dBc") ?? Number.NaN;
    const buried = level < floor;
    return [String(num(h, "order")), si(num(h, "frequency"), "Hz"), si(num(h, "amplitude"), unit), { html: textTag("span", { class: buried ? "muted" : "" }, buried ? `below the floor (${formatDecibel(level, "dBc")})` : formatDecibel(level, "dBc")) }];
  });
  const settled = field(d, "settled");
  const points = list(settled, "points");
  const settledText =
    str(settled, "from") === "orbit" && points.length === 2
      ? `the periodic orbit next to the run, found by shooting on ${points[0]} and ${points[1]} points per period and extrapolated; ± is how far the extrapolation moved each figure, a bound on its numerical error`
      : (str(settled, "note") ?? "the run's last cycles");
  const solver = field(d, "solver");
  const x = field(d, "excitation") as unknown as Excitation;
  const first = num(x as unknown as Json, "firstCycleRms");
  const notes = [
    `settled figures: ${settledText}`,
    `excitation: ${excitationText(x, unit)}${first === null ? "" : `; ${si(first, unit, 3)} rms at the probe over the first cycle${kind === "power-on" ? " after the ramp" : ""}`}`,
    `simulated ${si(num(d, "until"), "s")}, largest step ${si(num(d, "maxStep"), "s", 3)}`,
    `solver: ${num(solver, "accepted")} steps, ${num(solver, "rejected")} rejected, ${num(solver, "newtonIterations")} Newton iterations, ${num(solver, "factorizations")} factorizations`,
  ];
  const warnings = list(d, "warnings").map((w) => tag("li", { class: "warning" }, textTag("strong", {}, str(w, "message") ?? "") + textTag("span", { class: "hint" }, ` hint: ${str(w, "hint") ?? ""}`)));
  return (
    tag("h3", {}, `start-up on ${textTag("code", {}, str(d, "probe") ?? "")}: ${verdictBadge(str(d, "verdict") ?? "")}`) +
    textTag("p", { class: "explanation" }, str(d, "explanation") ?? "") +
    tag("div", { class: "tables" }, pairsTable(rows) + harmonicTables(harmonicRows, floor)) +
    notes.map(note).join("") +
    (warnings.length > 0 ? tag("ul", { class: "warnings" }, warnings.join("")) : "")
  );
}

function biasSection(d: Json): string {
  const nodes = list(d, "nodes").map((n): Cell[] => [str(n, "node") ?? "", si(num(n, "voltage"), "V")]);
  const sources = list(d, "sources").map((s): Cell[] => [str(s, "part") ?? "", si(num(s, "current"), "A")]);
  return (
    tag("h3", {}, "bias point") +
    tag("div", { class: "tables" }, dataTable(["node", "voltage"], nodes, [false, true]) + (sources.length > 0 ? dataTable(["source", "current"], sources, [false, true]) : "")) +
    note(`found by ${str(d, "method") ?? "Newton"} in ${num(d, "iterations") ?? "—"} iterations`)
  );
}

function transientSection(d: Json): string {
  const rows = list(d, "probes").map((p): Cell[] => {
    const unit = str(p, "unit") ?? "";
    return [str(p, "name") ?? "", si(num(p, "min"), unit), si(num(p, "max"), unit), si(num(p, "final"), unit)];
  });
  return tag("h3", {}, "transient") + tag("div", { class: "tables" }, dataTable(["probe", "min", "max", "final"], rows, [false, true, true, true])) + note(`${num(d, "points")} points to ${si(num(d, "until"), "s")}`);
}

function polesSection(d: Json): string {
  const rows = list(d, "poles").map((p): Cell[] => {
    const real = num(p, "real") ?? 0;
    const imag = num(p, "imag") ?? 0;
    return [perSecond(real), `${si(Math.abs(imag) / (2 * Math.PI), "Hz")}${imag === 0 ? " (real)" : ""}`, real > 0 ? "grows" : "decays"];
  });
  const starts = field(d, "starts") === true;
  const dominant = field(d, "dominant");
  const head = dominant
    ? `dominant pair at ${si(num(d, "frequency"), "Hz")}, growth rate ${perSecond(num(d, "growthRate"))}: ${starts ? "right of the imaginary axis, the circuit starts" : "left of the imaginary axis, oscillation dies away"}`
    : "every pole is real: no oscillation is predicted";
  const comparison = field(d, "comparison");
  const compare = comparison ? comparisonTable(comparison) : "";
  return tag("h3", {}, `poles: ${textTag("span", { class: `verdict ${starts ? "good" : "bad"}` }, starts ? "starts" : "does not start")}`) + textTag("p", { class: "explanation" }, head) + tag("div", { class: "tables" }, dataTable(["real part", "frequency", ""], rows, [true, true, false])) + compare;
}

/** The poles' prediction beside the simulated start-up (see `predictionCheck`). */
function comparisonTable(c: Json): string {
  const predicted = field(c, "predicted");
  const simulated = field(c, "simulated");
  const row = (label: string, key: string, show: (v: number | null) => string): Cell[] => [label, show(num(predicted, key)), show(num(simulated, key))];
  const rows = [row("frequency", "frequency", (v) => si(v, "Hz")), row("growth rate", "growthRate", perSecond), row("start-up time", "startupTime", (v) => si(v, "s"))];
  const start = num(c, "startLevel");
  return dataTable(["", "predicted by the poles", `simulated on ${str(c, "probe") ?? ""}`], rows, [false, true, true], start === null ? undefined : `growth from ${si(start, str(c, "unit") ?? "V", 3)} peak of noise`);
}

function responseSection(d: Json): string {
  const unit = str(d, "unit") ?? "";
  const rows: [string, Cell][] = [];
  const notch = field(d, "notch");
  if (notch) rows.push(["notch", `${si(num(notch, "frequency"), "Hz")}, depth ${formatDecibel(num(notch, "depthDb") ?? num(notch, "magnitudeDb") ?? Number.NaN, "dB")}`]);
  for (const c of list(d, "phaseCrossings")) rows.push([`phase ${num(c, "phase")}°`, si(num(c, "frequency"), "Hz")]);
  const cutoffs = list(d, "cutoffs");
  if (cutoffs.length > 0) rows.push(["−3 dB", cutoffs.map((f) => si(typeof f === "number" ? f : null, "Hz")).join(", ")]);
  const points = list(d, "points");
  const peak = points.reduce<Json | null>((best, p) => ((num(p, "magnitude") ?? 0) > (num(best ?? null, "magnitude") ?? -1) ? p : best), null);
  if (peak) rows.push(["largest gain", `${formatDecibel(num(peak, "magnitudeDb") ?? Number.NaN, "dB")} at ${si(num(peak, "frequency"), "Hz")}`]);
  return tag("h3", {}, `frequency response of ${textTag("code", {}, str(d, "to") ?? "")} to ${textTag("code", {}, str(d, "from") ?? "")}`) + tag("div", { class: "tables" }, pairsTable(rows)) + note(`${points.length} frequencies from ${si(num(points[0], "frequency"), "Hz")} to ${si(num(points[points.length - 1], "frequency"), "Hz")}${unit ? `, ratio in ${unit}` : ""}`);
}

/** The tables and notes of one plain analysis, from its JSON document. */
export function plainSection(d: Json): string {
  switch (str(d, "analysis")) {
    case "startup":
      return startupSection(d);
    case "bias":
      return biasSection(d);
    case "transient":
      return transientSection(d);
    case "poles":
      return polesSection(d);
    case "response":
      return responseSection(d);
    default:
      return note(`an analysis of kind ${str(d, "analysis") ?? "unknown"}: see the report below`);
  }
}

import type { ResponseResult } from "@onset/core";
import type { Paint } from "../color.js";
import { formatDecibel, formatPlain } from "../format/index.js";
import { pairs } from "./table.js";
import { si } from "./values.js";

/** The response summary: largest gain, the notch, phase crossings of 0° and ±180°, the −3 dB points. */
export function responseReport(r: ResponseResult, p: Paint): string[] {
  const first = r.points[0];
  const last = r.points[r.points.length - 1];
  const lines = [
    p.bold(`response of ${r.to} to ${r.from}`) + p.dim(`  (${si(first?.frequency, "Hz")} to ${si(last?.frequency, "Hz")}, ${r.points.length} points)`),
  ];
  let peak = r.points[0];
  for (const point of r.points) if (peak && point.magnitude > peak.magnitude) peak = point;
  const entries: [string, string][] = [];
  if (peak) entries.push(["largest |H|", `${formatPlain(peak.magnitude)} (${formatDecibel(peak.magnitudeDb)}) at ${si(peak.frequency, "Hz")}`]);
  entries.push(["notch", r.notch ? `${si(r.notch.frequency, "Hz")}, ${formatDecibel(r.notch.depthDb)} deep (|H| ${formatPlain(r.notch.magnitude)})` : "none"]);
  const crossings = r.phaseCrossings.filter((c) => c.phase === 0 || Math.abs(c.phase) === 180);
  if (crossings.length === 0) entries.push(["phase 0°/±180°", "not crossed"]);
  for (const c of crossings) {
    const sign = c.value >= 0 ? "in phase" : "inverted";
    entries.push([`phase ${formatPlain(c.phase)}°`, `${si(c.frequency, "Hz")}, |H| ${formatPlain(c.magnitude)} (${sign})`]);
  }
  entries.push(["−3 dB points", r.cutoffs.length > 0 ? r.cutoffs.map((f) => si(f, "Hz")).join(", ") : "none"]);
  lines.push(...pairs(entries));
  return lines;
}

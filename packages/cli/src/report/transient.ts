import type { TransientAnalysis, TransientResult } from "@onset/core";
import type { Paint } from "../color.js";
import { partWarningLines } from "./part-warnings.js";
import { table } from "./table.js";
import { si } from "./values.js";

/** Smallest and largest value of a record (NaN-free records assumed). */
export function extremes(values: ArrayLike<number>): { min: number; max: number } {
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  return { min, max };
}

/** The transient summary: steps, rejected steps, Newton iterations, min/max/final of each probe. */
export function transientReport(a: TransientAnalysis, r: TransientResult, p: Paint): string[] {
  const s = r.stats;
  const end = r.time.length > 0 ? r.time[r.time.length - 1]! : 0;
  const lines = [
    p.bold(`transient to ${si(a.until, "s")}`) +
      p.dim(`  (${s.accepted} steps, ${s.rejected} rejected, ${s.newtonIterations} Newton iterations, start from ${a.start === "rest" ? "rest" : "the bias point"})`) +
      (r.stride !== undefined && r.stride > 1 ? p.dim(`  waveforms keep one step in ${r.stride} (--limit stored-points)`) : ""),
  ];
  const rows = r.signals.map((signal) => {
    const { min, max } = signal.min !== undefined && signal.max !== undefined ? { min: signal.min, max: signal.max } : extremes(signal.values);
    const final = signal.values.length > 0 ? signal.values[signal.values.length - 1]! : NaN;
    return [signal.name, si(min, signal.unit), si(max, signal.unit), si(final, signal.unit)];
  });
  lines.push(
    ...table(
      [{ header: "probe" }, { header: "min", align: "right" }, { header: "max", align: "right" }, { header: `at ${si(end, "s")}`, align: "right" }],
      rows,
    ),
  );
  lines.push(...partWarningLines(r.warnings, p));
  return lines;
}

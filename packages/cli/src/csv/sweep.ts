import { startupAt, type SweepReport } from "../study/sweep-report.js";
import { csvDocument, csvField, csvNumber, ERROR_COLUMNS, errorCells } from "./csv.js";

type Startup = NonNullable<ReturnType<typeof startupAt>>;

/** The start-up figures of each row, by column: the envelope's bounce beside the settling time. */
const METRICS: readonly (readonly [string, (s: Startup) => number | null])[] = [
  ["frequency", (s) => s.frequency],
  ["amplitude", (s) => s.amplitude],
  ["thd", (s) => s.thd],
  ["startupTime", (s) => s.startupTime],
  ["settlingTime", (s) => s.settlingTime],
  ["bounceFrequency", (s) => s.envelope.bounceFrequency],
  ["dampingRatio", (s) => s.envelope.dampingRatio],
  ["growthRate", (s) => s.growthRate],
  ["offset", (s) => s.offset],
  ["rms", (s) => s.rms],
  ["peakToPeak", (s) => s.peakToPeak],
];

/** The CSV of a sweep: the setting (column named after the target), `verdict`, the start-up metrics, their error bars and `pass`. */
export function sweepCsv(r: SweepReport): string {
  const rows = r.result.points.map((p) => {
    const st = startupAt(p);
    return [
      csvNumber(p.value),
      st ? csvField(st.verdict) : "",
      ...METRICS.map(([, read]) => csvNumber(st ? read(st) : null)),
      ...errorCells(st?.numericalError),
      p.run.spec === null ? "" : p.run.spec.pass ? "1" : "0",
    ];
  });
  return csvDocument([r.result.target, "verdict", ...METRICS.map(([name]) => name), ...ERROR_COLUMNS, "pass"], rows);
}

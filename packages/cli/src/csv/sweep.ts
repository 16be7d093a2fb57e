import { startupAt, type SweepReport } from "../study/sweep-report.js";
import { csvDocument, csvField, csvNumber, ERROR_COLUMNS, errorCells } from "./csv.js";

const METRICS = ["frequency", "amplitude", "thd", "startupTime", "settlingTime", "growthRate", "offset", "rms", "peakToPeak"] as const;

/** The CSV of a sweep: the setting (column named after the target), `verdict`, the start-up metrics, their error bars and `pass`. */
export function sweepCsv(r: SweepReport): string {
  const rows = r.result.points.map((p) => {
    const st = startupAt(p);
    return [
      csvNumber(p.value),
      st ? csvField(st.verdict) : "",
      ...METRICS.map((k) => csvNumber(st ? st[k] : null)),
      ...errorCells(st?.numericalError),
      p.run.spec === null ? "" : p.run.spec.pass ? "1" : "0",
    ];
  });
  return csvDocument([r.result.target, "verdict", ...METRICS, ...ERROR_COLUMNS, "pass"], rows);
}

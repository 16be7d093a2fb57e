import { steadyVerdict } from "@onset/core";
import { startupAt, steadyAt, type SweepReport } from "../study/sweep-report.js";
import { csvDocument, csvField, csvNumber, ERROR_COLUMNS, errorCells } from "./csv.js";

type Startup = NonNullable<ReturnType<typeof startupAt>>;
type Steady = NonNullable<ReturnType<typeof steadyAt>>;

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

/** The steady state's figures of each row under measure=steady: the orbit's, then the poles' predictions. */
const STEADY_METRICS: readonly (readonly [string, (s: Steady) => number | null])[] = [
  ["frequency", (s) => s.frequency],
  ["amplitude", (s) => s.amplitude],
  ["thd", (s) => s.thd],
  ["offset", (s) => s.offset],
  ["rms", (s) => s.rms],
  ["peakToPeak", (s) => s.peakToPeak],
  ["predictedStartupTime", (s) => s.predicted.startupTime],
  ["predictedGrowthRate", (s) => s.predicted.growthRate],
];

function passCell(p: SweepReport["result"]["points"][number]): string {
  return p.run.spec === null ? "" : p.run.spec.pass ? "1" : "0";
}

/**
 * The CSV of a sweep: the setting (column named after the target), `verdict`, the start-up
 * metrics, their error bars and `pass`. Under measure=steady: `verdict` (see `steadyVerdict`),
 * `orbit` (stable, unstable, marginal or none), the orbit's figures, the predicted start-up time
 * and growth rate, the error bars and `pass`.
 */
export function sweepCsv(r: SweepReport): string {
  if (r.result.measure === "steady") {
    const rows = r.result.points.map((p) => {
      const st = steadyAt(p);
      return [
        csvNumber(p.value),
        st ? csvField(steadyVerdict(st)) : "",
        st ? csvField(st.found ? (st.stability?.verdict ?? "") : "none") : "",
        ...STEADY_METRICS.map(([, read]) => csvNumber(st ? read(st) : null)),
        ...errorCells(st?.numericalError),
        passCell(p),
      ];
    });
    return csvDocument([r.result.target, "verdict", "orbit", ...STEADY_METRICS.map(([name]) => name), ...ERROR_COLUMNS, "pass"], rows);
  }
  const rows = r.result.points.map((p) => {
    const st = startupAt(p);
    return [
      csvNumber(p.value),
      st ? csvField(st.verdict) : "",
      ...METRICS.map(([, read]) => csvNumber(st ? read(st) : null)),
      ...errorCells(st?.numericalError),
      passCell(p),
    ];
  });
  return csvDocument([r.result.target, "verdict", ...METRICS.map(([name]) => name), ...ERROR_COLUMNS, "pass"], rows);
}

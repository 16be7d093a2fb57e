import { columnRows, csvDocument, headed } from "../csv/csv.js";
import { transientFigure } from "../plot/index.js";
import { partWarningsJson } from "../report/part-warnings.js";
import { extremes, transientReport } from "../report/transient.js";
import type { AnalysisWriters } from "./analysis-writers.js";

/** `transient`: each probe's extremes; CSV `time (s)` then one column per probe as written (`o (V)`, `R1.i (A)`, `U1.pole (V)`); the probes against time. */
export const transientWriters: AnalysisWriters<"transient"> = {
  text: ({ analysis, result }, _runs, p) => transientReport(analysis, result, p),
  json: (r) => ({
    analysis: "transient",
    until: r.time.length > 0 ? r.time[r.time.length - 1]! : 0,
    points: r.time.length,
    probes: r.signals.map((s) => {
      const { min, max } = extremes(s.values);
      return { name: s.name, unit: s.unit, min, max, final: s.values.length > 0 ? s.values[s.values.length - 1]! : null };
    }),
    solver: { ...r.stats },
    ...partWarningsJson(r.warnings),
  }),
  csv: (r) => csvDocument([headed("time", "s"), ...r.signals.map((s) => headed(s.name, s.unit))], columnRows(r.time, r.signals.map((s) => s.values))),
  figure: (r, title) => transientFigure({ title: `${title} \u2014 transient`, time: r.time, probes: r.signals.map((s) => ({ name: s.name, unit: s.unit, values: s.values })) }),
};

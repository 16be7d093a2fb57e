import { columnRows, csvDocument, headed } from "../csv/csv.js";
import { steadyJson } from "../json/steady.js";
import { transientFigure } from "../plot/index.js";
import { steadyReport } from "../report/steady.js";
import type { AnalysisWriters } from "./analysis-writers.js";

/** `steady`: the orbit's figures and stability; CSV `time (s)` and the probe over one period of the orbit, from its start; that period plotted. */
export const steadyWriters: AnalysisWriters<"steady"> = {
  text: ({ result }, _runs, p) => steadyReport(result, p),
  json: steadyJson,
  csv: (r) => csvDocument([headed("time", "s"), headed(r.probe, r.unit)], columnRows(r.waveform.time, [r.waveform.values])),
  figure: (r, title) =>
    !r.found ? null : transientFigure({ title: `${title} \u2014 one period of the steady state on ${r.probe}`, time: r.waveform.time, probes: [{ name: r.probe, unit: r.unit, values: r.waveform.values }] }),
};

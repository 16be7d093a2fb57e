import { csvDocument, csvNumber, headed } from "../csv/csv.js";
import type { Json } from "../json/results.js";
import { polesReport } from "../report/poles.js";
import { predictionCheck } from "../report/prediction.js";
import { firstStartup, type AnalysisWriters } from "./analysis-writers.js";

/** `poles`: a table compared with the file's first start-up; CSV `real (1/s)`, `imag (rad/s)`, `frequency (Hz)`; no figure. */
export const polesWriters: AnalysisWriters<"poles"> = {
  text: ({ result }, runs, p) => {
    const startup = firstStartup(runs);
    return polesReport(result, startup ? predictionCheck(result, startup) : null, startup ? startup.unit : "V", p);
  },
  json: (r, runs) => {
    const startup = firstStartup(runs);
    return {
      analysis: "poles",
      poles: r.poles.map((p) => ({ real: p.real, imag: p.imag })),
      dominant: r.dominant ? { real: r.dominant.real, imag: r.dominant.imag } : null,
      frequency: r.frequency,
      growthRate: r.growthRate,
      starts: r.starts,
      comparison: startup ? (predictionCheck(r, startup) as unknown as Json) : undefined,
    };
  },
  csv: (r) => csvDocument([headed("real", "1/s"), headed("imag", "rad/s"), headed("frequency", "Hz")], r.poles.map((p) => [csvNumber(p.real), csvNumber(p.imag), csvNumber(Math.abs(p.imag) / (2 * Math.PI))])),
};

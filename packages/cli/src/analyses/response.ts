import type { ResponseResult } from "@onset/core";
import type { ResponsePlot } from "../plot/index.js";
import { csvDocument, csvNumber, headed } from "../csv/csv.js";
import { responseFigure } from "../plot/index.js";
import { responseReport } from "../report/response.js";
import type { AnalysisWriters } from "./analysis-writers.js";

/** `response`: CSV `frequency (Hz)`, `magnitude` (a ratio), `magnitude (dB)`, `phase (deg)`; magnitude and phase against frequency (Bode). */
export const responseWriters: AnalysisWriters<"response"> = {
  text: ({ result }, _runs, p) => responseReport(result, p),
  json: (r) => ({
    analysis: "response",
    unit: r.unit,
    from: r.from,
    to: r.to,
    points: r.points.map((p) => ({ frequency: p.frequency, magnitude: p.magnitude, magnitudeDb: p.magnitudeDb, phase: p.phase })),
    notch: r.notch ? { ...r.notch } : null,
    phaseCrossings: r.phaseCrossings.map((c) => ({ ...c })),
    cutoffs: [...r.cutoffs],
  }),
  csv: (r) =>
    csvDocument(
      [headed("frequency", "Hz"), "magnitude", headed("magnitude", "dB"), headed("phase", "deg")],
      r.points.map((p) => [csvNumber(p.frequency), csvNumber(p.magnitude), csvNumber(p.magnitudeDb), csvNumber(p.phase)]),
    ),
  figure: (r, title) => responseFigure(responsePlot(r, `${title} \u2014 response of ${r.to} to ${r.from}`)),
};

/** What the response plot draws of a result. */
export function responsePlot(r: ResponseResult, title: string): ResponsePlot {
  const inverted = r.phaseCrossings.find((c) => Math.abs(c.phase) === 180);
  return {
    title,
    frequency: r.points.map((p) => p.frequency),
    magnitude: r.points.map((p) => p.magnitude),
    phase: r.points.map((p) => p.phase),
    ...(r.notch ? { notch: r.notch.frequency } : {}),
    ...(inverted ? { phaseCrossing: inverted.frequency } : {}),
  };
}

import type { ResponseResult, StartupResult } from "@onset/core";
import type { Figure, ResponsePlot, StartupPlot } from "../plot/index.js";
import { responseFigure, startupFigure, transientFigure } from "../plot/index.js";
import type { AnalysisRun } from "../report/plain-types.js";

/** True when an analysis of this kind has a figure; bias and poles are tables (see `resultFigure`). */
export function hasFigure(kind: string): boolean {
  return kind !== "bias" && kind !== "poles";
}

/**
 * The figure of one analysis, or null when it has none (bias and poles are tables):
 * transient → probes against time; start-up → waveform with its envelope, start-up and
 * settling markers and the spectrum; response → magnitude and phase (Bode).
 */
export function resultFigure(run: AnalysisRun, title: string): Figure | null {
  const r = run.result;
  switch (r.analysis) {
    case "transient":
      return transientFigure({ title: `${title} \u2014 transient`, time: r.time, probes: r.signals.map((s) => ({ name: s.name, unit: s.unit, values: s.values })) });
    case "startup":
      return startupFigure(startupPlot(r, `${title} \u2014 start-up on ${r.probe} (${r.verdict})`));
    case "response":
      return responseFigure(responsePlot(r, `${title} \u2014 response of ${r.to} to ${r.from}`));
    case "bias":
    case "poles":
      return null;
  }
}

/** What the start-up plots draw of a result (shared by the SVG figure and the HTML report). */
export function startupPlot(r: StartupResult, title: string): StartupPlot {
  const bar = r.numericalError?.amplitude;
  return {
    title,
    time: r.waveform.time,
    probe: { name: r.probe, unit: r.unit, values: r.waveform.values },
    envelope: { time: r.envelope.time, values: r.envelope.value },
    offset: r.offset ?? 0,
    ...(r.startupTime === null ? {} : { startupTime: r.startupTime }),
    ...(r.settlingTime === null ? {} : { settlingTime: r.settlingTime }),
    harmonics: r.harmonics,
    ...(r.thd === null ? {} : { thd: r.thd }),
    ...(r.frequency === null ? {} : { frequency: r.frequency }),
    ...(r.amplitude === null ? {} : { amplitude: r.amplitude }),
    ...(r.growthRate === null ? {} : { growthRate: r.growthRate }),
    ...(bar === undefined ? {} : { amplitudeError: bar }),
  };
}

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

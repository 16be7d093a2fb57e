import { envelopeFitAt, type StartupResult } from "@onset/core";
import type { EnvelopeBounce, Figure } from "../plot/index.js";
import { responseFigure, startupFigure, transientFigure } from "../plot/index.js";
import type { AnalysisRun } from "../report/plain-types.js";

/** True when an analysis of this kind has a figure; bias and poles are tables (see `resultFigure`). */
export function hasFigure(kind: string): boolean {
  return kind !== "bias" && kind !== "poles";
}

/** Points on the fitted envelope curve in the bounce panel. */
const FIT_POINTS = 600;

/** The envelope's bounce for the plot: the fit sampled from where it starts to the record's end. */
function bounceOf(r: StartupResult): { bounce?: EnvelopeBounce } {
  const e = r.envelope;
  if (e.fit === null || e.bounceFrequency === null || e.dampingRatio === null || e.time.length === 0) return {};
  const fit = e.fit;
  const end = e.time[e.time.length - 1]!;
  const time = Float64Array.from({ length: FIT_POINTS }, (_, k) => fit.from + ((end - fit.from) * k) / (FIT_POINTS - 1));
  return { bounce: { frequency: e.bounceFrequency, dampingRatio: e.dampingRatio, fit: { time, values: time.map((t) => envelopeFitAt(fit, t)) } } };
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
    case "startup": {
      return startupFigure({
        title: `${title} \u2014 start-up on ${r.probe} (${r.verdict})`,
        time: r.waveform.time,
        probe: { name: r.probe, unit: r.unit, values: r.waveform.values },
        envelope: { time: r.envelope.time, values: r.envelope.value },
        offset: r.offset ?? 0,
        ...(r.startupTime === null ? {} : { startupTime: r.startupTime }),
        ...(r.settlingTime === null ? {} : { settlingTime: r.settlingTime }),
        harmonics: r.harmonics,
        ...(r.thd === null ? {} : { thd: r.thd }),
        ...bounceOf(r),
      });
    }
    case "response": {
      const inverted = r.phaseCrossings.find((c) => Math.abs(c.phase) === 180);
      return responseFigure({
        title: `${title} \u2014 response of ${r.to} to ${r.from}`,
        frequency: r.points.map((p) => p.frequency),
        magnitude: r.points.map((p) => p.magnitude),
        phase: r.points.map((p) => p.phase),
        ...(r.notch ? { notch: r.notch.frequency } : {}),
        ...(inverted ? { phaseCrossing: inverted.frequency } : {}),
      });
    }
    case "bias":
    case "poles":
      return null;
  }
}

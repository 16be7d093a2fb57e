import { envelopeFitAt, type StartupResult } from "@onset/core";
import type { EnvelopeBounce, StartupPlot } from "../plot/index.js";
import { columnRows, csvDocument, headed } from "../csv/csv.js";
import type { Json } from "../json/results.js";
import { startupFigure } from "../plot/index.js";
import { startupReport } from "../report/startup.js";
import type { AnalysisWriters } from "./analysis-writers.js";
import { warningsJson } from "../report/part-warnings.js";

/** A start-up result without its waveform and envelope arrays (they are large). */
export function startupJson(r: StartupResult): Json {
  return {
    analysis: "startup",
    probe: r.probe,
    unit: r.unit,
    judgedAt: r.run.judgedAt,
    verdict: r.verdict,
    explanation: r.explanation,
    frequency: r.frequency,
    frequencySpread: r.frequencySpread,
    amplitude: r.amplitude,
    peakToPeak: r.peakToPeak,
    rms: r.rms,
    offset: r.offset,
    startupTime: r.startupTime,
    startupTimeSpread: r.startupTimeSpread ? { ...r.startupTimeSpread, seeds: [...r.startupTimeSpread.seeds], times: [...r.startupTimeSpread.times] } : undefined,
    settlingTime: r.settlingTime,
    envelope: { bounceFrequency: r.envelope.bounceFrequency, dampingRatio: r.envelope.dampingRatio },
    dutyCycle: r.dutyCycle,
    growthRate: r.growthRate,
    thd: r.thd,
    thdOrders: [...r.thdOrders],
    thdPlusNoise: r.thdPlusNoise,
    numericalError: r.numericalError ? { ...r.numericalError } : null,
    settled: { from: r.settled.from, note: r.settled.note, iterations: r.settled.iterations && [...r.settled.iterations], points: r.settled.points && [...r.settled.points] },
    harmonics: r.harmonics.map((h) => ({ order: h.order, frequency: h.frequency, amplitude: h.amplitude, dBc: h.dBc })),
    cycles: r.cycles,
    suggestedExtraTime: r.suggestedExtraTime,
    periodDoubled: r.periodDoubled ? { ...r.periodDoubled } : undefined,
    until: r.run.until,
    maxStep: r.run.maxStep,
    excitation: { ...r.run.excitation },
    predicted: { ...r.run.predicted },
    solver: { ...r.run.solver },
    warnings: warningsJson(r.warnings),
  };
}

/** `startup`: the verdict and settled figures; CSV `time (s)` and the probe; the waveform with its envelope, markers and spectrum. */
export const startupWriters: AnalysisWriters<"startup"> = {
  text: ({ result }, _runs, p) => startupReport(result, result.unit, p),
  json: startupJson,
  csv: (r) => csvDocument([headed("time", "s"), headed(r.probe, r.unit)], columnRows(r.waveform.time, [r.waveform.values])),
  figure: (r, title) => startupFigure(startupPlot(r, `${title} \u2014 start-up on ${r.probe} (${r.verdict})`)),
};

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
    ...bounceOf(r),
  };
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

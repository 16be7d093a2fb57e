import type { PolesResult, ResponseResult, StartupResult, TransientResult } from "@onset/core";
import type { AnalysisRun } from "../report/plain-types.js";
import { predictionCheck } from "../report/prediction.js";
import { extremes } from "../report/transient.js";

/** A JSON value as the documents carry it. */
export type Json = null | boolean | number | string | readonly Json[] | { readonly [key: string]: Json | undefined };

function transientJson(r: TransientResult): Json {
  return {
    analysis: "transient",
    until: r.time.length > 0 ? r.time[r.time.length - 1]! : 0,
    points: r.time.length,
    probes: r.signals.map((s) => {
      const { min, max } = extremes(s.values);
      return { name: s.name, unit: s.unit, min, max, final: s.values.length > 0 ? s.values[s.values.length - 1]! : null };
    }),
    solver: { ...r.stats },
  };
}

/** A start-up result without its waveform and envelope arrays (they are large). */
export function startupJson(r: StartupResult): Json {
  return {
    analysis: "startup",
    probe: r.probe,
    unit: r.unit,
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
    until: r.run.until,
    maxStep: r.run.maxStep,
    excitation: { ...r.run.excitation },
    predicted: { ...r.run.predicted },
    solver: { ...r.run.solver },
    warnings: r.warnings.map((w) => ({ code: w.code, message: w.message, hint: w.hint })),
  };
}

function polesJson(r: PolesResult, startup: StartupResult | undefined): Json {
  return {
    analysis: "poles",
    poles: r.poles.map((p) => ({ real: p.real, imag: p.imag })),
    dominant: r.dominant ? { real: r.dominant.real, imag: r.dominant.imag } : null,
    frequency: r.frequency,
    growthRate: r.growthRate,
    starts: r.starts,
    comparison: startup ? (predictionCheck(r, startup) as unknown as Json) : undefined,
  };
}

function responseJson(r: ResponseResult): Json {
  return {
    analysis: "response",
    unit: r.unit,
    from: r.from,
    to: r.to,
    points: r.points.map((p) => ({ frequency: p.frequency, magnitude: p.magnitude, magnitudeDb: p.magnitudeDb, phase: p.phase })),
    notch: r.notch ? { ...r.notch } : null,
    phaseCrossings: r.phaseCrossings.map((c) => ({ ...c })),
    cutoffs: [...r.cutoffs],
  };
}

/** The JSON of each result, in file order; poles compare against the file's first start-up. */
export function resultsJson(runs: readonly AnalysisRun[]): Json[] {
  const startup = runs.map((x) => x.result).find((r): r is StartupResult => r.analysis === "startup");
  return runs.map(({ result: r }) => {
    switch (r.analysis) {
      case "bias":
        return {
          analysis: "bias",
          nodes: r.nodes.map((n) => ({ ...n })),
          sources: r.sources.map((s) => ({ ...s })),
          method: r.method,
          iterations: r.iterations,
          ...(r.warnings ? { warnings: r.warnings.map((w) => ({ code: w.diagnostic.code, part: w.part, message: w.diagnostic.message })) } : {}),
        };
      case "transient":
        return transientJson(r);
      case "startup":
        return startupJson(r);
      case "poles":
        return polesJson(r, startup);
      case "response":
        return responseJson(r);
    }
  });
}

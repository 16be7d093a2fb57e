import type { Multiplier, SteadyResult } from "@onset/core";
import type { Json } from "./results.js";
import { warningsJson } from "../report/part-warnings.js";

/** A steady result without its one-period waveform (the CSV carries it). */
export function steadyJson(r: SteadyResult): Json {
  const s = r.stability;
  return {
    analysis: "steady",
    probe: r.probe,
    unit: r.unit,
    found: r.found,
    hardStart: r.hardStart,
    explanation: r.explanation,
    kind: r.kind,
    from: r.from,
    frequency: r.frequency,
    period: r.period,
    amplitude: r.amplitude,
    peakToPeak: r.peakToPeak,
    rms: r.rms,
    offset: r.offset,
    thd: r.thd,
    thdOrders: [...r.thdOrders],
    numericalError: r.numericalError ? { ...r.numericalError } : null,
    harmonics: r.harmonics.map((h) => ({ order: h.order, frequency: h.frequency, amplitude: h.amplitude, dBc: h.dBc })),
    iterations: r.iterations && [...r.iterations],
    points: r.points && [...r.points],
    shooting: r.shooting,
    multipliers: r.multipliers.map(multiplierJson),
    multiplierError: r.multiplierError && [...r.multiplierError],
    trivialMultiplier: r.trivialMultiplier && multiplierJson(r.trivialMultiplier),
    stability: s ? { verdict: s.verdict, largest: s.largest ? Math.hypot(s.largest.re, s.largest.im) : null, rate: s.rate, cyclesToSettle: s.cyclesToSettle } : null,
    predicted: { ...r.predicted },
    transient: { periods: r.transient.periods, until: r.transient.until, maxStep: r.transient.maxStep, solver: { ...r.transient.solver } },
    warnings: warningsJson(r.warnings),
  };
}

function multiplierJson(m: Multiplier): Json {
  return { re: m.re, im: m.im, magnitude: Math.hypot(m.re, m.im) };
}

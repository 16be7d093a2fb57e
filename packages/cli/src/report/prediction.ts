import type { PolesResult, StartupResult } from "@onset/core";

/** The linear prediction at the bias point set beside what the start-up run measured. */
export interface PredictionCheck {
  readonly probe: string;
  /** The probe's unit, and so the start level's. */
  readonly unit: string;
  readonly predicted: { readonly frequency: number | null; readonly growthRate: number | null; readonly startupTime: number | null };
  readonly simulated: { readonly frequency: number | null; readonly growthRate: number | null; readonly startupTime: number | null };
  /** Peak, in the probe's unit: the level the growth starts from, √2 × the excitation's noise r.m.s. at the probe. */
  readonly startLevel: number | null;
}

/** Fraction of the settled amplitude at which start-up is measured (the metric's definition). */
const STARTUP_FRACTION = 0.9;

/**
 * Where the growth starts from: the peak of a sine with the power the excitation's noise leaves
 * at the probe (the mode collects noise of that level before it outgrows it; see `noiseLevel`).
 */
export function startLevel(r: StartupResult): number | null {
  const level = r.run.excitation.noiseAtProbe;
  return level !== null && level > 0 ? Math.SQRT2 * level : null;
}

/**
 * Predicted start-up time t = ln(0.9·A / k) / σ: an envelope growing as e^(σt) from the start
 * level k reaches 90 % of the settled amplitude A (the measured start-up time's own
 * threshold). Saturation slows the last part of the growth, so the simulation is later; the
 * noise's own randomness spreads it by about a time constant 1/σ either way.
 */
export function predictedStartupTime(amplitude: number | null, kick: number | null, growthRate: number | null): number | null {
  if (amplitude === null || kick === null || growthRate === null || !(growthRate > 0) || !(amplitude > kick)) return null;
  return Math.log((STARTUP_FRACTION * amplitude) / kick) / growthRate;
}

/** Poles against start-up: frequency, growth rate and start-up time, predicted and simulated. */
export function predictionCheck(poles: PolesResult, startup: StartupResult): PredictionCheck {
  const kick = startLevel(startup);
  return {
    probe: startup.probe,
    unit: startup.unit,
    predicted: {
      frequency: poles.frequency,
      growthRate: poles.growthRate,
      startupTime: predictedStartupTime(startup.amplitude, kick, poles.growthRate),
    },
    simulated: { frequency: startup.frequency, growthRate: startup.growthRate, startupTime: startup.startupTime },
    startLevel: kick,
  };
}

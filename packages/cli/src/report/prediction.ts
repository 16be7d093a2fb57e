import type { PolesResult, StartupResult } from "@onset/core";

/** The linear prediction at the bias point set beside what the start-up run measured. */
export interface PredictionCheck {
  readonly probe: string;
  readonly predicted: { readonly frequency: number | null; readonly growthRate: number | null; readonly startupTime: number | null };
  readonly simulated: { readonly frequency: number | null; readonly growthRate: number | null; readonly startupTime: number | null };
  /** V (or A): the largest departure of the probe from its starting value while the kick lasts. */
  readonly kickResponse: number | null;
}

/** Fraction of the settled amplitude at which start-up is measured (the metric's definition). */
const STARTUP_FRACTION = 0.9;

/** The probe's largest departure from its first value during the kick: where the growth starts from. */
export function kickResponse(r: StartupResult): number | null {
  const { time, values } = r.waveform;
  if (r.run.kick.kind !== "noise" || values.length === 0) return null;
  const rest = values[0]!;
  let peak = 0;
  for (let k = 0; k < time.length && time[k]! <= r.run.kick.duration; k++) peak = Math.max(peak, Math.abs(values[k]! - rest));
  return peak > 0 ? peak : null;
}

/**
 * Predicted start-up time t = ln(0.9·A / k) / σ: an envelope growing as e^(σt) from the kick
 * response k reaches 90 % of the settled amplitude A (the measured start-up time's own
 * threshold). Saturation slows the last part of the growth, so the simulation is later.
 */
export function predictedStartupTime(amplitude: number | null, kick: number | null, growthRate: number | null): number | null {
  if (amplitude === null || kick === null || growthRate === null || !(growthRate > 0) || !(amplitude > kick)) return null;
  return Math.log((STARTUP_FRACTION * amplitude) / kick) / growthRate;
}

/** Poles against start-up: frequency, growth rate and start-up time, predicted and simulated. */
export function predictionCheck(poles: PolesResult, startup: StartupResult): PredictionCheck {
  const kick = kickResponse(startup);
  return {
    probe: startup.probe,
    predicted: {
      frequency: poles.frequency,
      growthRate: poles.growthRate,
      startupTime: predictedStartupTime(startup.amplitude, kick, poles.growthRate),
    },
    simulated: { frequency: startup.frequency, growthRate: startup.growthRate, startupTime: startup.startupTime },
    kickResponse: kick,
  };
}

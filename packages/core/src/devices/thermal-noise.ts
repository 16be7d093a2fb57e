import type { NoiseGenerator } from "./device.js";

/** Boltzmann constant (J/K), exact in the SI since 2019. */
export const BOLTZMANN = 1.380649e-23;
/** 0 °C in kelvin. */
export const ZERO_CELSIUS = 273.15;

/**
 * Johnson–Nyquist noise of a resistance R at absolute temperature T as a current generator
 * across it: one-sided density 4kT/R (A²/Hz) (Johnson 1928, Nyquist 1928), leaving node `a`
 * and entering node `b` (either may be ground, -1).
 */
export function thermalCurrent(name: string, resistance: number, kelvin: number, a: number, b: number): NoiseGenerator {
  return { name, density: (4 * BOLTZMANN * kelvin) / resistance, from: a, to: b, gain: 1 };
}

/** The same noise as a voltage in series with a branch: one-sided density 4kTR (V²/Hz) on branch row `row`. */
export function thermalVoltage(name: string, resistance: number, kelvin: number, row: number): NoiseGenerator {
  return { name, density: 4 * BOLTZMANN * kelvin * resistance, from: -1, to: row, gain: 1 };
}

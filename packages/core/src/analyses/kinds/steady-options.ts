import type { AnalysisOptions } from "../../circuit/analysis-schema.js";

/**
 * The `steady` statement's options; `runSteady` checks its argument against them too. Plain
 * literals only: a bundler then drops this table from a build that does not use it.
 */
export const steadyOptions: AnalysisOptions = {
  probe: { type: "probe", required: true, summary: "probe the periodic steady state is measured on" },
  from: { type: "word", words: ["startup", "poles"], summary: "where the shooting starts: a short transient in the growing mode (startup) or the poles' frequency (poles)" },
  cycles: { type: "number", unit: "1", min: 1, max: 100_000, integer: true, summary: "periods of transient before the shooting (default 60 from startup, levelling off earlier; 4 from poles; 3 when driven)" },
  "max-step": { type: "number", unit: "s", min: 0, minExclusive: true, summary: "largest time step" },
  harmonics: { type: "number", unit: "1", min: 2, max: 1000, integer: true, summary: "highest harmonic order the THD counts, from 2 (default 30)" },
  bandwidth: { type: "number", unit: "Hz", min: 0, minExclusive: true, summary: "frequency below which the THD counts the harmonics (at most 1000 of them), instead of harmonics=" },
  accuracy: { type: "number", unit: "1", min: 1e-10, max: 0.1, summary: "relative accuracy of the step control and the figures (default 1e-4)" },
  "accuracy-floor": { type: "number", unit: "V", min: 1e-15, max: 1, summary: "absolute accuracy of a voltage (default 1 µV; currents 1 nA per µV)" },
  temperature: { type: "number", unit: "1", min: -273.15, minExclusive: true, max: 1000, summary: "temperature in °C: the ambient of lamps and thermistors, and of the resistances' noise the predicted start-up time grows from (default 27)" },
};

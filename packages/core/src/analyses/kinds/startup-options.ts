import type { AnalysisOptions } from "../../circuit/analysis-schema.js";

/**
 * The `startup` statement's options; `runStartup` checks its argument against them too. Plain
 * literals only (no spreads or property reads such as Number.MAX_SAFE_INTEGER): a bundler then
 * drops this table from a build that does not use it.
 */
export const startupOptions: AnalysisOptions = {
  probe: { type: "probe", required: true, summary: "probe the oscillation is measured on" },
  until: { type: "number", unit: "s", min: 0, minExclusive: true, words: ["auto"], summary: "end time, or auto" },
  "settle-within": { type: "number", unit: "s", min: 0, minExclusive: true, summary: "longest an until=auto run may go before it must have settled (default 4000 predicted periods)" },
  "max-step": { type: "number", unit: "s", min: 0, minExclusive: true, summary: "largest time step" },
  kick: { type: "word", words: ["thermal", "power-on", "noise", "none"], summary: "start-up excitation: thermal noise, power-on ramp with thermal noise, an injected noise current, or none" },
  temperature: { type: "number", unit: "1", min: -273.15, minExclusive: true, max: 1000, summary: "temperature in °C of the resistances (their noise under kick=thermal and power-on) and the ambient of lamps and thermistors" },
  ramp: { type: "number", unit: "s", min: 0, summary: "time the DC levels take to rise from 0 (kick=power-on)" },
  level: { type: "number", unit: "A", min: 0, minExclusive: true, summary: "injected current, r.m.s. (kick=noise)" },
  seed: { type: "number", unit: "1", min: 0, max: 9_007_199_254_740_991, integer: true, summary: "seed of every noise stream" },
  seeds: { type: "number", unit: "1", min: 1, max: 10_000, integer: true, summary: "number of seeds (seed, seed+1, …) the start-up runs with, for the spread of the start-up time" },
  harmonics: { type: "number", unit: "1", min: 2, max: 1000, integer: true, summary: "highest harmonic order the THD counts, from 2 (default 30)" },
  bandwidth: { type: "number", unit: "Hz", min: 0, minExclusive: true, summary: "frequency below which the THD counts the harmonics (at most 1000 of them), instead of harmonics=" },
  accuracy: { type: "number", unit: "1", min: 1e-10, max: 0.1, summary: "relative accuracy of the step control and the settled figures (default 1e-4)" },
  "accuracy-floor": { type: "number", unit: "V", min: 1e-15, max: 1, summary: "absolute accuracy of a voltage (default 1 µV; currents 1 nA per µV)" },
};

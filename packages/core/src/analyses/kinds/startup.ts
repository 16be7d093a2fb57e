import type { AnalysisOptions } from "../../circuit/analysis-schema.js";
import type { StartupAnalysis, StartupKick } from "../../circuit/circuit.js";
import { startupSpread } from "../../study/startup-spread.js";
import type { AnalysisModel } from "../analysis-model.js";
import { settledFigureOptions } from "./settled-figures.js";
import { budgetOf } from "../limits.js";
import { runStartup, type StartupResult } from "../startup.js";

// Plain literals only (no spreads or property reads such as Number.MAX_SAFE_INTEGER): a bundler
// then drops this table from a build that does not use it.
const options: AnalysisOptions = {
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
  bandwidth: { type: "number", unit: "Hz", min: 0, minExclusive: true, summary: "frequency below which the THD counts the harmonics, instead of harmonics=" },
  accuracy: { type: "number", unit: "1", min: 1e-10, max: 0.1, summary: "relative accuracy of the step control and the settled figures (default 1e-4)" },
  "accuracy-floor": { type: "number", unit: "V", min: 1e-15, max: 1, summary: "absolute accuracy of a voltage (default 1 µV; currents 1 nA per µV)" },
};

/** The options that act only under some kicks, and the kicks they act under. */
const KICK_OPTIONS: Readonly<Record<string, readonly StartupKick[]>> = {
  temperature: ["thermal", "power-on"],
  ramp: ["power-on"],
  level: ["noise"],
  seed: ["thermal", "power-on", "noise"],
  seeds: ["thermal", "power-on", "noise"],
};

/** `startup`: an excited transient from the bias point, measured for start-up time, settled frequency, amplitude and THD. */
export const startup: AnalysisModel<StartupAnalysis, StartupResult> = {
  keyword: "startup",
  summary: "an excited transient from the bias point, measured for start-up time, settled frequency, amplitude and THD",
  options,
  build: (o, checks) => {
    const kick = (o.words.kick ?? "thermal") as StartupKick;
    for (const [key, kicks] of Object.entries(KICK_OPTIONS)) {
      if (!o.written.has(key) || kicks.includes(kick)) continue;
      // Self-heated parts (with a temperature state) cool to the ambient under any kick.
      if (key === "temperature" && o.partStates?.has("temperature")) continue;
      checks.warn(key, "key", "unused-option", `${key}= has no effect with kick=${kick}`, `${key}= is the ${options[key]!.summary}; it acts with kick=${kicks.join(" or kick=")}`);
    }
    const until = o.words.until === "auto" ? "auto" : (o.numbers.until ?? "auto");
    if (o.written.has("settle-within") && until !== "auto") {
      checks.warn("settle-within", "key", "unused-option", "settle-within= has no effect with a fixed until=", "settle-within= bounds until=auto; with until= a time, the run stops there");
    }
    const n = o.numbers;
    return {
      kind: "startup",
      probe: o.probes.probe!,
      until,
      ...(n["settle-within"] === undefined ? {} : { settleWithin: n["settle-within"], ...(o.spans?.["settle-within"] ? { settleWithinSpan: o.spans["settle-within"] } : {}) }),
      ...(n["max-step"] === undefined ? {} : { maxStep: n["max-step"] }),
      kick,
      ...(n.level === undefined ? {} : { level: n.level }),
      ...(n.seed === undefined ? {} : { seed: n.seed }),
      ...(n.temperature === undefined ? {} : { temperature: n.temperature }),
      ...(n.ramp === undefined ? {} : { ramp: n.ramp }),
      ...(n.seeds === undefined ? {} : { seeds: n.seeds }),
      ...settledFigureOptions("startup", o, checks),
    };
  },
  run: (circuit, analysis, runOptions) => {
    // The further seeds share the first run's budget: the wall time counts from this call.
    const shared = { ...runOptions, budget: budgetOf(runOptions) };
    const first = runStartup(circuit, analysis, shared);
    if (!((analysis.seeds ?? 1) > 1) || runOptions.seedSpread === false) return first;
    return { ...first, startupTimeSpread: startupSpread(circuit, analysis, first, shared) };
  },
};

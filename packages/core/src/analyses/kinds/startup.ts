import type { StartupAnalysis, StartupKick } from "../../circuit/circuit.js";
import { startupSpread } from "../../study/startup-spread.js";
import type { AnalysisModel } from "../analysis-model.js";
import { settledFigureOptions } from "./settled-figures.js";
import { budgetOf } from "../limits.js";
import { runStartup, type StartupResult } from "../startup.js";
import { startupOptions as options } from "./startup-options.js";

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

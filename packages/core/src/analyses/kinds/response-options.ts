import type { AnalysisOptions } from "../../circuit/analysis-schema.js";

/** The `response` statement's options; `runResponse` checks its argument against them too. Plain literals only (see steady-options.ts). */
export const responseOptions: AnalysisOptions = {
  from: { type: "source", required: true, summary: "independent source driven with a unit small signal" },
  to: { type: "probe", required: true, summary: "probe the response is measured on" },
  start: { type: "number", unit: "Hz", min: 0, minExclusive: true, summary: "lowest frequency" },
  stop: { type: "number", unit: "Hz", min: 0, minExclusive: true, summary: "highest frequency" },
  "per-decade": { type: "number", unit: "1", min: 1, integer: true, summary: "points per decade" },
};

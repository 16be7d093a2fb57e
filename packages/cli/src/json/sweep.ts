import type { SimulatingAnalysis } from "@onset/core";
import { judgedProbeUnit, specChecks } from "../report/spec.js";
import type { SweepReport } from "../study/sweep-report.js";
import { resultsJson, type Json } from "./results.js";

/**
 * A sweep for the JSON document: each setting with its results and spec, and the start threshold;
 * under measure=steady (`measure: "steady"`) each setting's one result is its steady state.
 */
export function sweepJson(r: SweepReport, analyses: readonly SimulatingAnalysis[]): Json {
  const s = r.result;
  return {
    analysis: "sweep",
    target: s.target,
    unit: r.unit,
    log: s.log,
    ...(s.measure === "steady" ? { measure: "steady" } : {}),
    points: s.points.map((p) => ({
      value: p.value,
      results: resultsJson(p.run.results.map((result, k) => ({ analysis: analyses[k]!, result }))),
      spec: p.run.spec ? (specChecks(p.run.spec, s.measure === "steady" ? "the steady state" : "the first start-up", judgedProbeUnit(p.run.results)) as unknown as Json) : null,
    })),
    threshold: s.threshold ? { ...s.threshold } : null,
  };
}

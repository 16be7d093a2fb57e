import { probeUnit } from "../analyses/probes.js";
import type { QuantityUnit } from "../solver/quantities.js";
import { buildSystem } from "../solver/system.js";
import type { Circuit, StudyMeasure } from "../circuit/circuit.js";
import { startupAnalysisOf } from "./sample.js";
import { steadyAnalysisOf } from "./steady-sample.js";

/** The unit of the probe a study measures (its start-up analysis', or under `steady` its steady analysis'); V when it has none. */
export function studyProbeUnit(circuit: Circuit, measure?: StudyMeasure): QuantityUnit {
  const analysis = measure === "steady" ? steadyAnalysisOf(circuit) : startupAnalysisOf(circuit);
  return analysis ? probeUnit(buildSystem(circuit), analysis.probe) : "V";
}

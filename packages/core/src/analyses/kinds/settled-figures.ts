import type { AnalysisChecks, AnalysisOptionValues } from "../../circuit/analysis-schema.js";

/**
 * What the analyses that measure a settled waveform (`startup`, `steady`) share: THD's harmonics
 * (`harmonics=` or `bandwidth=`, not both) and the accuracy options, as their spec fields.
 */
export function settledFigureOptions(keyword: string, o: AnalysisOptionValues, checks: AnalysisChecks) {
  if (o.written.has("bandwidth") && o.written.has("harmonics")) {
    checks.fail("bandwidth", "key", "conflicting-options", `${keyword} takes harmonics= or bandwidth=, not both`, "harmonics= counts orders 2 … N; bandwidth= counts the harmonics below a frequency");
  }
  const n = o.numbers;
  return {
    ...(n.harmonics === undefined ? {} : { harmonics: n.harmonics }),
    ...(n.bandwidth === undefined ? {} : { bandwidth: n.bandwidth }),
    ...(n.accuracy === undefined ? {} : { accuracy: n.accuracy }),
    ...(n["accuracy-floor"] === undefined ? {} : { accuracyFloor: n["accuracy-floor"] }),
  };
}

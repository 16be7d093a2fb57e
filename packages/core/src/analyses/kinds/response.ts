import type { ResponseAnalysis } from "../../circuit/circuit.js";
import type { AnalysisModel } from "../analysis-model.js";
import { runResponse, type ResponseResult } from "../response.js";

/** `response`: the small-signal transfer from a source to a probe over a log frequency sweep. */
export const response: AnalysisModel<ResponseAnalysis, ResponseResult> = {
  keyword: "response",
  summary: "the small-signal transfer from a source to a probe at the bias point, over a log frequency sweep",
  options: {
    from: { type: "source", required: true, summary: "independent source driven with a unit small signal" },
    to: { type: "probe", required: true, summary: "probe the response is measured on" },
    start: { type: "number", unit: "Hz", min: 0, minExclusive: true, summary: "lowest frequency" },
    stop: { type: "number", unit: "Hz", min: 0, minExclusive: true, summary: "highest frequency" },
    "per-decade": { type: "number", unit: "1", min: 1, integer: true, summary: "points per decade" },
  },
  build: (o, checks) => {
    const { start, stop } = o.numbers;
    if (start !== undefined && stop !== undefined && !(stop > start)) {
      checks.fail("stop", "value", "out-of-range", `response stop= must be above start=, got ${start} Hz to ${stop} Hz`, "swap start= and stop=");
    }
    return {
      kind: "response",
      from: o.words.from!,
      to: o.probes.to!,
      ...(start === undefined ? {} : { start }),
      ...(stop === undefined ? {} : { stop }),
      ...(o.numbers["per-decade"] === undefined ? {} : { perDecade: o.numbers["per-decade"] }),
    };
  },
  run: runResponse,
};

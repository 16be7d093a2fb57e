import type { ResponseAnalysis } from "../../circuit/circuit.js";
import type { AnalysisModel } from "../analysis-model.js";
import { runResponse, type ResponseResult } from "../response.js";
import { responseOptions } from "./response-options.js";

/** `response`: the small-signal transfer from a source to a probe over a log frequency sweep. */
export const response: AnalysisModel<ResponseAnalysis, ResponseResult> = {
  keyword: "response",
  summary: "the small-signal transfer from a source to a probe at the bias point, over a log frequency sweep",
  options: responseOptions,
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

import { csvDocument, csvField, csvNumber } from "../csv/csv.js";
import { biasReport } from "../report/bias.js";
import { partWarningsJson } from "../report/part-warnings.js";
import type { AnalysisWriters } from "./analysis-writers.js";

/** `bias`: a table of node voltages and source currents; CSV `name,quantity,value,unit`; no figure. */
export const biasWriters: AnalysisWriters<"bias"> = {
  text: ({ result }, _runs, p) => biasReport(result, p),
  json: (r) => ({
    analysis: "bias",
    nodes: r.nodes.map((n) => ({ ...n })),
    sources: r.sources.map((s) => ({ ...s })),
    method: r.method,
    iterations: r.iterations,
    ...partWarningsJson(r.warnings),
  }),
  csv: (r) =>
    csvDocument(["name", "quantity", "value", "unit"], [
      ...r.nodes.map((n) => [csvField(n.node), "voltage", csvNumber(n.voltage), "V"]),
      ...r.sources.map((s) => [csvField(`${s.part}.i`), "current", csvNumber(s.current), "A"]),
    ]),
};

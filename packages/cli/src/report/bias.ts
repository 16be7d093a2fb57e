import type { BiasResult } from "@onset/core";
import type { Paint } from "../color.js";
import { partWarningLines } from "./part-warnings.js";
import { table } from "./table.js";
import { si } from "./values.js";

/** The bias point: node voltages, then the current through each voltage source. */
export function biasReport(r: BiasResult, p: Paint): string[] {
  const how = { newton: "Newton", "gmin-stepping": "Newton with gmin stepping", "source-stepping": "Newton with source stepping" }[r.method] ?? r.method;
  const lines = [p.bold(`bias point`) + p.dim(`  (${how}, ${r.iterations} ${r.iterations === 1 ? "iteration" : "iterations"})`)];
  lines.push(...table([{ header: "node" }, { header: "voltage", align: "right" }], r.nodes.map((n) => [n.node, si(n.voltage, "V")])));
  if (r.sources.length > 0) {
    lines.push("");
    lines.push(...table([{ header: "source" }, { header: "current", align: "right" }], r.sources.map((s) => [s.part, si(s.current, "A")])));
    lines.push(p.dim("  source currents flow from plus through the source to minus"));
  }
  lines.push(...partWarningLines(r.warnings, p));
  return lines;
}

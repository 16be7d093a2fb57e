// The bench studies' circuits: the bridge source's program with one analysis in place of the
// file's. A module of its own so that worker threads can make the same builder for themselves
// (runToleranceStudy's `portable` option).
import { programBuilder } from "@onset/netlist-parser";

/** The circuit with the overrides, its analyses replaced by `data.analysis`. */
export function benchBuilder(data) {
  const build = programBuilder({ program: data.program });
  return (overrides) => ({ ...build(overrides), analyses: [data.analysis] });
}

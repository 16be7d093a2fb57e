// A study's builder that worker threads can import (they cannot load TypeScript): the program's
// circuit with its analyses replaced by `data.analysis` (shared-study.test.ts).
import { programBuilder } from "@onset/netlist-parser";

export function steadyBuilder(data) {
  const build = programBuilder({ program: data.program, ...(data.overrides ? { overrides: data.overrides } : {}) });
  return (values) => ({ ...build(values), analyses: [data.analysis] });
}

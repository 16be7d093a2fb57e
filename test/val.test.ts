import { test } from "vitest";
import { readFileSync } from "node:fs";
import { loadProgram, elaborate } from "@onset/netlist-parser";
import { runStartup, startupAnalysisOf } from "@onset/core";
test("val", () => {
  const refs = JSON.parse(readFileSync("/tmp/val/references.json", "utf8")).cases as any[];
  const cases = JSON.parse(readFileSync("/tmp/val/cases.json", "utf8")).cases as any[];
  for (const c of cases) {
    const file = c.file.startsWith("examples/") ? c.file : "/tmp/val/circuits/" + c.file.split("/").pop();
    const { program } = loadProgram(file, readFileSync(file, "utf8"));
    const { circuit } = elaborate(program, {});
    let r: any, ms = 0;
    for (let k = 0; k < 3; k++) { const t0 = performance.now(); r = runStartup(circuit!, startupAnalysisOf(circuit!)!); ms = performance.now() - t0; }
    const refineMs = (globalThis as any).REFINE_MS;
    const ref = refs.find((x) => x.name === c.name); if (!ref) continue;
    const e = r.numericalError;
    const row = (name: string, got: number | null, want: number, bar: number | undefined) => {
      const err = got === null ? NaN : (got - want) / want;
      const cover = got === null || bar === undefined ? "—" : Math.abs(got - want) <= bar ? "ok" : `MISS(${(Math.abs(got - want) / bar).toFixed(1)}x)`;
      return `${name} ${(err * 100).toFixed(4)}% bar ${bar === undefined ? "—" : ((bar / Math.abs(want)) * 100).toFixed(4) + "%"} ${cover}`;
    };
    console.log(`${c.name.padEnd(20)} total ${ms.toFixed(0)}ms refine ${refineMs.toFixed(0)}ms (${(refineMs / (ms - refineMs) * 100).toFixed(0)}%) it ${r.settled.iterations} pts ${r.settled.points} steps ${r.run.solver.accepted} | ${row("f", r.frequency, ref.frequency, e?.frequency)} | ${row("A", r.amplitude, ref.amplitude, e?.amplitude)} | ${row("rms", r.rms, ref.rms, e?.rms)} | ${row("thd30", r.thd, ref.thd30, e?.thd)}`);
  }
});

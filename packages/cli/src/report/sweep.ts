import type { SteadyResult } from "@onset/core";
import type { Paint } from "../color.js";
import { startupAt, steadyAt, type SweepReport } from "../study/sweep-report.js";
import { verdictText } from "./startup.js";
import { table } from "./table.js";
import { metric, percent, si, withBar } from "./values.js";

/** How a setting's orbit reads in the sweep table: its stability, or that none was found. */
export function orbitText(r: SteadyResult | undefined, p: Paint): string {
  if (!r) return "";
  if (!r.found) return p.red("no orbit");
  const verdict = r.stability?.verdict;
  return verdict === "stable" ? p.green("stable") : verdict === "unstable" ? p.red("unstable") : p.yellow(verdict ?? "marginal");
}

/** The start-up table: each setting's first start-up run. */
function startupRows(r: SweepReport, p: Paint): string[] {
  const s = r.result;
  return table(
    [
      { header: s.target, align: "right" },
      { header: "verdict" },
      { header: "frequency", align: "right" },
      { header: "amplitude", align: "right" },
      { header: "THD", align: "right" },
      { header: "start-up", align: "right" },
      { header: "growth rate", align: "right" },
      { header: "spec" },
    ],
    s.points.map((pt) => {
      const st = startupAt(pt);
      return [
        si(pt.value, r.unit),
        st ? verdictText(st.verdict, p) : "",
        withBar(st?.frequency, st?.numericalError?.frequency, "Hz"),
        st ? withBar(st.amplitude, st.numericalError?.amplitude, st.unit) : metric("amplitude", null),
        withBar(st?.thd, st?.numericalError?.thd, "1"),
        metric("startupTime", st?.startupTime),
        metric("growthRate", st?.growthRate),
        specCell(pt.run.spec, p),
      ];
    }),
  );
}

/** The steady-state table: each setting's orbit, the predicted start-up time and the poles' growth rate; then why a setting has no orbit. */
function steadyRows(r: SweepReport, p: Paint): string[] {
  const s = r.result;
  const lines = table(
    [
      { header: s.target, align: "right" },
      { header: "orbit" },
      { header: "frequency", align: "right" },
      { header: "amplitude", align: "right" },
      { header: "THD", align: "right" },
      { header: "start-up (predicted)", align: "right" },
      { header: "growth rate (poles)", align: "right" },
      { header: "spec" },
    ],
    s.points.map((pt) => {
      const st = steadyAt(pt);
      const e = st?.numericalError ?? undefined;
      return [
        si(pt.value, r.unit),
        orbitText(st, p),
        withBar(st?.frequency, e?.frequency, "Hz"),
        st ? withBar(st.amplitude, e?.amplitude, st.unit) : metric("amplitude", null),
        withBar(st?.thd, e?.thd, "1"),
        metric("startupTime", st?.predicted.startupTime),
        metric("growthRate", st?.predicted.growthRate),
        specCell(pt.run.spec, p),
      ];
    }),
  );
  for (const pt of s.points) {
    const st = steadyAt(pt);
    if (st && !st.found) lines.push(`  ${s.target} = ${si(pt.value, r.unit)}: ${st.explanation}`);
  }
  lines.push(
    p.dim("  figures: the periodic steady state at each setting (shooting on two grids, extrapolated; ± bounds the numerical error);"),
    p.dim("  start-up times are predicted from the poles and the thermal noise, not simulated"),
  );
  return lines;
}

function specCell(spec: SweepReport["result"]["points"][number]["run"]["spec"], p: Paint): string {
  return spec === null ? "" : spec.pass ? p.green("pass") : p.red("FAIL");
}

/** The sweep table (metrics against the setting) and the start threshold with the nominal's margin. */
export function sweepText(r: SweepReport, p: Paint): string[] {
  const s = r.result;
  const steady = s.measure === "steady";
  const first = s.points[0]?.value;
  const last = s.points[s.points.length - 1]?.value;
  const how = steady ? ", periodic steady state" : "";
  const lines = [p.bold(`sweep of ${s.target}`) + p.dim(`  (${si(first, r.unit)} to ${si(last, r.unit)}, ${s.points.length} settings${s.log ? ", log" : ""}${how})`)];
  lines.push(...(steady ? steadyRows(r, p) : startupRows(r, p)));
  const t = s.threshold;
  const named = steady ? "start threshold (poles)" : "start threshold";
  if (!t) lines.push(`  ${named}: not crossed within the sweep (the verdict does not change between settings)`);
  else {
    const side = t.startsAbove ? "oscillates above it" : "oscillates below it";
    lines.push(`  ${named}: ${s.target} = ${si(t.value, r.unit)} ± ${si(t.precision, r.unit, 2)} (${side})`);
    if (t.nominal !== null && t.margin !== null) {
      const safe = t.margin > 0 ? p.green("starts") : p.red("does not start");
      lines.push(`  nominal ${si(t.nominal, r.unit)}: margin ${percent(t.margin, 3)} from the threshold; the nominal ${safe}`);
    }
  }
  return lines;
}

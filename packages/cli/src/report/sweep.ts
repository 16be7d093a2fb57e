import type { Paint } from "../color.js";
import { startupAt, type SweepReport } from "../study/sweep-report.js";
import { verdictText } from "./startup.js";
import { table } from "./table.js";
import { metric, percent, si, withBar } from "./values.js";

/** The sweep table (metrics against the setting) and the start threshold with the nominal's margin. */
export function sweepText(r: SweepReport, p: Paint): string[] {
  const s = r.result;
  const first = s.points[0]?.value;
  const last = s.points[s.points.length - 1]?.value;
  const lines = [p.bold(`sweep of ${s.target}`) + p.dim(`  (${si(first, r.unit)} to ${si(last, r.unit)}, ${s.points.length} settings${s.log ? ", log" : ""})`)];
  lines.push(
    ...table(
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
        const spec = pt.run.spec === null ? "" : pt.run.spec.pass ? p.green("pass") : p.red("FAIL");
        return [
          si(pt.value, r.unit),
          st ? verdictText(st.verdict, p) : "",
          withBar(st?.frequency, st?.numericalError?.frequency, "Hz"),
          st ? withBar(st.amplitude, st.numericalError?.amplitude, st.unit) : metric("amplitude", null),
          withBar(st?.thd, st?.numericalError?.thd, "1"),
          metric("startupTime", st?.startupTime),
          metric("growthRate", st?.growthRate),
          spec,
        ];
      }),
    ),
  );
  const t = s.threshold;
  if (!t) lines.push("  start threshold: not crossed within the sweep (the verdict does not change between settings)");
  else {
    const side = t.startsAbove ? "oscillates above it" : "oscillates below it";
    lines.push(`  start threshold: ${s.target} = ${si(t.value, r.unit)} ± ${si(t.precision, r.unit, 2)} (${side})`);
    if (t.nominal !== null && t.margin !== null) {
      const safe = t.margin > 0 ? p.green("starts") : p.red("does not start");
      lines.push(`  nominal ${si(t.nominal, r.unit)}: margin ${percent(t.margin, 3)} from the threshold; the nominal ${safe}`);
    }
  }
  return lines;
}

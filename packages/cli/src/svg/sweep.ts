import { sweepFigure, type Figure } from "../plot/index.js";
import { startupAt, type SweepReport } from "../study/sweep-report.js";

/** Amplitude, frequency and THD against the setting, with the start threshold marked. */
export function sweepSvgFigure(r: SweepReport, title: string): Figure {
  const s = r.result;
  const read = (key: "amplitude" | "frequency" | "thd") => s.points.map((p) => startupAt(p)?.[key] ?? Number.NaN);
  return sweepFigure({
    title: `${title} \u2014 sweep of ${s.target}`,
    setting: { name: s.target, unit: r.unit, values: s.points.map((p) => p.value), log: s.log },
    amplitude: read("amplitude"),
    frequency: read("frequency"),
    thd: read("thd"),
    ...(s.threshold ? { threshold: s.threshold.value } : {}),
    silent: s.points.map((p) => (startupAt(p)?.amplitude ?? null) === null),
  });
}

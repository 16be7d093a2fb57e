import { sweepFigure, type Figure } from "../plot/index.js";
import { figuresAt, type SweepReport } from "../study/sweep-report.js";

/** Amplitude, frequency and THD against the setting (the start-up's settled figures, or the steady state's), with the start threshold marked. */
export function sweepSvgFigure(r: SweepReport, title: string): Figure {
  const s = r.result;
  const measured = s.points.map((p) => figuresAt(s, p)).find((f) => f !== undefined);
  const read = (key: "amplitude" | "frequency" | "thd") => s.points.map((p) => figuresAt(s, p)?.[key] ?? Number.NaN);
  return sweepFigure({
    title: `${title} \u2014 sweep of ${s.target}${s.measure === "steady" ? " (periodic steady state)" : ""}`,
    setting: { name: s.target, unit: r.unit, values: s.points.map((p) => p.value), log: s.log },
    amplitude: read("amplitude"),
    ...(measured ? { amplitudeUnit: measured.unit } : {}),
    frequency: read("frequency"),
    thd: read("thd"),
    ...(s.threshold ? { threshold: s.threshold.value } : {}),
    silent: s.points.map((p) => (figuresAt(s, p)?.amplitude ?? null) === null),
  });
}

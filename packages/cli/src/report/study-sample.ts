import type { Paint } from "../color.js";
import type { StudySample } from "../study/study-sample.js";
import { pairs } from "./table.js";
import { metric, si } from "./values.js";

/** Digits of the study's figures: enough to tell them from a full analysis's, which differ by the single grid's error. */
const DIGITS = 9;

/**
 * `--sample I` under measure=steady: the sample's figures as the study measured them (one grid,
 * shot from the nominal's orbit moved to first order), to nine digits, then a note that the
 * analyses below are a fresh full run. `unit` is the probe's.
 */
export function studySampleText(index: number, { sample, setting, judged }: StudySample, unit: string, p: Paint): string[] {
  const at = setting === null ? "" : setting.value === null ? ` at the file's own ${setting.target} (give --set ${setting.target}=… for a setting of the design window)` : ` at ${setting.target} = ${setting.value}`;
  const lines = [
    p.bold(`the study's figures for sample #${index}`) + p.dim(`${at}  (measure=steady: its periodic steady state on one grid, shot from the nominal's orbit moved to first order in the drawn values, exactly as the study measured it)`),
  ];
  const outcome = sample.pass ? p.green("passes") : p.red(`fails: ${sample.failures.join(", ")}`);
  const m = sample.metrics;
  if (!m) {
    lines.push(`  ${outcome}${sample.error ? ` (${sample.error})` : ""}`);
  } else {
    const rows: [string, string][] = [
      ["verdict", `${m.verdict}, ${outcome}`],
      ["frequency", si(m.frequency, "Hz", DIGITS)],
      ["amplitude", `${si(m.amplitude, unit, DIGITS)} peak`],
      ["rms", si(m.rms, unit, DIGITS)],
      ["offset", si(m.offset, unit, DIGITS)],
      ["THD", metric("thd", m.thd)],
      ["start-up time (predicted)", metric("startupTime", m.startupTime)],
    ];
    lines.push(...pairs(rows));
  }
  lines.push(p.dim("  the analyses below are a fresh full run with the drawn values (its own transient, two grids, extrapolated, with error bars): they differ from the study's figures by up to the single grid's error"));
  if (judged) lines.push(p.dim(`  the exit status is the study's verdict on this sample (${sample.pass ? "passes: 0" : "fails: 1"}), not the fresh run's`));
  return lines;
}

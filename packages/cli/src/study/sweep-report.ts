import type { NumericalError, QuantityUnit, StartupResult, SteadyResult, SweepResult } from "@onset/core";
import type { SpecChecks } from "../report/spec.js";

/** A sweep without tolerances: the file's analyses at every setting and the start threshold. */
export interface SweepReport {
  readonly kind: "sweep";
  readonly result: SweepResult;
  /** Unit of the setting (`Ω`, `Hz`; empty for a plain number). */
  readonly unit: string;
  /** Met when at least one setting meets the spec (a sweep crosses the threshold on purpose). */
  readonly spec: SpecChecks | null;
}

/** The first start-up result at a setting, which the table reads. */
export function startupAt(point: SweepResult["points"][number]): StartupResult | undefined {
  return point.run.results.find((r): r is StartupResult => r.analysis === "startup");
}

/** The steady result at a setting of a `sweep … measure=steady`. */
export function steadyAt(point: SweepResult["points"][number]): SteadyResult | undefined {
  return point.run.results.find((r): r is SteadyResult => r.analysis === "steady");
}

/** The settled figures a setting's plot and rows read, whichever measured them: the first start-up, or under measure=steady the orbit. */
export interface SettingFigures {
  readonly frequency: number | null;
  readonly amplitude: number | null;
  readonly thd: number | null;
  readonly unit: QuantityUnit;
  readonly numericalError: NumericalError | null;
}

/** The settled figures of a setting (see {@link SettingFigures}), or undefined when nothing measured it. */
export function figuresAt(result: SweepResult, point: SweepResult["points"][number]): SettingFigures | undefined {
  return result.measure === "steady" ? steadyAt(point) : startupAt(point);
}

export function sweepReport(result: SweepResult, unit: string, hasSpec: boolean): SweepReport {
  const judged = result.points.filter((p) => p.run.spec !== null);
  const passing = judged.filter((p) => p.run.spec!.pass).length;
  const spec: SpecChecks | null = hasSpec
    ? {
        pass: passing > 0,
        on: `each setting of ${result.target}`,
        criteria: [{ text: "settings that meet the spec", metric: "yield", measured: judged.length > 0 ? passing / judged.length : null, unit: "1", pass: passing > 0 }],
      }
    : null;
  return { kind: "sweep", result, unit, spec };
}

import { runToleranceStudy, specCriteria, type Circuit, type RunLimits, type SweepAnalysis, type ToleranceAnalysis } from "@onset/core";
import { elaborateSource, type LoadedSource } from "../input/source.js";
import { throughJson, type StoredSample } from "./header.js";
import { drawnTolerances } from "./run-study.js";
import { targetInfo } from "./target.js";

/** The study's own run of one sample, and where in a design window it was taken. */
export interface StudySample {
  readonly sample: StoredSample;
  /** In a design window: the swept name and its setting, or null when `--set` did not give one (the file's own value is used). */
  readonly setting: { readonly target: string; readonly value: number | null } | null;
  /** Whether the study judges the sample against a spec (the file has one): `onset run --sample I` then exits as the sample's verdict says. */
  readonly judged: boolean;
}

/**
 * Sample `index` run exactly as the study runs it (`runToleranceStudy` with only this index):
 * the same builder, drawn values, nominal orbit and first-order start, so that under
 * measure=steady its figures are the study's to the last bit, not a fresh full steady analysis.
 * In a design window the setting is the `--set` value of the swept name, fixed as the study fixes it.
 */
export async function studySample(source: LoadedSource, sets: Readonly<Record<string, string>>, circuit: Circuit, tolerance: ToleranceAnalysis, sweep: SweepAnalysis | undefined, index: number, limits: RunLimits): Promise<StudySample> {
  const value = sweep && sets[sweep.target] !== undefined ? targetInfo(circuit, source.program, sweep.target, sets).nominal : null;
  const fixed = sweep && value !== null ? { [sweep.target]: value } : undefined;
  const build = (values: Readonly<Record<string, number>>) => elaborateSource(source, { ...sets, ...values }).circuit;
  const criteria = specCriteria(circuit);
  const [sample] = await runToleranceStudy(build, drawnTolerances(circuit, sweep), tolerance, criteria, { limits, only: [index], ...(fixed ? { fixed } : {}) });
  // Through JSON as the study's results file keeps it, so both print the same.
  return { sample: throughJson<StoredSample>(sample!), setting: sweep ? { target: sweep.target, value } : null, judged: criteria.length > 0 };
}

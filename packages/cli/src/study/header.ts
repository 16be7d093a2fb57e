import type { SpecCriterion, ToleranceSample } from "@onset/core";

/** The sweep of a design window (sweep × tolerance), as the results file records it. */
export interface WindowSweep {
  readonly target: string;
  readonly unit: string;
  readonly log: boolean;
  readonly values: readonly number[];
  /** The yield every setting must reach: the spec's `yield>` criterion, else 99 %. */
  readonly required: number;
}

/**
 * The first line of a results file: what identifies the study (file content, overrides, seed,
 * runs, distribution, shard) and everything a report needs besides the samples, so that
 * `onset merge` can rebuild the report from results files alone.
 */
export interface StudyHeader {
  readonly onset: "tolerance-results";
  readonly version: 1;
  readonly file: string;
  readonly title: string | null;
  /** SHA-256 of the circuit file and its includes. */
  readonly hash: string;
  readonly overrides: Readonly<Record<string, string>>;
  readonly runs: number;
  readonly seed: number;
  readonly dist: "normal" | "uniform";
  /** `steady`: each sample measured by its periodic steady state (absent: its start-up run). */
  readonly measure?: "steady";
  /** The unit of the measured probe when it is not a voltage (absent: V), e.g. K for a lamp's temperature. */
  readonly probeUnit?: string;
  readonly shard: { readonly index: number; readonly count: number } | null;
  /** The toleranced values drawn for every sample, in file order. */
  readonly tolerances: ReadonlyArray<{
    readonly target: string;
    /** Unit of the drawn values, as reports print it (empty when it cannot be told). */
    readonly unit: string;
    readonly nominal: number;
    readonly relative?: number;
    readonly absolute?: number;
  }>;
  readonly criteria: readonly SpecCriterion[];
  readonly sweep: WindowSweep | null;
}

/** One finished sample as stored: `point` is the sweep setting's index in a design window. */
export interface StoredSample extends ToleranceSample {
  readonly point?: number;
}

/** A value as it reads back from JSON: what every report is built from, so a run and a merge agree to the byte. */
export function throughJson<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T;
}

/** The fields on which two headers differ (the shard left out when `ignoreShard`). */
export function headerDifferences(a: StudyHeader, b: StudyHeader, ignoreShard = false): string[] {
  const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
  const out: string[] = [];
  for (const key of keys) {
    if (ignoreShard && key === "shard") continue;
    const x = JSON.stringify((a as unknown as Record<string, unknown>)[key]);
    const y = JSON.stringify((b as unknown as Record<string, unknown>)[key]);
    if (x !== y) out.push(key);
  }
  return out;
}

/** Identity of a sample within its study. */
export function sampleKey(s: StoredSample): string {
  return `${s.point ?? 0}:${s.index}`;
}

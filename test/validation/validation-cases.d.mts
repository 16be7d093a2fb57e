import type { Circuit, StartupAnalysis, StartupResult, RunOptions } from "@onset/core";

export type Metric = "frequency" | "amplitude" | "rms" | "thd";

/** One part as the reference script transcribed it (references.json `parts`). */
export interface TranscribedPart {
  readonly kind: string;
  readonly name: string;
  readonly nodes: readonly string[];
  readonly value: number | null;
  /** Device options; infinities written "inf". */
  readonly options?: Readonly<Record<string, number | string | readonly (number | string)[]>>;
}

/** One case's reference values (test/validation/references.json). */
export interface Reference {
  readonly name: string;
  readonly file: string;
  readonly probe: string;
  readonly frequency: number;
  readonly amplitude: number;
  readonly rms: number;
  readonly offset: number;
  /** THD_F over harmonics 2–10 and 2–30. */
  readonly thd: number;
  readonly thd30: number;
  /** Harmonic amplitudes 1 … 30 (V peak). */
  readonly harmonics: readonly number[];
  readonly settled: boolean;
  readonly settleMoves: Readonly<Record<string, number>>;
  readonly crossCheck: { readonly method: string; readonly relativeDifference: Readonly<Record<string, number>>; readonly settled: boolean };
  readonly parts: readonly TranscribedPart[];
}

export interface ValidationCase {
  readonly name: string;
  readonly file: string;
  readonly probe: string;
  readonly source: string;
  readonly reference: Reference | undefined;
}

export interface ComparisonRow {
  readonly metric: Metric;
  readonly reference: number | null;
  readonly onset: number | null;
  readonly error: number | null;
  readonly bar: number | null;
  readonly covered: boolean | null;
  readonly limit: number;
  readonly judged: boolean;
}

export const repositoryRoot: string;
export const METRICS: readonly Metric[];
export const LIMITS: Readonly<Record<Metric, number>>;
export const THD_FLOOR: number;
export function validationCases(): ValidationCase[];
export function caseCircuit(file: string, overrides?: Readonly<Record<string, number>>): Circuit;
export function runCase(circuit: Circuit, changes?: Partial<StartupAnalysis>, options?: RunOptions): { result: StartupResult; ms: number; cpuMs: number };
export function referenceThd(reference: Reference, orders?: readonly [number, number]): number | null;
export function compareRows(reference: Reference, result: StartupResult): ComparisonRow[];

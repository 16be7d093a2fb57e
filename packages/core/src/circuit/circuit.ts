import type { SourceSpan } from "./diagnostic.js";
import type { SimulatingAnalysis } from "../analyses/registry.js";
import type { UnitSymbol } from "./schema.js";

/** The reserved ground node. */
export const GROUND = "gnd";

/** An elaborated option value: numbers in SI base units, words, pairs, node pairs or points. */
export type OptionValue = number | string | readonly number[] | readonly string[];

/** One part of a flattened circuit; every number in SI base units. */
export interface PartSpec {
  readonly kind: string;
  /** Hierarchical name, e.g. `N1.Ra`. */
  readonly name: string;
  /** Node names in pin order (hierarchical inside block instances, `gnd` for ground). */
  readonly nodes: readonly string[];
  readonly value?: number;
  readonly options: Readonly<Record<string, OptionValue>>;
  /** Where the part was written (the `use` line for parts of a block instance keeps the inner line). */
  readonly span?: SourceSpan;
}

/** What a waveform or metric is measured on. */
export type Probe =
  | { readonly kind: "node"; readonly node: string }
  | { readonly kind: "difference"; readonly plus: string; readonly minus: string }
  | { readonly kind: "current"; readonly part: string }
  /** A state inside a part that its kind lists (`U1.pole`, `D1.junction`). */
  | { readonly kind: "state"; readonly part: string; readonly state: string };

/** The name a probe has in reports, CSV and JSON: `o`, `o-ref`, `R1.i`, `U1.pole`. */
export function probeName(probe: Probe): string {
  switch (probe.kind) {
    case "node":
      return probe.node;
    case "difference":
      return `${probe.plus}-${probe.minus}`;
    case "current":
      return `${probe.part}.i`;
    case "state":
      return `${probe.part}.${probe.state}`;
  }
}

/** `bias`: the DC operating point (node voltages and source currents). */
export interface BiasAnalysis {
  readonly kind: "bias";
  readonly span?: SourceSpan;
}

/** `transient`: the time response from the bias point or from rest to `until` (s), probes recorded at every accepted step. */
export interface TransientAnalysis {
  readonly kind: "transient";
  readonly until: number;
  readonly maxStep?: number;
  readonly start: "bias" | "rest";
  /** Empty means every node. */
  readonly probes: readonly Probe[];
  /** Relative accuracy of the step control (default 1e-4). */
  readonly accuracy?: number;
  /** Absolute accuracy floor of a voltage (V; default 1 µV; currents 1 nA per µV, temperatures 0.1 mK per µV). */
  readonly accuracyFloor?: number;
  readonly span?: SourceSpan;
  /** Where each written option's value is, by its key (`until`, `runs`, …), for errors placed at the option. */
  readonly optionSpans?: Readonly<Record<string, SourceSpan>>;
}

/**
 * How a start-up run is excited: `thermal` (every resistance's Johnson–Nyquist noise and every
 * op-amp's input noise, the whole run), `power-on` (the same noise, with every DC level rising
 * from 0 over a ramp), `noise` (a seeded current into the probe node for a few cycles), `none`.
 */
export type StartupKick = "thermal" | "power-on" | "noise" | "none";

/** `startup`: an excited transient from the bias point (see {@link StartupKick}), measured for start-up time, settled frequency, amplitude and THD. */
export interface StartupAnalysis {
  readonly kind: "startup";
  readonly probe: Probe;
  /** Seconds, or `auto`: run (bounded) until the verdict is settled or clearly silent. */
  readonly until: number | "auto";
  readonly maxStep?: number;
  /** Default `thermal`. */
  readonly kick?: StartupKick;
  /** `kick=noise`: the injected current (A r.m.s.; default 1 nA). */
  readonly level?: number;
  /** Seed of every noise stream (default 1). */
  readonly seed?: number;
  /** `kick=thermal` and `power-on`: the temperature of the resistances (°C; default 27). */
  readonly temperature?: number;
  /** `kick=power-on`: how long the DC levels take to rise from 0 (s; default 1 ms). */
  readonly ramp?: number;
  /**
   * `until=auto`: the longest the run may go (s of simulated time after a power-on ramp;
   * default 4000 predicted periods). A run that reaches it unsettled ends with a warning.
   */
  readonly settleWithin?: number;
  /** Where `settle-within=` was written, for that warning. */
  readonly settleWithinSpan?: SourceSpan;
  /** The start-up run repeated with this many seeds (seed, seed + 1, …) for the start-up time's spread (default 1). */
  readonly seeds?: number;
  /** THD counts harmonics 2 … this order (default 30); see also `bandwidth`. */
  readonly harmonics?: number;
  /** THD counts the harmonics below this frequency (Hz) instead of up to an order. */
  readonly bandwidth?: number;
  /** Relative accuracy of the step control and of the settled figures (default 1e-4). */
  readonly accuracy?: number;
  /** Absolute accuracy floor of a voltage (V; default 1 µV; currents 1 nA per µV, temperatures 0.1 mK per µV). */
  readonly accuracyFloor?: number;
  readonly span?: SourceSpan;
  /** Where each written option's value is, by its key (`until`, `runs`, …), for errors placed at the option. */
  readonly optionSpans?: Readonly<Record<string, SourceSpan>>;
}

/**
 * `steady`: the periodic steady state found directly by shooting (Newton on x(T) − x(0) = 0, the
 * period an unknown for an autonomous circuit), measured on a probe over one period.
 */
export interface SteadyAnalysis {
  readonly kind: "steady";
  readonly probe: Probe;
  /**
   * Where the shooting starts: `startup` (default) from a short transient started in the
   * growing mode, its period measured on the node that mode swings most; `poles` from the linear prediction's
   * frequency, after a few periods in that mode.
   */
  readonly from?: "startup" | "poles";
  /** Periods of transient before the first shooting (and between retries). */
  readonly cycles?: number;
  readonly maxStep?: number;
  /** THD counts harmonics 2 … this order (default 30); see also `bandwidth`. */
  readonly harmonics?: number;
  /** THD counts the harmonics below this frequency (Hz) instead of up to an order. */
  readonly bandwidth?: number;
  /** Relative accuracy of the step control and of the figures (default 1e-4). */
  readonly accuracy?: number;
  /** Absolute accuracy floor of a voltage (V; default 1 µV). */
  readonly accuracyFloor?: number;
  /** The ambient of lamps and thermistors, and the temperature of the resistances' noise the predicted start-up time grows from (°C; default 27). */
  readonly temperature?: number;
  readonly span?: SourceSpan;
}

/** `response`: the small-signal transfer from a source to a probe at the bias point, over a log frequency sweep (Hz). */
export interface ResponseAnalysis {
  readonly kind: "response";
  /** Name of the independent source that is driven with a unit small signal. */
  readonly from: string;
  readonly to: Probe;
  readonly start?: number;
  readonly stop?: number;
  readonly perDecade?: number;
  readonly span?: SourceSpan;
}

/** `poles`: the natural frequencies of the circuit linearised at its bias point. */
export interface PolesAnalysis {
  readonly kind: "poles";
  readonly span?: SourceSpan;
}

/** What each sample or setting of a study is measured by: the start-up run, or the periodic steady state (`steady`). */
export type StudyMeasure = "startup" | "steady";

/** `sweep`: the file's analyses at each setting of one override target, with the start threshold found by bisection. */
export interface SweepAnalysis {
  readonly kind: "sweep";
  /** Override name: a parameter (`R`), a part's value (`Ra`) or a part option (`P1.at`). */
  readonly target: string;
  readonly from: number;
  readonly to: number;
  readonly steps?: number;
  readonly step?: number;
  readonly log: boolean;
  /** What each setting measures: the file's analyses with its start-up run (default), or its periodic steady state by shooting (no simulated start-up). */
  readonly measure?: StudyMeasure;
  readonly span?: SourceSpan;
  /** Where each written option's value is, by its key (`until`, `runs`, …), for errors placed at the option. */
  readonly optionSpans?: Readonly<Record<string, SourceSpan>>;
}

/** `tolerance`: a Monte Carlo study of `runs` samples drawing every `±` tolerance from its distribution with `seed`. */
export interface ToleranceAnalysis {
  readonly kind: "tolerance";
  readonly runs: number;
  readonly seed: number;
  readonly dist: "normal" | "uniform";
  /** What each sample measures: its start-up run (default), or its periodic steady state by shooting (no start-up time). */
  readonly measure?: StudyMeasure;
  readonly span?: SourceSpan;
  /** Where each written option's value is, by its key (`until`, `runs`, …), for errors placed at the option. */
  readonly optionSpans?: Readonly<Record<string, SourceSpan>>;
}

/** Which startup metric (or the yield) a criterion reads. */
export type SpecMetric =
  | "frequency"
  | "amplitude"
  | "thd"
  | "startup"
  | "settling"
  | "offset"
  | "rms"
  | "peakToPeak"
  | "yield";

/**
 * One pass/fail criterion. `within` covers `frequency=1k±2%` (target ± absolute or relative band)
 * and `amplitude=3..5` (a range); `below`/`above` cover `thd<0.5%`, `yield>99%`.
 */
export type SpecCriterion =
  | {
      readonly metric: SpecMetric;
      readonly test: "within";
      readonly low: number;
      readonly high: number;
      readonly text: string;
      readonly span?: SourceSpan;
    }
  | {
      readonly metric: SpecMetric;
      readonly test: "below" | "above";
      readonly limit: number;
      readonly text: string;
      readonly span?: SourceSpan;
    };

/** `spec`: pass/fail criteria on start-up metrics (and the yield of a tolerance study). */
export interface SpecAnalysis {
  readonly kind: "spec";
  readonly criteria: readonly SpecCriterion[];
  readonly span?: SourceSpan;
}

/**
 * Any analysis a circuit file can hold, told apart by `kind`: the simulating analyses of the
 * registry (`analyses/registry.ts`), the studies that run them, and the spec.
 */
export type AnalysisSpec = SimulatingAnalysis | SweepAnalysis | ToleranceAnalysis | SpecAnalysis;

/**
 * A value that a Monte Carlo run may draw: `target` is its override name (`R`, `Ra`, `N1.Ra`,
 * `U1.gbw`), `nominal` its written value; exactly one of `relative` (fraction) or `absolute`.
 */
export interface ToleranceSpec {
  readonly target: string;
  readonly nominal: number;
  readonly relative?: number;
  readonly absolute?: number;
  /** Unit of the drawn values, for reports; absent when it cannot be told (a parameter used only inside expressions). */
  readonly unit?: UnitSymbol;
  readonly span?: SourceSpan;
}

/** A flattened, fully evaluated circuit: what the engine simulates. */
export interface Circuit {
  readonly title?: string;
  readonly parts: readonly PartSpec[];
  readonly analyses: readonly AnalysisSpec[];
  readonly tolerances: readonly ToleranceSpec[];
}

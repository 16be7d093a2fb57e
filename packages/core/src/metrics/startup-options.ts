import { badArgument, describe } from "../circuit/arguments.js";
import type { LinearPrediction } from "./oscillation-kind.js";

/** Options of {@link measureStartup}. */
export interface StartupMetricsOptions {
  /**
   * Peak level (V) that the kick or the injected noise leaves at the probe. An envelope that
   * never rises above twice this is `silent`; the hysteresis band and the growth-fit floor are
   * kept above it.
   * @defaultValue 0
   */
  readonly noiseFloor?: number;
  /**
   * Half-width (V) of the band around the mean that a rising crossing must clear.
   * @defaultValue the largest of `noiseFloor`, 1e-3 of the half swing over the last half of the
   * record, and 1e-9 of the largest |v| (so rounding noise on a DC level makes no cycles)
   */
  readonly hysteresis?: number;
  /**
   * Highest harmonic in `thd` and `harmonics`.
   * @defaultValue 10
   */
  readonly maxOrder?: number;
  /**
   * Cycles over which settling is judged and the settled quantities are measured.
   * @defaultValue 10
   */
  readonly settleCycles?: number;
  /**
   * Largest relative envelope change per cycle that still counts as settled.
   * @defaultValue 0.001
   */
  readonly settleTolerance?: number;
  /**
   * The largest envelope (V peak) the circuit could reach, e.g. half its supply span. Used only
   * to estimate how much longer a signal still growing exponentially needs; without it one more
   * decade of growth is assumed.
   */
  readonly amplitudeLimit?: number;
  /**
   * The linear prediction at the bias point, which tells a sine oscillation from a relaxation
   * or a parasitic one (see `steadyKind`); without it only the waveform's shape is used.
   */
  readonly prediction?: LinearPrediction;
  /** Hz: the frequencies of the circuit's periodic sources; a steady waveform at one of them is driven. */
  readonly drives?: readonly number[];
  /**
   * Time (s) before which the record is an excitation's own transient (a power-on ramp moving
   * the DC levels): start-up is the first 90 % excursion at or after it.
   * @defaultValue 0
   */
  readonly searchFrom?: number;
  /**
   * The unit of the probe's values, in which the explanation quotes the swing (levels above
   * say V; they are in this unit).
   * @defaultValue `"V"`
   */
  readonly unit?: string;
}

/** Options with defaults filled in and checked. */
export interface StartupSettings {
  readonly noiseFloor: number;
  readonly hysteresis: number | undefined;
  readonly maxOrder: number;
  readonly settleCycles: number;
  readonly settleTolerance: number;
  readonly amplitudeLimit: number | undefined;
  readonly prediction: LinearPrediction | undefined;
  readonly drives: readonly number[];
  readonly searchFrom: number;
  readonly unit: string;
}

function positiveOrZero(name: string, value: number): number {
  if (!(value >= 0) || !Number.isFinite(value)) {
    throw badArgument(`measureStartup: ${name} must be a finite number >= 0 (got ${describe(value)})`);
  }
  return value;
}

export function resolveStartupOptions(options: StartupMetricsOptions): StartupSettings {
  const maxOrder = options.maxOrder ?? 10;
  if (!(Number.isInteger(maxOrder) && maxOrder >= 1)) {
    throw badArgument(`measureStartup: maxOrder must be a whole number >= 1 (got ${describe(maxOrder)})`);
  }
  const settleCycles = options.settleCycles ?? 10;
  if (!(Number.isInteger(settleCycles) && settleCycles >= 2)) {
    throw badArgument(`measureStartup: settleCycles must be a whole number >= 2 (got ${describe(settleCycles)})`);
  }
  const settleTolerance = options.settleTolerance ?? 0.001;
  if (!(settleTolerance > 0 && settleTolerance < 1)) {
    throw badArgument(`measureStartup: settleTolerance must lie between 0 and 1 (got ${describe(settleTolerance)})`);
  }
  const amplitudeLimit = options.amplitudeLimit;
  if (amplitudeLimit !== undefined && !(amplitudeLimit > 0 && Number.isFinite(amplitudeLimit))) {
    throw badArgument(`measureStartup: amplitudeLimit must be a positive voltage (got ${describe(amplitudeLimit)})`);
  }
  return {
    noiseFloor: positiveOrZero("noiseFloor", options.noiseFloor ?? 0),
    hysteresis: options.hysteresis === undefined ? undefined : positiveOrZero("hysteresis", options.hysteresis),
    maxOrder,
    settleCycles,
    settleTolerance,
    amplitudeLimit,
    prediction: options.prediction,
    drives: options.drives ?? [],
    searchFrom: positiveOrZero("searchFrom", options.searchFrom ?? 0),
    unit: options.unit ?? "V",
  };
}

import { commonPeriod } from "../steady/common-period.js";
import { startsFrom, type Pole } from "./poles.js";

/**
 * The frequency a start-up run is sized by (its length in cycles, its steps): the dominant pair's
 * when the bias point starts an oscillation; else, in a circuit with periodic sources, the
 * sources' common frequency, since a driven waveform repeats at their common period (the lowest
 * source's when they share none); else the dominant pair's; null when there is none of these.
 */
export function sizingFrequency(pole: Pole | null, drives: readonly number[]): number | null {
  const pair = pole && pole.imag > 0 ? pole : null;
  if (pair && startsFrom(pair)) return pair.imag / (2 * Math.PI);
  if (drives.length > 0) {
    const common = commonPeriod(drives);
    return common === null ? Math.min(...drives) : 1 / common;
  }
  return pair ? pair.imag / (2 * Math.PI) : null;
}

/** The period the default max-step divides: the run's, or the fastest periodic source's when shorter. */
export function stepPeriod(period: number, drives: readonly number[]): number {
  return drives.length === 0 ? period : Math.min(period, 1 / Math.max(...drives));
}

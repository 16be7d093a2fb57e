import { badArgument, describe } from "../circuit/arguments.js";
/** The percentiles reported for every Monte Carlo metric. */
export const REPORTED_PERCENTILES = [0, 1, 5, 50, 95, 99, 100] as const;

/** Count, extremes and the reported percentiles of a sample of numbers. */
export interface PercentileSummary {
  readonly count: number;
  readonly min: number;
  readonly p1: number;
  readonly p5: number;
  readonly median: number;
  readonly p95: number;
  readonly p99: number;
  readonly max: number;
  readonly mean: number;
  readonly std: number;
}

/**
 * The p-th percentile of sorted values by linear interpolation between closest ranks
 * (Hyndman & Fan 1996, definition 7: position (n − 1)·p/100).
 */
export function percentileOfSorted(sorted: ArrayLike<number>, p: number): number {
  if (!isList(sorted)) throw badArgument("percentileOfSorted: sorted must be an array of numbers");
  if (!(typeof p === "number" && p >= 0 && p <= 100)) throw badArgument(`percentileOfSorted: p must be a percentage from 0 to 100, got ${describe(p)}`);
  const n = sorted.length;
  if (n === 0) return Number.NaN;
  const pos = ((n - 1) * p) / 100;
  const lo = Math.floor(pos);
  const hi = Math.min(n - 1, lo + 1);
  return sorted[lo]! + (pos - lo) * (sorted[hi]! - sorted[lo]!);
}

/** An array or typed array (anything with a whole-number length, readable by index). */
function isList(value: unknown): value is ArrayLike<number> {
  return Array.isArray(value) || ArrayBuffer.isView(value);
}

/** Percentiles, mean and standard deviation of the finite values; null when there are none. */
export function summarize(values: ArrayLike<number>): PercentileSummary | null {
  if (!isList(values)) throw badArgument("summarize: values must be an array of numbers");
  const finite: number[] = [];
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i])) finite.push(values[i]!);
  if (finite.length === 0) return null;
  finite.sort((a, b) => a - b);
  const n = finite.length;
  let mean = 0;
  for (const v of finite) mean += v;
  mean /= n;
  let ss = 0;
  for (const v of finite) ss += (v - mean) ** 2;
  const q = (p: number) => percentileOfSorted(finite, p);
  return { count: n, min: finite[0]!, p1: q(1), p5: q(5), median: q(50), p95: q(95), p99: q(99), max: finite[n - 1]!, mean, std: n > 1 ? Math.sqrt(ss / (n - 1)) : 0 };
}

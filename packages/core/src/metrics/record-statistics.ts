/** Trapezoidal statistics of part of a record. */
export interface RecordStatistics {
  readonly mean: number;
  /** r.m.s., the mean included. */
  readonly rms: number;
  readonly minimum: number;
  readonly maximum: number;
}

/**
 * Statistics over the last half of the record (by time), by the trapezoid rule: the first guess
 * of the level the signal swings about, and the figures reported when there are no cycles to
 * measure on.
 */
export function lastHalfStatistics(t: Float64Array, v: Float64Array): RecordStatistics {
  const n = t.length;
  const middle = 0.5 * (t[0] + t[n - 1]);
  let first = 0;
  while (first < n - 2 && t[first + 1] <= middle) first++;
  let area = 0;
  let areaOfSquares = 0;
  let minimum = v[first];
  let maximum = v[first];
  for (let i = first; i < n - 1; i++) {
    const h = t[i + 1] - t[i];
    area += 0.5 * h * (v[i] + v[i + 1]);
    areaOfSquares += 0.5 * h * (v[i] * v[i] + v[i + 1] * v[i + 1]);
    if (v[i + 1] < minimum) minimum = v[i + 1];
    if (v[i + 1] > maximum) maximum = v[i + 1];
  }
  const span = t[n - 1] - t[first];
  return { mean: area / span, rms: Math.sqrt(areaOfSquares / span), minimum, maximum };
}

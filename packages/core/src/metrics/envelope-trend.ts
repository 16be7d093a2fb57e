/** How the per-cycle envelope moved over the last few cycles. */
export interface TailTrend {
  /** Cycle-to-cycle changes examined. */
  readonly changes: number;
  /** ln(E_last / E_first) per cycle over those changes. */
  readonly meanLogChange: number;
  /** Largest |ΔE|/E among them. */
  readonly largestChange: number;
  /** Fractions of the changes that were increases and decreases. */
  readonly risingFraction: number;
  readonly fallingFraction: number;
}

/** The trend of the last `changes` cycle-to-cycle envelope changes (`changes < envelope.length`). */
export function tailTrend(envelope: Float64Array, changes: number): TailTrend {
  const n = envelope.length;
  let largest = 0;
  let rising = 0;
  let falling = 0;
  for (let k = n - changes; k < n; k++) {
    const delta = envelope[k] - envelope[k - 1];
    const relative = Math.abs(delta) / envelope[k - 1];
    if (relative > largest) largest = relative;
    if (delta > 0) rising++;
    else if (delta < 0) falling++;
  }
  return {
    changes,
    meanLogChange: Math.log(envelope[n - 1] / envelope[n - 1 - changes]) / changes,
    largestChange: largest,
    risingFraction: rising / changes,
    fallingFraction: falling / changes,
  };
}

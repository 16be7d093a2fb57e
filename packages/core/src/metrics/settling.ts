/** Relative band the envelope must stay in after the settling time. */
export const SETTLING_BAND = 0.01;

/**
 * The time after which a per-cycle measure `e` (the envelope, or the strength) stays within
 * ±{@link SETTLING_BAND} of `level`: where it, interpolated linearly between cycle mid-times,
 * last enters the band. The first cycle's mid-time if no cycle ever left it; the last cycle's if
 * it ends outside.
 */
export function settlingTime(midTime: Float64Array, e: Float64Array, level: number): number {
  const low = level * (1 - SETTLING_BAND);
  const high = level * (1 + SETTLING_BAND);
  let k = e.length - 1;
  while (k >= 0 && e[k] >= low && e[k] <= high) k--;
  if (k < 0) return midTime[0];
  if (k === e.length - 1) return midTime[k];
  const edge = e[k] > high ? high : low;
  const fraction = (e[k] - edge) / (e[k] - e[k + 1]);
  return midTime[k] + fraction * (midTime[k + 1] - midTime[k]);
}

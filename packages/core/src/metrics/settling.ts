import type { CycleTable } from "./cycles.js";

/** Relative band the envelope must stay in after the settling time. */
export const SETTLING_BAND = 0.01;

/**
 * The time after which the per-cycle envelope stays within ±{@link SETTLING_BAND} of
 * `amplitude`: where the envelope, interpolated linearly between cycle mid-times, last enters
 * the band. The first cycle's mid-time if no cycle ever left it; the last cycle's if it ends
 * outside.
 */
export function settlingTime(cycles: CycleTable, amplitude: number): number {
  const low = amplitude * (1 - SETTLING_BAND);
  const high = amplitude * (1 + SETTLING_BAND);
  const e = cycles.envelope;
  let k = cycles.count - 1;
  while (k >= 0 && e[k] >= low && e[k] <= high) k--;
  if (k < 0) return cycles.midTime[0];
  if (k === cycles.count - 1) return cycles.midTime[k];
  const edge = e[k] > high ? high : low;
  const fraction = (e[k] - edge) / (e[k] - e[k + 1]);
  return cycles.midTime[k] + fraction * (cycles.midTime[k + 1] - cycles.midTime[k]);
}

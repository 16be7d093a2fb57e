import { formatQuantity } from "./format.js";
import type { RecordStatistics } from "./record-statistics.js";

/**
 * A record too short in cycles to judge is a burst that died when it swung this many times its
 * reference (the noise floor, or the last half's own half swing, whichever is larger) on both
 * sides of the last half's mean: an oscillation grew and died away, not silence.
 */
export const BURST_RATIO = 10;

/** The largest excursion of a burst that died, and when. */
export interface DiedBurst {
  readonly peak: number;
  readonly peakAt: number;
}

/**
 * The burst of a record that oscillated and died within too few cycles to measure (see
 * {@link BURST_RATIO}): its largest excursion from the last half's mean after `from`; null when
 * it stayed near that mean on either side (silence, or a step that settles without swinging back).
 */
export function diedBurst(t: Float64Array, v: Float64Array, tail: RecordStatistics, noiseFloor: number, from: number): DiedBurst | null {
  const reference = BURST_RATIO * Math.max(noiseFloor, 0.5 * (tail.maximum - tail.minimum));
  let above = 0;
  let below = 0;
  let peakAt = NaN;
  for (let i = 0; i < t.length; i++) {
    if (t[i] < from) continue;
    const d = v[i] - tail.mean;
    if (Math.abs(d) > Math.max(above, below)) peakAt = t[i];
    above = Math.max(above, d);
    below = Math.max(below, -d);
  }
  if (!(reference > 0 && above > reference && below > reference)) return null;
  return { peak: Math.max(above, below), peakAt };
}

/** The line of a burst that died: not "no oscillation". */
export function explainDiedBurst(burst: DiedBurst, cycles: number, unit: string): string {
  return `the oscillation grew to ${formatQuantity(burst.peak, unit)} peak at ${formatQuantity(burst.peakAt, "s")} and died away within ${cycles} complete cycle${cycles === 1 ? "" : "s"}, too few to measure it`;
}

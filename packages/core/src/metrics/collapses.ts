import type { CycleTable } from "./cycles.js";

/** A collapse: the envelope falls below this share of its largest value so far… */
export const COLLAPSE = 0.2;
/** …and a restart: it rises again above this share of it. */
export const RESTART = 0.5;
/** A cycle this many times the median period long is a gap: the oscillation stopped and started again. */
export const GAP = 3;

function medianPeriod(cycles: CycleTable): number {
  const periods = Array.from({ length: cycles.count }, (_, k) => cycles.start[k + 1] - cycles.start[k]).sort((a, b) => a - b);
  return periods[Math.floor(periods.length / 2)] ?? 0;
}

/**
 * How many times the per-cycle envelope collapsed and restarted after it first reached
 * {@link RESTART} of its largest value: fell below {@link COLLAPSE} of its largest value so far
 * (or stopped for a gap, a cycle over {@link GAP} median periods long, when the swing fell
 * inside the crossing hysteresis) and then rose again above {@link RESTART} of it. A ring-down
 * to nothing is no restart; an envelope that dips and recovers by less is a bounce, not a collapse.
 */
export function collapsesAndRestarts(cycles: CycleTable): number {
  const n = cycles.count;
  const e = cycles.envelope;
  let largest = 0;
  for (let k = 0; k < n; k++) largest = Math.max(largest, e[k]);
  const period = medianPeriod(cycles);
  let k = 0;
  while (k < n && e[k] < RESTART * largest) k++;
  let peak = 0;
  let down = false;
  let count = 0;
  for (; k < n; k++) {
    const gap = cycles.start[k + 1] - cycles.start[k] > GAP * period;
    if (down && !gap && e[k] > RESTART * peak) {
      down = false;
      count++;
    }
    if (!down && (gap || e[k] < COLLAPSE * peak)) down = true;
    if (!down) peak = Math.max(peak, e[k]);
  }
  return count;
}

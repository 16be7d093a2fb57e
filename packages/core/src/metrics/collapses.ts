import type { CycleTable } from "./cycles.js";

/** A collapse: the envelope falls below this share of its largest value since the last restart… */
export const COLLAPSE = 0.2;
/** …and a restart: it rises again to this many times the lowest value of the collapse. */
export const RESTART = 5;
/** A cycle this many times the median period long is a gap: the oscillation stopped and started again. */
export const GAP = 3;

function medianPeriod(cycles: CycleTable): number {
  const periods = Array.from({ length: cycles.count }, (_, k) => cycles.start[k + 1] - cycles.start[k]).sort((a, b) => a - b);
  return periods[Math.floor(periods.length / 2)] ?? 0;
}

/**
 * How many times the per-cycle envelope collapsed and restarted: fell below {@link COLLAPSE} of
 * its largest value since the last restart (or stopped for a gap, a cycle over {@link GAP}
 * median periods long, when the swing fell inside the crossing hysteresis) and then rose again
 * to {@link RESTART} times the lowest value of the collapse and above `floor` (twice the noise
 * floor: noise alone does not restart). So every deep valley between two peaks counts, whatever
 * the first overshoot was; a ring-down to nothing is no restart, a dip to 60 % no collapse.
 */
export function collapsesAndRestarts(cycles: CycleTable, floor = 0): number {
  const n = cycles.count;
  const e = cycles.envelope;
  const period = medianPeriod(cycles);
  let peak = 0;
  let low = Infinity;
  let down = false;
  let count = 0;
  for (let k = 0; k < n; k++) {
    const gap = cycles.start[k + 1] - cycles.start[k] > GAP * period;
    if (down && !gap && e[k] >= RESTART * low && e[k] > floor) {
      down = false;
      count++;
      peak = 0;
    }
    if (!down && peak > floor && (gap || e[k] < COLLAPSE * peak)) {
      down = true;
      low = gap ? 0 : e[k];
    }
    if (down) low = Math.min(low, gap ? 0 : e[k]);
    else peak = Math.max(peak, e[k]);
  }
  return count;
}

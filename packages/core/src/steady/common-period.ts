/** A source's frequency within this fraction of an integer multiple of the common frequency shares its period. */
export const COMMON_PERIOD = 1e-9;
/**
 * The common period is looked for up to this many periods of the lowest source (1 kHz and
 * 1.5 kHz share 2 ms, two of 1 kHz's): the orbit's grid, and so the shooting's cost, grows with it.
 */
export const MOST_COMMON_MULTIPLE = 64;

/**
 * The shortest period every source repeats within: 1/f₀ for the largest f₀ = lowest/k
 * (k ≤ MOST_COMMON_MULTIPLE) of which every source's frequency is a whole multiple; null when
 * there is none (frequencies not in a ratio of small whole numbers). `within`: the relative
 * distance from a whole multiple that still counts (a frequency known only to its error bar).
 */
export function commonPeriod(drives: readonly number[], within = COMMON_PERIOD): number | null {
  const lowest = Math.min(...drives);
  for (let k = 1; k <= MOST_COMMON_MULTIPLE; k++) {
    const common = lowest / k;
    if (drives.every((d) => Math.abs(d / common - Math.round(d / common)) <= within * (d / common))) return 1 / common;
  }
  return null;
}

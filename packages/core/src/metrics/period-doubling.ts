import type { CycleTable } from "./cycles.js";

/** The two envelope levels of a swing that repeats every second cycle. */
export interface AlternatingSwing {
  /** The mean envelope of the lower cycles. */
  readonly low: number;
  /** The mean envelope of the higher cycles. */
  readonly high: number;
}

/**
 * A period-doubled swing over the last `changes` cycles: the envelope steps up and down by turns
 * (each cycle-to-cycle change the opposite way to the one before), while each cycle's envelope
 * and per-cycle mean repeat those of the cycle two before within `tolerance` (relative to the
 * envelope). This is the steady state past a flip of the amplitude loop (a Floquet multiplier
 * through −1): the orbit of one cycle is unstable and the waveform repeats every two, so it
 * never steadies from one cycle to the next however long it runs. Null for any other tail, and
 * when the record has fewer than `changes` + 2 cycles.
 */
export function alternatingSwing(cycles: CycleTable, changes: number, tolerance: number): AlternatingSwing | null {
  const n = cycles.count;
  const { envelope, mean } = cycles;
  if (n < changes + 2) return null;
  const sums = [0, 0];
  for (let k = n - changes; k < n; k++) {
    if ((envelope[k] - envelope[k - 1]) * (envelope[k - 1] - envelope[k - 2]) >= 0) return null;
    if (!(Math.abs(envelope[k] - envelope[k - 2]) < tolerance * envelope[k - 2])) return null;
    if (!(Math.abs(mean[k] - mean[k - 2]) < tolerance * envelope[k])) return null;
  }
  for (let k = n - 2 * Math.floor(changes / 2); k < n; k++) sums[(n - k) % 2] += envelope[k];
  const half = Math.floor(changes / 2);
  const [a, b] = [sums[0] / half, sums[1] / half];
  return { low: Math.min(a, b), high: Math.max(a, b) };
}

/**
 * The per-cycle values averaged over each cycle and the one before it (the first kept as it
 * is): a period-doubled swing's alternation is no slow dynamics of its envelope, and this takes
 * it out before the envelope's bounce or creep is fitted.
 */
export function pairAveraged(values: Float64Array): Float64Array {
  return values.map((v, k) => (k === 0 ? v : 0.5 * (v + values[k - 1])));
}

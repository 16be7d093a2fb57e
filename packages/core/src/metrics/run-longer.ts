import type { TailTrend } from "./envelope-trend.js";
import type { StartupSettings } from "./startup-options.js";

/** Below this ratio of the tail's second-half to first-half log growth, growth counts as slowing. */
const SLOWING = 0.8;

/**
 * Roughly how many more cycles a `growing` record needs: until the envelope could settle, plus
 * `settleCycles` to confirm it.
 *
 * If the per-cycle log growth over the second half of the tail is under 0.8 of that over the
 * first half, the slowdown is taken as geometric (as in a first-order approach to the final
 * amplitude) and followed until the growth drops below `settleTolerance`. Otherwise growth is
 * taken as exponential at the tail's rate, up to `amplitudeLimit` if given, else for one more
 * decade.
 */
export function extraRunCycles(envelope: Float64Array, trend: TailTrend, settings: StartupSettings): number {
  const n = envelope.length;
  const half = Math.floor(trend.changes / 2);
  if (half >= 2) {
    const early = Math.log(envelope[n - 1 - half] / envelope[n - 1 - 2 * half]) / half;
    const late = Math.log(envelope[n - 1] / envelope[n - 1 - half]) / half;
    if (early > 0 && late > 0 && late < SLOWING * early) {
      const ratio = (late / early) ** (1 / half);
      const remaining = late > settings.settleTolerance ? Math.log(settings.settleTolerance / late) / Math.log(ratio) : 0;
      return remaining + settings.settleCycles;
    }
  }
  const last = envelope[n - 1];
  const nepers =
    settings.amplitudeLimit !== undefined && settings.amplitudeLimit > last
      ? Math.log(settings.amplitudeLimit / last)
      : Math.LN10;
  return nepers / trend.meanLogChange + settings.settleCycles;
}

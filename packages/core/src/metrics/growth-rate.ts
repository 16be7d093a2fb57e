import type { CycleTable } from "./cycles.js";
import type { StartupSettings } from "./startup-options.js";
import type { StartupVerdict } from "./verdict.js";

/** Growth is fitted above max(GROWTH_FLOOR_NOISE·noiseFloor, GROWTH_FLOOR·final envelope)… */
export const GROWTH_FLOOR_NOISE = 10;
export const GROWTH_FLOOR = 1e-3;
/** …and below GROWTH_CEILING·final, or GROWTH_CEILING_WIDE·final if that leaves under 3 cycles. */
export const GROWTH_CEILING = 0.3;
export const GROWTH_CEILING_WIDE = 0.9;

/** A least-squares growth rate and how many cycles it was fitted over. */
export interface GrowthFit {
  /** σ in 1/s. */
  readonly rate: number;
  readonly cycles: number;
}

/**
 * σ from a least-squares line through ln E against cycle mid-time, over a run of cycles whose
 * envelope lies strictly between `floor` and `ceiling`. For `rising` the run is taken from the
 * first cycle up to the first one that reaches `ceiling` (so an overshoot and its recovery are
 * left out); for `falling`, from the largest envelope on until it drops to `floor`. Null if
 * fewer than two cycles qualify.
 */
export function fitEnvelopeGrowth(
  midTime: Float64Array,
  envelope: Float64Array,
  floor: number,
  ceiling: number,
  direction: "rising" | "falling",
): GrowthFit | null {
  const n = envelope.length;
  let first = 0;
  let end = n;
  if (direction === "rising") {
    for (let k = 0; k < n; k++) {
      if (envelope[k] >= ceiling) {
        end = k;
        break;
      }
    }
  } else {
    for (let k = 1; k < n; k++) if (envelope[k] > envelope[first]) first = k;
    for (let k = first; k < n; k++) {
      if (envelope[k] <= floor) {
        end = k;
        break;
      }
    }
  }
  let count = 0;
  let sumX = 0;
  let sumY = 0;
  for (let k = first; k < end; k++) {
    if (!(envelope[k] > floor && envelope[k] < ceiling)) continue;
    count++;
    sumX += midTime[k];
    sumY += Math.log(envelope[k]);
  }
  if (count < 2) return null;
  const meanX = sumX / count;
  const meanY = sumY / count;
  let sxy = 0;
  let sxx = 0;
  for (let k = first; k < end; k++) {
    if (!(envelope[k] > floor && envelope[k] < ceiling)) continue;
    const dx = midTime[k] - meanX;
    sxy += dx * (Math.log(envelope[k]) - meanY);
    sxx += dx * dx;
  }
  return { rate: sxy / sxx, cycles: count };
}

/**
 * The start-up growth rate σ (1/s) for a verdict, or null without a growth phase to fit.
 *
 * Rising records: the fit of {@link fitEnvelopeGrowth} between max(10·noiseFloor, 10⁻³·final)
 * and 0.3·final, widened to 0.9·final if that leaves fewer than 3 cycles; `final` is the
 * settled (or, when not settled, the caller's best) final envelope. `decaying`: the fall from
 * the largest envelope down to 10⁻³ of it. `silent`: null.
 */
export function startupGrowthRate(
  cycles: CycleTable,
  verdict: StartupVerdict,
  final: number,
  settings: StartupSettings,
  offset = Number.NaN,
): number | null {
  if (verdict === "silent") return null;
  if (verdict === "decaying") {
    let largest = 0;
    for (let k = 0; k < cycles.count; k++) largest = Math.max(largest, cycles.envelope[k]);
    return fitEnvelopeGrowth(cycles.midTime, cycles.envelope, GROWTH_FLOOR * largest, Infinity, "falling")?.rate ?? null;
  }
  const floor = Math.max(GROWTH_FLOOR_NOISE * settings.noiseFloor, GROWTH_FLOOR * final);
  const { midTime, envelope } = withoutDisplacement(cycles, offset);
  const narrow = fitEnvelopeGrowth(midTime, envelope, floor, GROWTH_CEILING * final, "rising");
  if (narrow !== null && narrow.cycles >= 3) return narrow.rate;
  const wide = fitEnvelopeGrowth(midTime, envelope, floor, GROWTH_CEILING_WIDE * final, "rising");
  return (wide ?? narrow)?.rate ?? null;
}

/**
 * A cycle whose mean lies more than this share of its envelope from the final offset sits on a
 * DC level still moving. (A growing sine's crossing-to-crossing cycles are lopsided too, by about
 * σT/2π of their envelope: a fifth at σT = 1, well inside.)
 */
const DISPLACED = 0.5;

/**
 * The cycles whose envelope is the oscillation's, not a DC level moving under it (as the
 * supplies come up at power-on): their mean lies within {@link DISPLACED} of their envelope of
 * the final `offset` (every cycle when the offset is unknown).
 */
function withoutDisplacement(cycles: CycleTable, offset: number): { midTime: Float64Array; envelope: Float64Array } {
  const n = cycles.count;
  const keep: number[] = [];
  for (let k = 0; k < n; k++) {
    if (!(Math.abs(cycles.mean[k] - offset) > DISPLACED * cycles.envelope[k])) keep.push(k);
  }
  if (keep.length === n) return { midTime: cycles.midTime, envelope: cycles.envelope };
  return { midTime: Float64Array.from(keep, (k) => cycles.midTime[k]), envelope: Float64Array.from(keep, (k) => cycles.envelope[k]) };
}

/**
 * Periods a shooting may integrate beyond its usual bound while its mismatch still falls steadily.
 * A start far from a slowly attracting orbit (a multiplier of 0.998: a gate-leak bias, a
 * rectifier's reservoir) is held by the trust radius to steps the map's bend allows, and closes
 * in over some 40–60 periods before Newton's quadratic convergence takes over: a JFET Colpitts
 * shot from its poles' period, a voltage doubler with a 1 MΩ load after 12 periods of transient.
 * The bound keeps a shooting that never gets there (a start out of Newton's reach) within 4× the
 * usual cost.
 */
export const LONGEST_SHOOTING = 100;
/** Beyond the usual bound, the best mismatch must have fallen by this share… */
const HEADWAY_FALL = 0.05;
/** …over the last this many periods. */
const HEADWAY_WINDOW = 10;

/**
 * How many periods a shooting integrates: `usual`, and beyond it up to `longest` only while
 * its best mismatch keeps falling by `HEADWAY_FALL` every `HEADWAY_WINDOW` periods (a shooting
 * making steady headway that the usual bound would stop short of the orbit; one that merely
 * wanders, or crawls, stops there as before).
 */
export class IterationCap {
  /** best[k]: the least mismatch over periods 1…k + 1. */
  private readonly best: number[] = [];

  constructor(
    private readonly usual: number,
    private readonly longest: number,
  ) {}

  /** Records a period's mismatch (a period whose map failed records none). */
  record(mismatch: number): void {
    const last = this.best.length > 0 ? this.best[this.best.length - 1]! : Infinity;
    this.best.push(Math.min(last, mismatch));
  }

  /** Whether period `iteration` (from 1) may be integrated. */
  allows(iteration: number): boolean {
    if (iteration <= this.usual) return true;
    if (iteration > this.longest) return false;
    const done = this.best.length;
    if (done < HEADWAY_WINDOW + 1) return false;
    return this.best[done - 1]! <= (1 - HEADWAY_FALL) * this.best[done - 1 - HEADWAY_WINDOW]!;
  }
}

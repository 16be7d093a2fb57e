import type { SourceSpan } from "../circuit/diagnostic.js";
import { storedPointsError, type RunBudget } from "./limits.js";
import { TailRecord } from "./tail-record.js";

/**
 * The fewest stored points per period a thinned start-up record may keep: crossings and cycle
 * extremes come from local cubics through four samples, which `measureStartup` needs about 30
 * per period for.
 */
export const MIN_POINTS_PER_PERIOD = 32;

/** Time points each of a start-up run's `records` keeps within `stored-points` values (a time and a value each). */
function storedTimes(maxStoredPoints: number, records: number): number {
  return maxStoredPoints === Infinity ? Infinity : Math.max(64, Math.floor(maxStoredPoints / (2 * records)));
}

/**
 * The most periods a record of `times` points can resolve once thinned: its older share (three
 * quarters) full. Thinning halves it, so a run may stop from half as many periods on.
 */
function resolvablePeriods(times: number): number {
  return (times * 3) / 4 / MIN_POINTS_PER_PERIOD;
}

function tooCoarse(budget: RunBudget, records: number, periods: number, why: string, span?: SourceSpan) {
  // Enough however thinning falls: the older share at least half full at 32 points per period.
  const needed = Math.ceil((periods * MIN_POINTS_PER_PERIOD * 8 * 2 * records) / 3);
  return storedPointsError(
    budget.maxStoredPoints,
    needed,
    `${why}: within the stored-points limit of ${budget.maxStoredPoints} values its waveform of about ${Math.round(periods)} periods would keep fewer than ${MIN_POINTS_PER_PERIOD} points per period, too few to measure its cycles (it needs stored-points=${needed})`,
    span,
  );
}

/**
 * The probe record of a start-up run within the budget's stored points (see {@link TailRecord}),
 * shared with the run's other `records` (the node its outcome is judged at, when that is not the
 * probe: two records of the same time points, each within half the points). With a predicted frequency, a fixed-length run that would thin its record below
 * {@link MIN_POINTS_PER_PERIOD} is refused before it starts, and any run stops as soon as
 * thinning would go below it.
 */
export function startupRecord(
  budget: RunBudget,
  run: { readonly until: number | "auto"; readonly maxStep: number; readonly frequency: number | null; readonly span?: SourceSpan },
  records = 1,
): TailRecord {
  const times = storedTimes(budget.maxStoredPoints, records);
  const record = new TailRecord(times);
  const f = run.frequency;
  if (f === null || times === Infinity) return record;
  if (typeof run.until === "number" && run.until / run.maxStep > times && run.until * f > resolvablePeriods(times)) {
    throw tooCoarse(budget, records, run.until * f, `the start-up run until=${run.until} s was not started`, run.span);
  }
  record.onThin = (spacing, now) => {
    if (spacing * f * MIN_POINTS_PER_PERIOD > 1) {
      throw tooCoarse(budget, records, now * f, `the start-up run stopped at t = ${Number(now.toPrecision(4))} s`, run.span);
    }
  };
  return record;
}

/**
 * Refuses a measurement whose record was thinned below {@link MIN_POINTS_PER_PERIOD} at the
 * measured frequency (an oscillation the linear prediction did not foresee).
 */
export function checkResolved(budget: RunBudget, record: TailRecord, frequency: number | null, span?: SourceSpan, records = 1): void {
  const spacing = record.olderSpacing();
  if (frequency === null || spacing === 0 || spacing * frequency * MIN_POINTS_PER_PERIOD <= 1) return;
  const periods = record.lastTime * frequency;
  throw tooCoarse(budget, records, periods, `the start-up run's measurement was refused`, span);
}

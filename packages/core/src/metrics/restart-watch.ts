import { COLLAPSE } from "./collapses.js";
import { formatQuantity } from "./format.js";

/** A record that grew and now dies away is watched this many times as long as it took to peak… */
export const RESTART_WATCH = 8;
/**
 * …and, when the bias point's poles say the circuit starts by itself, this many of their slowest
 * decaying time constants after its peak: an amplitude loop its overshoot over-charged lets the
 * oscillation grow again once its slow state has bled back (the steady analysis waits as long for
 * a small start's swing that looks died out).
 */
export const RECOVERY = 3;
/** A record grew when its largest envelope is above this multiple of its first. */
const GREW = 2;

/** The envelope of a start-up record, one value per cycle at its mid-time. */
export interface CycleEnvelope {
  readonly time: Float64Array;
  readonly value: Float64Array;
}

/** When the watch of a dying record for a restart ends, and from what. */
export interface RestartWatch {
  /** s: the envelope's peak. */
  readonly peakAt: number;
  readonly peak: number;
  /** s: the end of the watch. */
  readonly until: number;
}

/**
 * The slowest decay time constant 1/|Re p| among the bias point's decaying poles `p` (given by
 * their real parts, 1/s), or 0 when none decays.
 */
export function slowestTimeConstant(realParts: Iterable<number>): number {
  let slowest = Infinity;
  for (const re of realParts) if (re < 0) slowest = Math.min(slowest, -re);
  return Number.isFinite(slowest) ? 1 / slowest : 0;
}

/**
 * How long a record that dies away after growing may still restart: it grew to its peak first
 * (a slow amplitude loop that overshot can kill the oscillation and let it grow again once its
 * filter has relaxed, see the `bouncing` verdict), and is watched until {@link RESTART_WATCH}
 * times as long as the growth took or, for a circuit that starts by itself, {@link RECOVERY}
 * times `timeConstant` (its slowest decaying one, 0 otherwise) past the peak, whichever is later.
 * Null for a record that never grew.
 */
export function restartWatch(envelope: CycleEnvelope, timeConstant: number): RestartWatch | null {
  const { time, value } = envelope;
  let peak = 0;
  for (let k = 1; k < value.length; k++) if (value[k] > value[peak]) peak = k;
  if (!(peak > 0 && value[peak] > GREW * value[0])) return null;
  return watchFrom(time[peak], value[peak], timeConstant);
}

function watchFrom(peakAt: number, peak: number, timeConstant: number): RestartWatch {
  return { peakAt, peak, until: Math.max(RESTART_WATCH * peakAt, peakAt + RECOVERY * timeConstant) };
}

/** {@link restartWatch} of a start-up record: of its envelope, or of the burst that died within too few cycles to have one. */
export function recordWatch(record: { readonly envelope: CycleEnvelope; readonly burst?: { readonly peak: number; readonly peakAt: number } }, timeConstant: number): RestartWatch | null {
  return record.burst ? watchFrom(record.burst.peakAt, record.burst.peak, timeConstant) : restartWatch(record.envelope, timeConstant);
}

/**
 * Whether the envelope ends collapsed: its last value below {@link COLLAPSE} of its largest. Its
 * swing is then no amplitude the excitation's noise can be weighed against, whatever it does next.
 */
export function endsCollapsed(envelope: CycleEnvelope): boolean {
  const { value } = envelope;
  let largest = 0;
  for (let k = 0; k < value.length; k++) largest = Math.max(largest, value[k]);
  return value.length > 0 && value[value.length - 1] < COLLAPSE * largest;
}

/**
 * The line of a record that died away after its overshoot and was not watched long enough to
 * tell whether its amplitude loop brings it back: not "no oscillation", an unfinished run. The
 * peak in the probe's `unit`; `raise` names the option that ended the run (`settle-within=` for
 * `until=auto` at its bound, `until=` for a fixed length).
 */
export function explainCutWatch(watch: RestartWatch, stoppedAt: number, timeConstant: number, unit = "V", raise: "settle-within=" | "until=" = "settle-within="): string {
  return (
    `the oscillation grew to ${formatQuantity(watch.peak, unit)} peak at ${formatQuantity(watch.peakAt, "s")} and died away after it, ` +
    `but it may come back once the slow state its overshoot over-charged (an amplitude loop's filter) has bled back` +
    (timeConstant > 0 ? ` (the bias point's slowest time constant is ${formatQuantity(timeConstant, "s")})` : "") +
    `: it is watched until ${formatQuantity(watch.until, "s")}, the run stopped at ${formatQuantity(stoppedAt, "s")}; raise ${raise} to wait longer`
  );
}

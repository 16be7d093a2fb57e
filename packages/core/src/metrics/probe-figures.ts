import { cyclesBetween, type CycleTable } from "./cycles.js";
import { analyseCycles } from "./harmonic-analysis.js";
import { intervalAt } from "./local-cubic.js";
import { lastHalfStatistics } from "./record-statistics.js";
import type { StartupJudgement, StartupMetrics } from "./startup.js";

/** The figures a start-up reports of its probe: the waveform's own, whatever node the outcome was judged at. */
export type ProbeFigures = Pick<StartupMetrics, "amplitude" | "peakToPeak" | "rms" | "offset" | "thd" | "thdPlusNoise" | "harmonics">;

/**
 * A probe's figures over the cycles another waveform of the same run was judged on (`judged`,
 * recorded at the same time points): per-cycle envelopes between the judged cycles' starts, and
 * over its measured cycles the peak-to-peak, r.m.s., offset and (settled only) the harmonics of
 * the judged frequency. So a probe that swings at a harmonic (a lamp's temperature, at 2f) or
 * barely at all (a supply node) is measured over whole periods of the oscillation, not over
 * cycles of its own. A judgement without cycles (silent) gives the record's last half, as
 * `measureStartup` does.
 */
export function probeFigures(t: Float64Array, v: Float64Array, judged: StartupJudgement, maxOrder: number): { figures: ProbeFigures; envelope: Float64Array } {
  const { metrics, from } = judged;
  const n = judged.cycles.count;
  if (n === 0 || metrics.frequency === null) {
    const tail = lastHalfStatistics(t, v);
    return { figures: { amplitude: null, peakToPeak: tail.maximum - tail.minimum, rms: tail.rms, offset: tail.mean, thd: null, thdPlusNoise: null, harmonics: [] }, envelope: new Float64Array(n) };
  }
  const cycles = cyclesAlong(t, v, judged.cycles);
  const settled = metrics.harmonics.length > 0;
  const analysis = analyseCycles(t, v, cycles.start[from]!, cycles.start[n]!, n - from, maxOrder, metrics.frequency);
  let maximum = -Infinity;
  let minimum = Infinity;
  let envelopeSum = 0;
  for (let k = from; k < n; k++) {
    maximum = Math.max(maximum, cycles.maximum[k]!);
    minimum = Math.min(minimum, cycles.minimum[k]!);
    envelopeSum += cycles.envelope[k]!;
  }
  return {
    figures: {
      amplitude: settled ? envelopeSum / (n - from) : cycles.envelope[n - 1]!,
      peakToPeak: maximum - minimum,
      rms: analysis.rms,
      offset: analysis.offset,
      thd: settled ? analysis.thd : null,
      thdPlusNoise: settled ? analysis.thdPlusNoise : null,
      harmonics: settled ? analysis.harmonics : [],
    },
    envelope: cycles.envelope,
  };
}

/** The cycles of `v` between the same start times as `judged`'s. */
function cyclesAlong(t: Float64Array, v: Float64Array, judged: CycleTable): CycleTable {
  const times = judged.start;
  const intervals = Int32Array.from(times, (time) => intervalAt(t, time));
  return cyclesBetween(t, v, { times, intervals });
}

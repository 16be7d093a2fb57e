// Synthetic waveforms sampled the way the solver samples: strictly increasing, uneven steps.
import { randomStream } from "../../../packages/core/src/random/stream.js";

/**
 * Times from `start` to `end` (both included) with steps drawn independently and uniformly
 * between `meanStep·(1 − jitter)` and `meanStep·(1 + jitter)`, and, if `sweep` is set, a slow
 * smooth 10× change of the step size across the record (as step control does).
 */
export function jitteredTimes(
  start: number,
  end: number,
  meanStep: number,
  seed: number,
  { jitter = 0.5, sweep = false }: { jitter?: number; sweep?: boolean } = {},
): Float64Array {
  const random = randomStream(seed);
  const times: number[] = [start];
  let time = start;
  for (;;) {
    const x = (time - start) / (end - start);
    // Geometric sweep from 1/√10 to √10 times the mean step and back.
    const scale = sweep ? 10 ** (0.5 * Math.cos(2 * Math.PI * x)) : 1;
    time += meanStep * scale * (1 + jitter * (2 * random.uniform() - 1));
    if (time >= end - 0.25 * meanStep) break;
    times.push(time);
  }
  times.push(end);
  return Float64Array.from(times);
}

export function sampled(t: Float64Array, f: (time: number) => number): Float64Array {
  return t.map(f);
}

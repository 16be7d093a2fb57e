import { uniformFloat64 } from "pure-rand/distribution/uniformFloat64";
import { xoroshiro128plusFromState } from "pure-rand/generator/xoroshiro128plus";
import { fmix32 } from "./mix.js";

/** A reproducible stream of random numbers. */
export interface RandomStream {
  /** Uniform on [0, 1). */
  uniform(): number;
  /** Standard normal (mean 0, σ 1). */
  normal(): number;
}

function mixWords(seed: number, index: number, lane: number): number {
  const lo = seed >>> 0;
  const hi = Math.floor(seed / 2 ** 32) >>> 0;
  let h = fmix32(lo ^ Math.imul(lane + 1, 0x9e3779b9));
  h = fmix32(h ^ hi);
  h = fmix32(h ^ (index >>> 0));
  h = fmix32(h ^ (Math.floor(index / 2 ** 32) >>> 0) ^ Math.imul(lane, 0x7f4a7c15));
  // the generator's state words as signed 32-bit integers
  return h | 0;
}

/**
 * The stream for (seed, index): it depends on these two integers alone, so a Monte Carlo
 * sample draws the same values whichever worker or shard runs it.
 */
export function randomStream(seed: number, index = 0): RandomStream {
  const state: number[] = [0, 1, 2, 3].map((lane) => mixWords(seed, index, lane));
  if (!state.some((w) => w !== 0)) state[0] = 1;
  const rng = xoroshiro128plusFromState(state);
  let spare = Number.NaN;
  return {
    uniform: () => uniformFloat64(rng),
    normal() {
      if (!Number.isNaN(spare)) {
        const v = spare;
        spare = Number.NaN;
        return v;
      }
      // Marsaglia's polar form of the Box–Muller transform.
      for (;;) {
        const u = 2 * uniformFloat64(rng) - 1;
        const v = 2 * uniformFloat64(rng) - 1;
        const s = u * u + v * v;
        if (s > 0 && s < 1) {
          const m = Math.sqrt((-2 * Math.log(s)) / s);
          spare = v * m;
          return u * m;
        }
      }
    },
  };
}

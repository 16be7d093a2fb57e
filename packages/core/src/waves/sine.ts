import type { Wave } from "./wave.js";

export interface SineSettings {
  readonly amp: number;
  readonly freq: number;
  readonly offset: number;
  readonly phase: number;
  readonly delay: number;
}

/** offset + amp·sin(2πf(t − delay) + phase) from `delay` on; offset + amp·sin(phase) before. */
export function sineWave(s: SineSettings): Wave {
  const w = 2 * Math.PI * s.freq;
  return {
    value(t) {
      const tau = t > s.delay ? t - s.delay : 0;
      return s.offset + s.amp * Math.sin(w * tau + s.phase);
    },
    nextBreakpoint(t) {
      return t < s.delay ? s.delay : Infinity;
    },
  };
}

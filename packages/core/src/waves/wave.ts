/** A source waveform: a level as a function of time, with its corners. */
export interface Wave {
  /** The level at `t`; when `left` and `t` is an edge, the level just before it. */
  value(t: number, left: boolean): number;
  /** The first corner strictly after `t`, or Infinity. */
  nextBreakpoint(t: number): number;
  /** After this time the level is 0 for good (absent: never). */
  readonly quietAfter?: number;
}

export function constantWave(level: number): Wave {
  return {
    value: () => level,
    nextBreakpoint: () => Infinity,
  };
}

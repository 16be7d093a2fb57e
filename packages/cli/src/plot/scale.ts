/** Maps data values to pixels along one axis. */
export interface Scale {
  readonly domain: readonly [number, number];
  /** Pixels of `domain[0]` and `domain[1]` (the y range runs downwards, so it is reversed). */
  readonly range: readonly [number, number];
  readonly log: boolean;
  /** Pixel of a value; NaN for a value the axis cannot show (non-finite, or ≤ 0 on a log axis). */
  map(value: number): number;
}

/** A linear scale; the caller guarantees `d0 < d1`. */
export function linearScale(d0: number, d1: number, r0: number, r1: number): Scale {
  const k = (r1 - r0) / (d1 - d0);
  return {
    domain: [d0, d1],
    range: [r0, r1],
    log: false,
    map: (value) => (Number.isFinite(value) ? r0 + (value - d0) * k : Number.NaN),
  };
}

/** A logarithmic scale; the caller guarantees `0 < d0 < d1`. */
export function logScale(d0: number, d1: number, r0: number, r1: number): Scale {
  const l0 = Math.log10(d0);
  const k = (r1 - r0) / (Math.log10(d1) - l0);
  return {
    domain: [d0, d1],
    range: [r0, r1],
    log: true,
    map: (value) => (value > 0 && Number.isFinite(value) ? r0 + (Math.log10(value) - l0) * k : Number.NaN),
  };
}

/** A scale of the right kind. */
export function makeScale(log: boolean, domain: readonly [number, number], r0: number, r1: number): Scale {
  return log ? logScale(domain[0], domain[1], r0, r1) : linearScale(domain[0], domain[1], r0, r1);
}

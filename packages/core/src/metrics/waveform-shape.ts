/** How a steady waveform swings, over a whole number of periods. */
export interface WaveformShape {
  /**
   * The steepest slope over the mean slope: max|dv/dt| ÷ (total variation / time). A triangle
   * gives 1, a sine π/2, a clipped sine somewhat more, a square wave with fast edges far more.
   */
  readonly slopeCrest: number;
  /** The fraction of the time the signal spends above `level`. */
  readonly dutyCycle: number;
}

/**
 * The shape of (t, v) between times `from` and `to` (both inside the record, a whole number of
 * periods apart), the slopes from the sampled points, the time above `level` with linear
 * interpolation between samples.
 */
export function waveformShape(t: Float64Array, v: Float64Array, from: number, to: number, level: number): WaveformShape {
  let steepest = 0;
  let variation = 0;
  let above = 0;
  for (let i = 0; i + 1 < t.length; i++) {
    const a = Math.max(t[i], from);
    const b = Math.min(t[i + 1], to);
    if (!(b > a)) continue;
    const h = t[i + 1] - t[i];
    const slope = (v[i + 1] - v[i]) / h;
    steepest = Math.max(steepest, Math.abs(slope));
    const va = v[i] + slope * (a - t[i]);
    const vb = v[i] + slope * (b - t[i]);
    variation += Math.abs(vb - va);
    if (va >= level && vb >= level) above += b - a;
    else if (va > level || vb > level) above += ((Math.max(va, vb) - level) / Math.abs(vb - va)) * (b - a);
  }
  const span = to - from;
  return { slopeCrest: variation > 0 ? steepest / (variation / span) : 0, dutyCycle: above / span };
}

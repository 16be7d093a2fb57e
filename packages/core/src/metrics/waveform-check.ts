/**
 * Checks the waveform contract every public metric relies on: equal lengths, at least four
 * samples (one local cubic), finite values and strictly increasing times. Internals trust it.
 */
export function checkWaveform(api: string, t: Float64Array, v: Float64Array): void {
  if (t.length !== v.length) {
    throw new RangeError(`${api}: t and v must have the same length (got ${t.length} and ${v.length})`);
  }
  if (t.length < 4) {
    throw new RangeError(`${api}: need at least 4 samples for the local cubic (got ${t.length})`);
  }
  for (let i = 0; i < t.length; i++) {
    if (!Number.isFinite(t[i]) || !Number.isFinite(v[i])) {
      throw new RangeError(`${api}: sample ${i} is not finite (t = ${t[i]}, v = ${v[i]})`);
    }
    if (i > 0 && !(t[i] > t[i - 1])) {
      throw new RangeError(`${api}: times must increase strictly (t[${i - 1}] = ${t[i - 1]}, t[${i}] = ${t[i]})`);
    }
  }
}

import { badArgument, describe } from "../circuit/arguments.js";

/**
 * Checks the waveform contract every public metric relies on: equal lengths, at least four
 * samples (one local cubic), finite values and strictly increasing times. Internals trust it.
 */
export function checkWaveform(api: string, t: Float64Array, v: Float64Array): void {
  if (!(t instanceof Float64Array) || !(v instanceof Float64Array)) throw badArgument(`${api}: t and v must be Float64Arrays, got ${describe(t)} and ${describe(v)}`);
  if (t.length !== v.length) {
    throw badArgument(`${api}: t and v must have the same length (got ${describe(t.length)} and ${describe(v.length)})`);
  }
  if (t.length < 4) {
    throw badArgument(`${api}: need at least 4 samples for the local cubic (got ${describe(t.length)})`);
  }
  for (let i = 0; i < t.length; i++) {
    if (!Number.isFinite(t[i]) || !Number.isFinite(v[i])) {
      throw badArgument(`${api}: sample ${describe(i)} is not finite (t = ${describe(t[i])}, v = ${describe(v[i])})`);
    }
    if (i > 0 && !(t[i] > t[i - 1])) {
      throw badArgument(`${api}: times must increase strictly (t[${describe(i - 1)}] = ${describe(t[i - 1])}, t[${describe(i)}] = ${describe(t[i])})`);
    }
  }
}

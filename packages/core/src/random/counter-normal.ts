/**
 * Counter-based random numbers: sample k of a stream is a pure function of the stream's key and
 * k, so a noise source needs no memory of what it drew, any sample can be recomputed (a time
 * step that is retried shorter), and streams keyed by a part's name do not shift when parts are
 * added, removed or reordered.
 */

import { fmix32 } from "./mix.js";

/** A stream's key: two 32-bit words. */
export interface StreamKey {
  readonly k0: number;
  readonly k1: number;
}


// 32-bit FNV-1a over the UTF-16 code units of a name (Fowler, Noll, Vo; public domain).
function fnv1a(text: string, basis: number): number {
  let h = basis >>> 0;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

/** The key of the stream named `name` under `seed` (an integer, up to 2⁵³). */
export function streamKey(seed: number, name: string): StreamKey {
  const lo = seed >>> 0;
  const hi = Math.floor(seed / 2 ** 32) >>> 0;
  return {
    k0: fmix32(fnv1a(name, 0x811c9dc5) ^ fmix32(lo ^ 0x9e3779b9)),
    k1: fmix32(fnv1a(name, 0x6c62272e) ^ fmix32(hi ^ 0x7f4a7c15) ^ lo),
  };
}

// Word `lane` of the hash of (key, counter): two rounds of the finaliser, the first folding in
// one key word, the counter's low half and the lane, the second the other key word and the
// counter's high half.
function word(key: StreamKey, counter: number, lane: number): number {
  const lo = counter >>> 0;
  const hi = Math.floor(counter / 2 ** 32) >>> 0;
  const h = fmix32(key.k0 ^ lo ^ Math.imul(lane + 1, 0x9e3779b9));
  return fmix32(h ^ key.k1 ^ Math.imul(hi + 1, 0x85ebca77));
}

const TWO_POW_53 = 2 ** 53;
const TWO_PI_OVER_2_POW_32 = (2 * Math.PI) / 2 ** 32;

/**
 * Samples 2m and 2m + 1 of the standard normal stream `key` into `out[0]`, `out[1]`: the
 * Box–Muller pair √(−2 ln u₁)·(cos, sin)(2π u₂) of two uniforms drawn from the hash of
 * (key, m), u₁ ∈ (0, 1] with 53 random bits (so its logarithm is finite) (Box & Muller 1958).
 */
export function normalPairAt(key: StreamKey, m: number, out: Float64Array): void {
  const a = word(key, m, 0) >>> 5; // 27 bits
  const b = word(key, m, 1) >>> 6; // 26 bits
  const u1 = (a * 67108864 + b + 1) / TWO_POW_53;
  const angle = word(key, m, 2) * TWO_PI_OVER_2_POW_32;
  const r = Math.sqrt(-2 * Math.log(u1));
  out[0] = r * Math.cos(angle);
  out[1] = r * Math.sin(angle);
}

const pair = new Float64Array(2);

/** Sample `counter` (a whole number ≥ 0) of the standard normal stream `key`. */
export function normalAt(key: StreamKey, counter: number): number {
  normalPairAt(key, Math.floor(counter / 2), pair);
  return pair[counter % 2]!;
}

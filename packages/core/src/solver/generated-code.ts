/** Generated functions by their text; circuits of one topology (every Monte Carlo sample) share them. */
const cache = new Map<string, Function>();
/** Distinct texts kept; beyond it the cache starts over (a long session of unrelated circuits). */
const CACHE_LIMIT = 256;

/**
 * A function with the given parameters and body, compiled once per distinct text. Sharing the
 * function object also keeps the solver's call sites monomorphic from one run to the next.
 * Undefined where the host forbids generated code (the callers then keep their loops).
 */
export function generatedFunction<F extends Function>(parameters: readonly string[], body: string): F | undefined {
  const key = `${parameters.join(",")}\n${body}`;
  let f = cache.get(key);
  if (!f) {
    try {
      f = new Function(...parameters, body);
    } catch {
      return undefined;
    }
    if (cache.size >= CACHE_LIMIT) cache.clear();
    cache.set(key, f);
  }
  return f as F;
}

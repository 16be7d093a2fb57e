import { badArgument, describe } from "../circuit/arguments.js";

/** True for an array (typed or plain) of finite numbers. */
function finiteList(value: unknown): value is ArrayLike<number> {
  if (!(value instanceof Float64Array) && !Array.isArray(value)) return false;
  for (let i = 0; i < value.length; i++) if (!Number.isFinite(value[i])) return false;
  return true;
}

function failure(api: string, what: string, value: unknown) {
  return badArgument(`${api}: options.seed.${what}, got ${describe(value)}`);
}

/**
 * Checks an orbit seed handed to `runSteady` (`options.seed`, see `steadySeed`) at the door: an
 * object whose start `x` is a list of finite numbers. Plain data that may come from another
 * thread or a file; the rest is checked by {@link checkSeedGrid} once its size matches the circuit's.
 */
export function checkOrbitSeed(api: string, seed: unknown): void {
  if (typeof seed !== "object" || seed === null) throw badArgument(`${api}: options.seed must be an orbit seed (see steadySeed), got ${describe(seed)}`);
  const x = (seed as Record<string, unknown>).x;
  if (!finiteList(x) || x.length === 0) throw failure(api, "x must be a Float64Array of finite numbers", x);
}

/**
 * Checks the rest of a seed whose size matches the circuit's, before the shooting indexes into
 * it (a seed of another circuit's size is not used, and not checked further).
 */
export function checkSeedGrid(api: string, seed: { readonly x: ArrayLike<number> }): void {
  const fail = (what: string, value: unknown) => failure(api, what, value);
  const s = seed as unknown as Record<string, unknown>;
  const n = seed.x.length;
  if (!(typeof s.period === "number" && Number.isFinite(s.period) && s.period > 0)) throw fail("period must be a finite time above 0 s", s.period);
  if (!finiteList(s.fractions) || s.fractions.length === 0 || !Array.prototype.every.call(s.fractions, (f: number) => f > 0)) {
    throw fail("fractions must be a non-empty Float64Array of steps above 0 (fractions of the period)", s.fractions);
  }
  const points = s.fractions.length + 1;
  if (!Array.isArray(s.states) || s.states.length !== points || !s.states.every((x) => finiteList(x) && x.length === n)) {
    throw fail(`states must be ${points} arrays (one per grid point) of ${n} finite numbers`, s.states);
  }
  if (!finiteList(s.matrix) || (s.matrix.length !== 0 && s.matrix.length !== (n + 1) ** 2)) throw fail(`matrix must be empty or (${n} + 1)² finite numbers`, s.matrix);
  if (!(Number.isInteger(s.phase) && (s.phase as number) >= 0 && (s.phase as number) < n)) throw fail(`phase must be an unknown's index from 0 to ${n - 1}`, s.phase);
  // Infinity says the contraction is unknown (a study sample some of whose toleranced values got no slopes).
  if (s.contraction !== undefined && !(typeof s.contraction === "number" && s.contraction >= 0)) throw fail("contraction must be a number from 0 (Infinity allowed)", s.contraction);
}

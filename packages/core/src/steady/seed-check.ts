import { badArgument, describe } from "../circuit/arguments.js";

/** True for an array (typed or plain) of finite numbers. */
function finiteList(value: unknown): value is ArrayLike<number> {
  if (!(value instanceof Float64Array) && !Array.isArray(value)) return false;
  for (let i = 0; i < value.length; i++) if (!Number.isFinite(value[i])) return false;
  return true;
}

/**
 * Checks an orbit seed handed to `runSteady` (`options.seed`, see `steadySeed`): plain data that
 * may come from another thread or a file, so its shape is checked at the door before the
 * shooting indexes into it. A seed of another circuit's size is allowed (it is not used).
 */
export function checkOrbitSeed(api: string, seed: unknown): void {
  const fail = (what: string, value: unknown) => badArgument(`${api}: options.seed.${what}, got ${describe(value)}`);
  if (typeof seed !== "object" || seed === null) throw badArgument(`${api}: options.seed must be an orbit seed (see steadySeed), got ${describe(seed)}`);
  const s = seed as Record<string, unknown>;
  if (!finiteList(s.x) || s.x.length === 0) throw fail("x must be a Float64Array of finite numbers", s.x);
  const n = s.x.length;
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
  if (s.contraction !== undefined && !(typeof s.contraction === "number" && s.contraction >= 0 && Number.isFinite(s.contraction))) throw fail("contraction must be a finite number from 0", s.contraction);
}

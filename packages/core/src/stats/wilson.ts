import { badArgument, describe } from "../circuit/arguments.js";
/** The standard normal quantile for a two-sided 95 % interval, Φ⁻¹(0.975) (docs/references.md §6). */
export const Z95 = 1.959963984540054;

/** A closed interval [low, high]. */
export interface Interval {
  readonly low: number;
  readonly high: number;
}

/**
 * Wilson score interval for a binomial proportion (Wilson, JASA 22:209–212, 1927):
 * centre (p̂ + z²/2n)/(1 + z²/n), half-width z/(1 + z²/n)·√(p̂(1−p̂)/n + z²/4n²).
 */
export function wilsonInterval(successes: number, trials: number, z = Z95): Interval {
  if (!(Number.isSafeInteger(trials) && trials >= 0 && Number.isSafeInteger(successes) && successes >= 0 && successes <= trials)) {
    throw badArgument(`wilsonInterval: successes and trials must be whole numbers with 0 ≤ successes ≤ trials, got ${describe(successes)} of ${describe(trials)}`);
  }
  if (!(typeof z === "number" && z > 0 && Number.isFinite(z))) throw badArgument(`wilsonInterval: z must be a finite number above 0, got ${describe(z)}`);
  if (!(trials > 0)) return { low: 0, high: 1 };
  const p = successes / trials;
  const z2 = z * z;
  const denominator = 1 + z2 / trials;
  const centre = (p + z2 / (2 * trials)) / denominator;
  const half = (z / denominator) * Math.sqrt((p * (1 - p)) / trials + z2 / (4 * trials * trials));
  return { low: Math.max(0, centre - half), high: Math.min(1, centre + half) };
}

import { badArgument, describe } from "../circuit/arguments.js";
import type { ToleranceSpec } from "../circuit/circuit.js";
import { randomStream } from "../random/stream.js";

/** How a tolerance is drawn: `normal` (σ = tol/3, cut at ±tol) or `uniform` over ±tol. */
export type Distribution = "normal" | "uniform";

/**
 * The values one Monte Carlo sample draws for every tolerance, in file order. The stream
 * depends on (seed, index) alone, so a sample is the same whichever worker or shard runs it.
 * normal: σ = tol/3, truncated at ±tol by redrawing (common practice, no single source);
 * uniform: evenly over ±tol.
 */
export function drawSample(tolerances: readonly ToleranceSpec[], seed: number, index: number, dist: Distribution): Record<string, number> {
  if (!Array.isArray(tolerances) || !tolerances.every((t) => typeof t === "object" && t !== null && typeof t.target === "string" && Number.isFinite(t.nominal))) {
    throw badArgument("drawSample: tolerances must be an array of { target, nominal, relative | absolute }");
  }
  if (!Number.isSafeInteger(seed) || !Number.isSafeInteger(index) || index < 0) throw badArgument(`drawSample: seed and index must be whole numbers (index ≥ 0), got seed ${describe(seed)}, index ${describe(index)}`);
  if (dist !== "normal" && dist !== "uniform") throw badArgument(`drawSample: dist must be "normal" or "uniform", got ${describe(dist)}`);
  const stream = randomStream(seed, index);
  const drawn: Record<string, number> = {};
  for (const t of tolerances) {
    let unit: number;
    if (dist === "uniform") unit = 2 * stream.uniform() - 1;
    else {
      do unit = stream.normal() / 3;
      while (Math.abs(unit) > 1);
    }
    drawn[t.target] = t.relative !== undefined ? t.nominal * (1 + unit * t.relative) : t.nominal + unit * (t.absolute ?? 0);
  }
  return drawn;
}

import { generatedFunction } from "./generated-code.js";

/** r = M·x − history − u for a dense row-major M whose nonzeros lie in a fixed pattern. */
export type ResidualProduct = (matrix: Float64Array, x: Float64Array, history: Float64Array, u: Float64Array, r: Float64Array) => void;

/** Beyond this many pattern entries the product stays a loop (generated code would only grow). */
const MAX_ENTRIES = 20000;

/**
 * The linear part of the Newton residual as unrolled code over the pattern's entries (same
 * reasoning and the same safeguards as compiled-elimination.ts: built from integer positions
 * only; undefined when too large or when the host forbids generated code).
 */
export function compileResidual(n: number, pattern: Uint8Array): ResidualProduct | undefined {
  let count = 0;
  for (let k = 0; k < n * n; k++) if (pattern[k]) count++;
  if (count > MAX_ENTRIES) return undefined;
  const lines: string[] = ['"use strict";'];
  for (let i = 0; i < n; i++) {
    let line = `r[${i}] = -history[${i}] - u[${i}]`;
    for (let j = 0; j < n; j++) if (pattern[i * n + j]) line += ` + m[${i * n + j}] * x[${j}]`;
    lines.push(`${line};`);
  }
  return generatedFunction<ResidualProduct>(["m", "x", "history", "u", "r"], lines.join("\n"));
}

import { generatedFunction } from "./generated-code.js";

/** r = M·x − history − u for a sparse M given by its entry values (in the rows' order of the structure). */
export type ResidualProduct = (matrix: Float64Array, x: Float64Array, history: Float64Array, u: Float64Array, r: Float64Array) => void;

/** Beyond this many entries the product stays a loop (generated code would only grow). */
const MAX_ENTRIES = 1000;

/**
 * The linear part of the Newton residual as unrolled code over the structure's entries: row i's
 * entries are rowStart[i]..rowStart[i+1]−1, entry e in column cols[e] (same reasoning and the
 * same safeguards as compiled-elimination.ts: built from integer positions only; undefined when
 * too large or when the host forbids generated code).
 */
export function compileResidual(n: number, rowStart: Int32Array, cols: Int32Array): ResidualProduct | undefined {
  if (rowStart[n]! > MAX_ENTRIES) return undefined;
  const lines: string[] = ['"use strict";'];
  for (let i = 0; i < n; i++) {
    let line = `r[${i}] = -history[${i}] - u[${i}]`;
    for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) line += ` + m[${e}] * x[${cols[e]}]`;
    lines.push(`${line};`);
  }
  return generatedFunction<ResidualProduct>(["m", "x", "history", "u", "r"], lines.join("\n"));
}

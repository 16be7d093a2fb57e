import type { EliminationSchedule } from "./elimination-schedule.js";
import { generatedFunction } from "./generated-code.js";

/** Refactorisation and solve of one elimination schedule as straight-line code. */
export interface CompiledElimination {
  /** As SparseLu's refactor: false when a pivot fell below `keep` of its column or `tolerance` of its original column. */
  refactor(a: Float64Array, lu: Float64Array, keep: number, tolerance: number): boolean;
  /** x = sign·A⁻¹·b from the packed factors; `b` and `x` may be the same array. */
  solve(lu: Float64Array, b: Float64Array, x: Float64Array, sign: number): void;
}

/** Larger schedules stay with the loops: the generated code would grow without getting faster. */
const MAX_OPERATIONS = 1000;

/**
 * Generates the schedule's elimination and substitution as unrolled JavaScript (a small circuit's
 * factors have a few dozen nonzeros, so the loops' index loads and branches cost more than the
 * arithmetic). The code is built only from the schedule's integer positions, never from input
 * text, and performs the same floating-point operations in the same order as the loops, so the
 * results are bit-identical. Returns undefined for schedules above MAX_OPERATIONS, or where the
 * host forbids generated code.
 */
export function compileElimination(s: EliminationSchedule, n: number, rowOrder: Int32Array, colOrder: Int32Array): CompiledElimination | undefined {
  const operations = s.entries + s.slots + s.columnAt.length + s.lowerAt.length + s.operations + s.rowLowerAt.length + s.upperAt.length;
  if (operations > MAX_OPERATIONS) return undefined;
  const f: string[] = ['"use strict";', "let p, q, m, v, below, original;"];
  for (let e = 0; e < s.entries; e++) f.push(`lu[${e}] = a[${e}];`);
  for (let e = s.entries; e < s.slots; e++) f.push(`lu[${e}] = 0;`);
  let t = 0;
  for (let k = 0; k < n; k++) {
    f.push(`p = lu[${s.pivotAt[k]}]; q = Math.abs(p); below = 0; original = 0;`);
    for (let e = s.lowerStart[k]!; e < s.lowerStart[k + 1]!; e++) f.push(`v = Math.abs(lu[${s.lowerAt[e]}]); if (v > below) below = v;`);
    for (let e = s.columnStart[k]!; e < s.columnStart[k + 1]!; e++) f.push(`v = Math.abs(a[${s.columnAt[e]}]); if (v > original) original = v;`);
    f.push("if (!(q >= keep * below) || !(q > tolerance * original)) return false;");
    for (let e = s.lowerStart[k]!; e < s.lowerStart[k + 1]!; e++) {
      const ik = s.lowerAt[e]!;
      f.push(`m = lu[${ik}] / p; lu[${ik}] = m;`);
      // No skip when m is 0: a branch that warm-up never takes would cost a deoptimisation later.
      for (let u = s.upperStart[k]!; u < s.upperStart[k + 1]!; u++) f.push(`lu[${s.updateAt[t++]}] -= m * lu[${s.upperAt[u]}];`);
    }
  }
  f.push("return true;");
  const g: string[] = ['"use strict";'];
  for (let i = 0; i < n; i++) {
    let line = `let y${i} = b[${rowOrder[i]}]`;
    for (let e = s.rowLowerStart[i]!; e < s.rowLowerStart[i + 1]!; e++) line += ` - lu[${s.rowLowerAt[e]}] * y${s.rowLowerCol[e]}`;
    g.push(`${line};`);
  }
  for (let i = n - 1; i >= 0; i--) {
    let line = `y${i} = (y${i}`;
    for (let u = s.upperStart[i]!; u < s.upperStart[i + 1]!; u++) line += ` - lu[${s.upperAt[u]}] * y${s.upperCol[u]}`;
    g.push(`${line}) / lu[${s.pivotAt[i]}];`);
  }
  for (let j = 0; j < n; j++) g.push(`x[${colOrder[j]}] = sign * y${j};`);
  // Built from integers only (see above).
  const refactor = generatedFunction<CompiledElimination["refactor"]>(["a", "lu", "keep", "tolerance"], f.join("\n"));
  const solve = generatedFunction<CompiledElimination["solve"]>(["lu", "b", "x", "sign"], g.join("\n"));
  return refactor && solve ? { refactor, solve } : undefined;
}

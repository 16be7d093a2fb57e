import type { LinearStamp, NonlinearLoad } from "./device.js";

/** A conductance `g` between nodes a and b (either may be ground, -1). */
export function stampConductance(s: LinearStamp, a: number, b: number, g: number): void {
  s.addG(a, a, g);
  s.addG(b, b, g);
  s.addG(a, b, -g);
  s.addG(b, a, -g);
}

/** A nonlinear branch from node a to node b: its current `i` (a → b) and its conductance `g` = ∂i/∂v(a, b). */
export function stampNonlinearBranch(out: NonlinearLoad, a: number, b: number, i: number, g: number): void {
  out.addF(a, i);
  out.addF(b, -i);
  out.adddF(a, a, g);
  out.adddF(a, b, -g);
  out.adddF(b, a, -g);
  out.adddF(b, b, g);
}

/** A capacitance `c` between nodes a and b. */
export function stampCapacitance(s: LinearStamp, a: number, b: number, c: number): void {
  s.addC(a, a, c);
  s.addC(b, b, c);
  s.addC(a, b, -c);
  s.addC(b, a, -c);
}

/** A current g·(v(cp) − v(cn)) leaving node `op` and entering node `on`. */
export function stampTransconductance(s: LinearStamp, op: number, on: number, cp: number, cn: number, g: number): void {
  s.addG(op, cp, g);
  s.addG(op, cn, -g);
  s.addG(on, cp, -g);
  s.addG(on, cn, g);
}

/** A branch current unknown `k` flowing from node a to node b (KCL rows) and v(a) − v(b) in row k. */
export function stampBranch(s: LinearStamp, a: number, b: number, k: number): void {
  s.addG(a, k, 1);
  s.addG(b, k, -1);
  s.addG(k, a, 1);
  s.addG(k, b, -1);
}

/** The value of unknown `i` in `x`; ground (-1) reads 0 V. */
export function valueAt(x: Float64Array, i: number): number {
  return i >= 0 ? x[i]! : 0;
}

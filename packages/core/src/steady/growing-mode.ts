import type { SmallSignal } from "../analyses/linearize.js";
import type { Pole } from "../analyses/poles.js";
import { fillPhasorMatrix, phasorPattern } from "../analyses/phasor-matrix.js";
import { LuSolver } from "../solver/lu.js";
import type { UnknownInfo } from "../solver/system.js";

/**
 * Shifts of inverse iteration from the pole, relative to |s|, tried in turn: near enough to
 * converge in a few solves, far enough that the pencil is not singular to the LU's pivot test.
 * A near-ideal amplifier (open-loop gain 1e7) makes the pencil that much worse conditioned, so
 * 1e-7 off the pole its pivots fall below the test; 1e-3 still gains a factor of about
 * 1e-3·|s| / (distance to the next pole) per solve.
 */
const SHIFTS = [1e-7, 1e-5, 1e-3];
/** Inverse-iteration solves. */
const SOLVES = 4;
/** The golden ratio's fractional part: k·GOLDEN mod 1 spreads the second start vector's entries evenly, none equal. */
const GOLDEN = 0.6180339887498949;
/**
 * From this many unknowns on (where the shooting goes matrix-free too) the real form is
 * factored on its sparsity pattern: dense, its O(8n³) elimination took 13 s of a 2010-unknown
 * ladder's steady analysis, with no limit checked inside.
 */
const SPARSE_FROM = 60;

/**
 * The natural mode of a pole: a real vector v with (G + s·C)·(v + j·w) = 0 for some w, rotated
 * so that its largest entry is real (its peak); the circuit started at bias + k·v rings (or
 * grows) in that mode alone. Inverse iteration (Golub & Van Loan, *Matrix Computations*, §7.6.1)
 * on the real form of the complex pencil, [[G + σC, −ωC], [ωC, G + σC]], shifted a little off
 * the pole. Null when the pencil cannot be factored at any of the shifts.
 */
export function modeOfPole(ss: SmallSignal, pole: Pole): Float64Array | null {
  const m = 2 * ss.n;
  // Every charged direction at once; where that lies in C's null space (every capacitor between
  // two nodes, none to ground: a C–R ladder driven by an ideal source), a spread of unequal entries.
  const starts = [new Float64Array(m).fill(1), Float64Array.from({ length: m }, (_, k) => 1 + ((k * GOLDEN) % 1))];
  for (const shift of SHIFTS) {
    for (const start of starts) {
      const mode = shiftedInverseIteration(ss, pole, shift, start);
      if (mode === undefined) break;
      if (mode !== null) return mode;
    }
  }
  return null;
}

/**
 * The node voltage a mode swings most (the first unknown when there is no node): watched, it
 * swings at the oscillation's period whatever the probe is, in a unit the step control holds.
 */
export function largestNode(mode: Float64Array, unknowns: readonly UnknownInfo[]): number {
  let top = -1;
  for (let i = 0; i < mode.length; i++) if (unknowns[i]!.isNode && (top < 0 || Math.abs(mode[i]!) > Math.abs(mode[top]!))) top = i;
  return Math.max(top, 0);
}

/** The mode by inverse iteration at `shift` (relative to |s|) off the pole from `start`; undefined when the pencil does not factor there, null when the iterate vanishes (the start in C's null space). */
function shiftedInverseIteration(ss: SmallSignal, pole: Pole, shift: number, start: Float64Array): Float64Array | null | undefined {
  const { n, C } = ss;
  const m = 2 * n;
  const sigma = pole.real + shift * Math.hypot(pole.real, pole.imag, 1);
  const omega = pole.imag;
  const a = new Float64Array(m * m);
  fillPhasorMatrix(ss, omega, a, false, sigma);
  const lu = new LuSolver(m, { compile: false });
  if (n >= SPARSE_FROM) lu.setPattern(phasorPattern(ss, false));
  if (!lu.factor(a)) return undefined;
  // C·y keeps the algebraic unknowns out of the right-hand side.
  let y = start;
  const rhs = new Float64Array(m);
  for (let solve = 0; solve < SOLVES; solve++) {
    for (let i = 0; i < n; i++) {
      let re = 0;
      let im = 0;
      for (let j = 0; j < n; j++) {
        re += C[i * n + j]! * y[j]!;
        im += C[i * n + j]! * y[j + n]!;
      }
      rhs[i] = re;
      rhs[i + n] = im;
    }
    const next = new Float64Array(m);
    lu.solve(rhs, next);
    let peak = 0;
    for (let k = 0; k < m; k++) peak = Math.max(peak, Math.abs(next[k]!));
    if (!(peak > 0) || !Number.isFinite(peak)) return null;
    for (let k = 0; k < m; k++) next[k] = next[k]! / peak;
    y = next;
  }
  // Rotate by the conjugate phase of the largest entry.
  let top = 0;
  for (let i = 1; i < n; i++) if (Math.hypot(y[i]!, y[i + n]!) > Math.hypot(y[top]!, y[top + n]!)) top = i;
  const size = Math.hypot(y[top]!, y[top + n]!);
  const c = y[top]! / size;
  const s = -y[top + n]! / size;
  return Float64Array.from({ length: n }, (_, i) => y[i]! * c - y[i + n]! * s);
}

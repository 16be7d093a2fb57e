import type { NoiseGenerator } from "../devices/device.js";
import { LuSolver } from "../solver/lu.js";
import { ComplexLu } from "../solver/complex-lu.js";
import type { SmallSignal } from "./linearize.js";
import { fillPhasorMatrix } from "./phasor-matrix.js";
import type { Pole } from "./poles.js";
import type { ProbeWeights } from "./probes.js";

// Catmull–Rom kernel φ on [−2, 2] (the noise streams' interpolation, see waves/smooth-noise.ts).
function kernel(x: number): number {
  const a = Math.abs(x);
  if (a < 1) return 1.5 * a ** 3 - 2.5 * a ** 2 + 1;
  if (a < 2) return -0.5 * a ** 3 + 2.5 * a ** 2 - 4 * a + 2;
  return 0;
}

/** |Φ(f)/Φ(0)|² of the kernel at f = r·corner, tabulated for r ∈ [0, 2] (Φ vanishes beyond). */
const SHAPE_POINTS = 256;
/** Built on first use (some 10 ms of cosines), not when the library is imported. */
let shapeTable: Float64Array | undefined;
function buildShapeTable(): Float64Array {
  const table = new Float64Array(SHAPE_POINTS + 1);
  const n = 2048;
  // The kernel at the midpoints, the same for every frequency.
  const xs = new Float64Array(n);
  const weights = new Float64Array(n);
  for (let m = 0; m < n; m++) {
    xs[m] = -2 + (4 * (m + 0.5)) / n;
    weights[m] = kernel(xs[m]!);
  }
  for (let i = 0; i <= SHAPE_POINTS; i++) {
    // Samples 1/(2·corner) apart: f = r·corner is r/2 cycles per sample interval.
    const cycles = (2 * i) / SHAPE_POINTS / 2;
    let sum = 0;
    for (let m = 0; m < n; m++) sum += weights[m]! * Math.cos(2 * Math.PI * cycles * xs[m]!);
    table[i] = ((sum * 4) / n) ** 2;
  }
  return table;
}

/** The noise streams' spectral shape at frequency f: 1 at DC, 0.9996 at corner/10, 0 from 2·corner. */
export function noiseShape(f: number, corner: number): number {
  const r = (f / corner) * (SHAPE_POINTS / 2);
  if (!(r < SHAPE_POINTS)) return 0;
  const i = Math.floor(r);
  const u = r - i;
  const table = (shapeTable ??= buildShapeTable());
  return table[i]! * (1 - u) + table[i + 1]! * u;
}

/** Log-spaced points per decade of the band. */
const PER_DECADE = 20;
/** 10^(k/PER_DECADE), computed once each (every sample's grid has them). */
const decadeSteps: number[] = [];
function decadeStep(k: number): number {
  return (decadeSteps[k] ??= 10 ** (k / PER_DECADE));
}
/** sinh(0.2·k) for k = −20…20: a resonance's points in half-widths from its centre. */
const RESONANCE_STEPS = Float64Array.from({ length: 41 }, (_, i) => Math.sinh(0.2 * (i - 20)));

/** Frequencies to integrate over: log-spaced over the band, dense around every resonance in it. */
function frequencyGrid(corner: number, poles: readonly Pole[]): Float64Array {
  const top = 2 * corner;
  // Below a ten-thousandth of the band the response is flat enough for one trapezoid from DC.
  const bottom = top * 1e-4;
  const points: number[] = [0];
  const decades = Math.log10(top / bottom);
  for (let k = 0; k <= decades * PER_DECADE; k++) points.push(bottom * decadeStep(k));
  for (const p of poles) {
    const f = Math.abs(p.imag) / (2 * Math.PI);
    if (!(p.imag > 0 && f < top)) continue;
    // A resonance of half-width |σ|/2π: points at sinh-spaced multiples of it, out to ±30 widths.
    const width = Math.max(Math.abs(p.real) / (2 * Math.PI), f * 1e-9);
    for (let k = 0; k < RESONANCE_STEPS.length; k++) points.push(f + width * RESONANCE_STEPS[k]!);
  }
  const sorted = Float64Array.from(points.filter((f) => f >= 0 && f <= top)).sort();
  return sorted.filter((f, i) => i === 0 || f > sorted[i - 1]!);
}

/**
 * The r.m.s. level at a probe due to independent white noise generators, through the circuit
 * linearised at its bias point: √(Σ_g N_g ∫ |H_g(f)|²·shape(f) df) over the streams' band,
 * where H_g is the probe's response to generator g's injection (mathematics: the output
 * spectrum of a linear system driven by uncorrelated inputs is Σ |H_g|²·S_g; Parseval).
 *
 * All H_g at one frequency come from one solve of the transposed (adjoint) system
 * (G + jωC)ᵀ·y = p, H_g = yᵀ·b_g, where p is the probe's phasor weights. For a circuit whose
 * poles lie in the right half-plane, |H(jω)| is still finite; the result is then the level its
 * mirror-image stable circuit would reach, which is also the level an exponentially growing
 * oscillation starts from (the variance ∫₀^∞ e^(−2σt)·N dt of the noise its mode collects).
 */
export function noiseLevel(ss: SmallSignal, probe: ProbeWeights, generators: readonly NoiseGenerator[], corner: number, poles: readonly Pole[]): number {
  const { n } = ss;
  if (generators.length === 0 || n === 0) return 0;
  const solve = n > DENSE_UNKNOWNS ? sparseAdjoint(ss) : denseAdjoint(ss);
  const yRe = new Float64Array(n);
  const yIm = new Float64Array(n);
  const rate = new Float64Array(n);
  const grid = frequencyGrid(corner, poles);
  const power = new Float64Array(grid.length);
  for (let k = 0; k < grid.length; k++) {
    const f = grid[k]!;
    const omega = 2 * Math.PI * f;
    for (let i = 0; i < n; i++) rate[i] = omega * probe.rate[i]!;
    if (!solve(omega, probe.value, rate, yRe, yIm)) {
      power[k] = Number.NaN;
      continue;
    }
    let sum = 0;
    for (const g of generators) {
      let re = 0;
      let im = 0;
      if (g.to >= 0) {
        re += g.gain * yRe[g.to]!;
        im += g.gain * yIm[g.to]!;
      }
      if (g.from >= 0) {
        re -= g.gain * yRe[g.from]!;
        im -= g.gain * yIm[g.from]!;
      }
      sum += g.density * (re * re + im * im);
    }
    power[k] = sum * noiseShape(f, corner);
  }
  // Trapezoidal rule over the grid; a frequency where the circuit is singular is left out.
  let total = 0;
  for (let k = 1; k < grid.length; k++) {
    const a = power[k - 1]!;
    const b = power[k]!;
    if (Number.isFinite(a) && Number.isFinite(b)) total += 0.5 * (a + b) * (grid[k]! - grid[k - 1]!);
  }
  return Math.sqrt(total);
}

/**
 * Up to this many unknowns (G + jωC)ᵀ is factored dense in complex arithmetic: ordering its real
 * form sparse afresh at every call costs more than the sparse solves save (measured on the
 * examples, n = 6…14: the real form dense was already twice as fast, the complex form halves
 * that again). A large circuit's hundreds of solves stay sparse.
 */
const DENSE_UNKNOWNS = 16;

/** Solves (G + jωC)ᵀ·y = b (parts apart); false when the matrix is singular at ω. */
type AdjointSolve = (omega: number, bRe: Float64Array, bIm: Float64Array, yRe: Float64Array, yIm: Float64Array) => boolean;

function denseAdjoint(ss: SmallSignal): AdjointSolve {
  const { n, G, C } = ss;
  const lu = new ComplexLu(n);
  // Gᵀ and Cᵀ once: only ω changes from one frequency to the next.
  const gT = new Float64Array(n * n);
  const cT = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      gT[i * n + j] = G[j * n + i]!;
      cT[i * n + j] = C[j * n + i]!;
    }
  }
  return (omega, bRe, bIm, yRe, yIm) => {
    lu.re.set(gT);
    const im = lu.im;
    for (let k = 0; k < cT.length; k++) im[k] = omega * cT[k]!;
    if (!lu.factor()) return false;
    lu.solve(bRe, bIm, yRe, yIm);
    return true;
  };
}

/** The real form [[A, −B], [B, A]] of (G + jωC)ᵀ, factored sparse on its fixed pattern. */
function sparseAdjoint(ss: SmallSignal): AdjointSolve {
  const { n } = ss;
  const n2 = 2 * n;
  const lu = new LuSolver(n2, { compile: false });
  lu.setPattern(sparsityOf(ss));
  const m = new Float64Array(n2 * n2);
  const rhs = new Float64Array(n2);
  const y = new Float64Array(n2);
  return (omega, bRe, bIm, yRe, yIm) => {
    fillPhasorMatrix(ss, omega, m, true);
    rhs.set(bRe);
    rhs.set(bIm, n);
    if (!lu.factor(m)) return false;
    lu.solve(rhs, y);
    yRe.set(y.subarray(0, n));
    yIm.set(y.subarray(n));
    return true;
  };
}

/** The nonzeros of the real form of (G + jωC)ᵀ, the same at every frequency. */
function sparsityOf(ss: SmallSignal): Uint8Array {
  const { n, G, C } = ss;
  const n2 = 2 * n;
  const pattern = new Uint8Array(n2 * n2);
  for (let i = 0; i < n; i++) {
    pattern[i * n2 + i] = 1;
    pattern[(n + i) * n2 + n + i] = 1;
    for (let j = 0; j < n; j++) {
      if (G[j * n + i] !== 0 || C[j * n + i] !== 0) {
        pattern[i * n2 + j] = 1;
        pattern[i * n2 + n + j] = 1;
        pattern[(n + i) * n2 + j] = 1;
        pattern[(n + i) * n2 + n + j] = 1;
      }
    }
  }
  return pattern;
}

import type { NoiseGenerator } from "../devices/device.js";
import { LuSolver } from "../solver/lu.js";
import { ComplexLu } from "../solver/complex-lu.js";
import type { SmallSignal } from "./linearize.js";
import { fillPhasorMatrix, phasorPattern } from "./phasor-matrix.js";
import type { Pole } from "./poles.js";
import type { ProbeWeights } from "./probes.js";

/** sin(πx)/(πx). */
function sinc(x: number): number {
  if (x === 0) return 1;
  const a = Math.PI * x;
  return Math.sin(a) / a;
}

/**
 * Below this many cycles per sample interval the closed form's terms cancel (to some 1e-13 here);
 * Φ's Taylor series takes over: Σ (−1)ᵏ·ω²ᵏ·M₂ₖ/(2k)!, ω = 2πν, with the kernel's moments
 * M₀ = 1, M₂ = 0, M₄ = −3/10, M₆ = −17/21, M₈ = −31/15 (mathematics: the integrals of its cubic
 * pieces), truncated after ω⁸ (the next term is below 2e-15 here).
 */
const SERIES_CYCLES = 0.02;
/**
 * Φ(ν)/Φ(0), the Fourier transform of the noise streams' Catmull–Rom kernel (see
 * waves/smooth-noise.ts; Keys' cubic convolution kernel with a = −1/2) at ν cycles per sample
 * interval, in closed form: 3/(πν)²·(sinc²ν − sinc 2ν) + 2a/(πν)²·(3·sinc²2ν − 2·sinc 2ν − sinc 4ν)
 * (Park & Schowengerdt 1983, docs/references.md §9; checked in the tests against the Fourier
 * integral by quadrature).
 */
function kernelTransform(nu: number): number {
  if (nu < SERIES_CYCLES) {
    const w2 = (2 * Math.PI * nu) ** 2;
    return 1 - (w2 * w2) / 80 + (17 * w2 ** 3) / 15120 - (31 * w2 ** 4) / 604800;
  }
  const p = (Math.PI * nu) ** 2;
  const s2 = sinc(2 * nu);
  return (3 / p) * (sinc(nu) ** 2 - s2) - (1 / p) * (3 * s2 ** 2 - 2 * s2 - sinc(4 * nu));
}

/**
 * The noise streams' spectral shape at frequency f: |Φ|² of their kernel, the samples being
 * 1/(2·corner) apart (f is f/(2·corner) cycles per sample interval): 1 at DC, 0.9996 at corner/10,
 * and 0 from 2·corner, the top of the band (the kernel's sidelobes beyond it stay below 7e-5 of the power at DC).
 */
export function noiseShape(f: number, corner: number): number {
  const nu = f / (2 * corner);
  if (!(nu < 1)) return 0;
  return kernelTransform(nu) ** 2;
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
 * `check` (a run's limits) is called at every frequency: each costs O(n²) at least, seconds in
 * all at a thousand unknowns.
 */
export function noiseLevel(ss: SmallSignal, probe: ProbeWeights, generators: readonly NoiseGenerator[], corner: number, poles: readonly Pole[], check?: () => void): number {
  const { n } = ss;
  if (generators.length === 0 || n === 0) return 0;
  const solve = n > DENSE_UNKNOWNS ? sparseAdjoint(ss) : denseAdjoint(ss);
  const yRe = new Float64Array(n);
  const yIm = new Float64Array(n);
  const rate = new Float64Array(n);
  const grid = frequencyGrid(corner, poles);
  const power = new Float64Array(grid.length);
  for (let k = 0; k < grid.length; k++) {
    check?.();
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
  lu.setPattern(phasorPattern(ss, true));
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

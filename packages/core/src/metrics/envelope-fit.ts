import { leastSquares3 } from "./least-squares3.js";
import { resampleUniform } from "./resample.js";

/**
 * A least-squares fit of samples e(t) to the response of a second-order linear system about a
 * final level: `level + e^(−decayRate·τ)·(c·cos ωτ + s·sin ωτ)` (a bouncing envelope,
 * complex poles) or `level + a·e^(−λ₁τ) + b·e^(−λ₂τ)` (two real poles: a creep), τ = t − from.
 */
export type EnvelopeFit =
  | {
      readonly kind: "bounce";
      readonly from: number;
      readonly level: number;
      /** 1/s; negative when the bounce grows. */
      readonly decayRate: number;
      /** rad/s. */
      readonly angularFrequency: number;
      readonly cosine: number;
      readonly sine: number;
      /** Residual sum of squares over that of the samples about their mean. */
      readonly unexplained: number;
    }
  | {
      readonly kind: "creep";
      readonly from: number;
      readonly level: number;
      /** 1/s, λ₁ ≤ λ₂. */
      readonly rates: readonly [number, number];
      readonly weights: readonly [number, number];
      readonly unexplained: number;
    };

/** The fitted model at time t. */
export function envelopeFitAt(fit: EnvelopeFit, t: number): number {
  const tau = t - fit.from;
  if (fit.kind === "bounce") {
    const w = fit.angularFrequency * tau;
    return fit.level + Math.exp(-fit.decayRate * tau) * (fit.cosine * Math.cos(w) + fit.sine * Math.sin(w));
  }
  return fit.level + fit.weights[0] * Math.exp(-fit.rates[0] * tau) + fit.weights[1] * Math.exp(-fit.rates[1] * tau);
}

/**
 * The most the fitted model can still move away from its level after time t: the bounce's
 * amplitude there, or the creep's remaining terms.
 */
export function envelopeFitRemaining(fit: EnvelopeFit, t: number): number {
  const tau = t - fit.from;
  if (fit.kind === "bounce") return Math.hypot(fit.cosine, fit.sine) * Math.exp(-fit.decayRate * tau);
  return Math.abs(fit.weights[0]) * Math.exp(-fit.rates[0] * tau) + Math.abs(fit.weights[1]) * Math.exp(-fit.rates[1] * tau);
}

/** Points of the uniform grid the window is fitted on, at most… */
const GRID_POINTS = 512;
/** …and searched on coarsely, at most (the bounce then has at least four points a period). */
const COARSE_POINTS = 256;
/** Rounds of the zoom at most, and how many times it shrinks the box threefold before it stops. */
const ZOOM_ROUNDS = 60;
const ZOOM_SHRINKS = 14;
const ZOOM_SIDE = 5;

/** The window on a uniform grid τ_j = j/(m − 1) over [0, 1], and scratch for the basis columns. */
interface Samples {
  readonly e: Float64Array;
  readonly b1: Float64Array;
  readonly b2: Float64Array;
  readonly coefficients: Float64Array;
}

// The local cubic through the envelope's samples (cycle mid-times, nearly uniform already) on a
// uniform grid, where the basis follows from one complex rotation a step.
function samplesOf(t: Float64Array, e: Float64Array, from: number, to: number, most: number): Samples {
  const m = Math.min(to - from, most);
  const values = new Float64Array(m);
  const span = t[to - 1] - t[from];
  if (to - from >= 4) resampleUniform(t.subarray(from, to), e.subarray(from, to), t[from], span / (m - 1), values);
  else values.set(e.subarray(from, to));
  return { e: values, b1: new Float64Array(m), b2: new Float64Array(m), coefficients: new Float64Array(3) };
}

// The residual sum of squares of the best level + x·b1 + y·b2 for given nonlinear parameters
// (variable projection: the linear coefficients are solved for, only the rates are searched).
function bounceResidual(s: Samples, sigma: number, omega: number): number {
  const m = s.e.length;
  const step = 1 / (m - 1);
  const decay = Math.exp(-sigma * step);
  const c = decay * Math.cos(omega * step);
  const d = decay * Math.sin(omega * step);
  let re = 1;
  let im = 0;
  for (let j = 0; j < m; j++) {
    s.b1[j] = re;
    s.b2[j] = im;
    const next = re * c - im * d;
    im = re * d + im * c;
    re = next;
  }
  return leastSquares3(s.e, s.b1, s.b2, s.coefficients);
}

function creepResidual(s: Samples, slow: number, fast: number): number {
  const m = s.e.length;
  const a = Math.exp(-slow / (m - 1));
  const b = Math.exp(-fast / (m - 1));
  let x = 1;
  let y = 1;
  for (let j = 0; j < m; j++) {
    s.b1[j] = x;
    s.b2[j] = y;
    x *= a;
    y *= b;
  }
  return leastSquares3(s.e, s.b1, s.b2, s.coefficients);
}

/** A search box in two parameters, each sampled at `side` points. */
interface Box {
  x: number;
  y: number;
  dx: number;
  dy: number;
}

/**
 * Minimises `cost(x, y)` by a coarse grid (`xs` × `ys`, pairs refused by `allowed` skipped) on
 * the coarse samples, then a zoom about its best point on the full ones.
 */
function search(
  coarse: Samples,
  full: Samples,
  cost: (s: Samples, x: number, y: number) => number,
  xs: readonly number[],
  ys: readonly number[],
  allowed: (x: number, y: number) => boolean,
): { x: number; y: number; cost: number } {
  let best = { x: xs[0]!, y: ys[0]!, cost: Infinity };
  for (const x of xs) {
    for (const y of ys) {
      if (!allowed(x, y)) continue;
      const c = cost(coarse, x, y);
      if (c < best.cost) best = { x, y, cost: c };
    }
  }
  const box: Box = { x: best.x, y: best.y, dx: spacingAt(xs, best.x), dy: spacingAt(ys, best.y) };
  best = { ...best, cost: cost(full, best.x, best.y) };
  // A pattern search: the box moves to its best point and shrinks only when its centre is best,
  // so it follows a long, slanted valley (a heavily damped bounce trades rate for frequency).
  for (let round = 0, shrinks = 0; round < ZOOM_ROUNDS && shrinks < ZOOM_SHRINKS; round++) {
    const cx = box.x;
    const cy = box.y;
    for (let i = 0; i < ZOOM_SIDE; i++) {
      for (let j = 0; j < ZOOM_SIDE; j++) {
        const x = cx + ((i - (ZOOM_SIDE - 1) / 2) * box.dx * 2) / (ZOOM_SIDE - 1);
        const y = cy + ((j - (ZOOM_SIDE - 1) / 2) * box.dy * 2) / (ZOOM_SIDE - 1);
        if (!allowed(x, y)) continue;
        const c = cost(full, x, y);
        if (c < best.cost) best = { x, y, cost: c };
      }
    }
    if (best.x === cx && best.y === cy) {
      box.dx /= 3;
      box.dy /= 3;
      shrinks++;
    }
    box.x = best.x;
    box.y = best.y;
  }
  return best;
}

function spacingAt(grid: readonly number[], value: number): number {
  const i = grid.indexOf(value);
  const left = i > 0 ? value - grid[i - 1]! : Infinity;
  const right = i < grid.length - 1 ? grid[i + 1]! - value : Infinity;
  const d = Math.min(left, right);
  return Number.isFinite(d) ? d : 1;
}

/** Decay rates per window searched: a sinh-spaced grid from slight growth to decay within two samples. */
function rateGrid(points: number): number[] {
  const top = Math.asinh(Math.max(20, points / 2));
  const rates: number[] = [];
  for (let i = 0; i <= 40; i++) rates.push(2 * Math.sinh(-top / 4 + ((top + top / 4) * i) / 40));
  return rates;
}

/** Relative spacing of the coarse bounce frequencies: finer than the dip of a lightly damped bounce. */
const OMEGA_SPACING = 0.06;

/** Bounce frequencies per window searched (rad): from a quarter period in the window to four samples a period. */
function frequencyGrid(points: number): number[] {
  const lo = Math.log(Math.PI / 2);
  const hi = Math.log((Math.PI * points) / 2);
  const omegas: number[] = [];
  const count = Math.ceil((hi - lo) / OMEGA_SPACING);
  for (let i = 0; i <= count; i++) omegas.push(Math.exp(lo + ((hi - lo) * i) / count));
  return omegas;
}

/**
 * Fits samples `from … to − 1` of (t, e) both ways — a bounce (complex poles) and a creep (two
 * real poles) — and returns both fits. Each is found by variable projection: the level and the
 * two weights are solved for by least squares, the two rates by a grid over the window and a
 * zoom about its best point, so no starting guess is needed and the global minimum of the grid
 * is refined. Needs at least 6 samples.
 */
export function fitSecondOrder(t: Float64Array, e: Float64Array, from: number, to: number): { bounce: EnvelopeFit; creep: EnvelopeFit } {
  const span = t[to - 1] - t[from];
  const full = samplesOf(t, e, from, to, GRID_POINTS);
  const coarse = samplesOf(t, e, from, to, COARSE_POINTS);
  const points = coarse.e.length;
  let mean = 0;
  for (let j = 0; j < full.e.length; j++) mean += full.e[j] / full.e.length;
  let total = 0;
  for (let j = 0; j < full.e.length; j++) total += (full.e[j] - mean) ** 2;
  const unexplained = (rss: number) => (total > 0 ? rss / total : 0);

  const rates = rateGrid(points);
  const omegas = frequencyGrid(points);
  const b = search(coarse, full, (s, sigma, lnOmega) => bounceResidual(s, sigma, Math.exp(lnOmega)), rates, omegas.map(Math.log), () => true);
  bounceResidual(full, b.x, Math.exp(b.y));
  const bounce: EnvelopeFit = {
    kind: "bounce",
    from: t[from],
    level: full.coefficients[0],
    decayRate: b.x / span,
    angularFrequency: Math.exp(b.y) / span,
    cosine: full.coefficients[1],
    sine: full.coefficients[2],
    unexplained: unexplained(b.cost),
  };
  const c = search(coarse, full, creepResidual, rates, rates, (slow, fast) => fast > slow);
  creepResidual(full, c.x, c.y);
  const creep: EnvelopeFit = {
    kind: "creep",
    from: t[from],
    level: full.coefficients[0],
    rates: [c.x / span, c.y / span],
    weights: [full.coefficients[1], full.coefficients[2]],
    unexplained: unexplained(c.cost),
  };
  return { bounce, creep };
}

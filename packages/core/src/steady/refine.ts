import { TransientStepper, type StepperSnapshot } from "../analyses/stepper.js";
import type { ProbeReader } from "../analyses/probes.js";
import type { SteppingRun } from "../analyses/limits.js";
import { harmonicList } from "../metrics/spectrum.js";
import type { MnaSystem } from "../solver/system.js";
import type { Tolerances } from "../solver/tolerances.js";
import { cornerIntegralBounds } from "./corner-integrals.js";
import { orbitFigures, type OrbitExtremes, type OrbitMetrics } from "./orbit-metrics.js";
import { orbitMultipliers, shootOrbit, type Multiplier, type PeriodicOrbit, type ShootingJacobian } from "./shooting.js";
import type { PeriodStart } from "./periodic-map.js";
import { projectedMultipliers } from "./projected-multipliers.js";

/** A last step shorter than this fraction of the one before it is merged into it (it only landed on T). */
const SLIVER = 0.25;

/** Estimated numerical error of each settled figure: absolute, in the figure's own unit. */
export interface NumericalError {
  readonly frequency: number;
  readonly amplitude: number;
  readonly rms: number;
  /** NaN (null in JSON) where there is no THD: a driven orbit without a fundamental. */
  readonly thd: number;
}

/** Settled figures from the periodic orbit, extrapolated in the step, with their error bars. */
export interface RefinedOrbit extends OrbitMetrics {
  readonly numericalError: NumericalError;
  /** The orbit on the finer grid, and the shooting's Newton matrix there. */
  readonly orbit: PeriodicOrbit & { readonly jacobian: ShootingJacobian };
  /** Grid points per period: the run's own, and halved. */
  readonly points: readonly [number, number];
  /** Shooting iterations on each grid. */
  readonly iterations: readonly [number, number];
  /**
   * The Floquet multipliers on the halved grid, beside the run's own grid's in `orbit` (which the
   * figures report): their difference bounds the latter's error (see `multiplierBars`). The
   * lasting ones only where they come by projection (see `projectedMultipliers`). Empty unless
   * the multipliers were asked for.
   */
  readonly finerMultipliers: readonly Multiplier[];
}

/** Why an orbit's grid is coarser than the run's steps, and how to keep them all. */
export function mergedGridNote(merged: number, maxStoredPoints: number): string {
  return `the orbit's grid merges every ${merged} of the run's steps: stored-points=${maxStoredPoints} bounds its memory (raise it with --limit stored-points=N, or maxStoredPoints)`;
}

/**
 * Grid points per period the orbit may have on the run's own grid, for a run keeping at most
 * `maxStoredPoints` values: the shooting holds about eight copies of the unknowns per point of
 * that grid (the recorded period, each grid's states and its map's first stages, the halved
 * grid's predictor, the halved grid having twice the points), so a max-step far below the period
 * no longer sets its memory.
 */
export function orbitPointLimit(maxStoredPoints: number, unknowns: number): number {
  return Math.max(MIN_ORBIT_POINTS, Math.floor(maxStoredPoints / (ORBIT_COPIES * Math.max(1, unknowns))));
}

/** Copies of the unknowns the shooting holds per point of the run's grid (see `orbitPointLimit`). */
const ORBIT_COPIES = 8;

/** The orbit's grid is never merged below this many points per period. */
const MIN_ORBIT_POINTS = 256;

/**
 * One period of a run continued from `snapshot`: the shooting guess and the run's own grid,
 * started (by rotating the period) where the state with the largest swing moves fastest, so
 * that the phase condition fixes a value that a shift in time changes most. A period of more
 * than `maxPoints` steps keeps every 2nd, 4th, … of them (`merged`), its last point included.
 * With `retime` (an autonomous orbit, its period unknown) the guessed period is corrected by
 * the recorded period's seam shift (see `seamShift`). `watch` is handed the run before it
 * starts (a budget's step, time and wall-clock limits).
 */
export function recordPeriod(
  system: MnaSystem,
  snapshot: StepperSnapshot,
  period: number,
  maxStep: number,
  tolerances?: Partial<Tolerances>,
  maxPoints = Infinity,
  retime = false,
  driven = false,
  watch?: (run: SteppingRun) => void,
) {
  const stepper = new TransientStepper(system, { start: snapshot, maxStep, ...(tolerances ? { tolerances } : {}) });
  watch?.(stepper);
  let times: number[] = [];
  let states: Float64Array[] = [];
  let merged = 1;
  let seen = 0;
  let lastTime = snapshot.t;
  const last = new Float64Array(system.n);
  stepper.observe((t, x) => {
    lastTime = t;
    last.set(x);
    if (seen++ % merged !== 0) return;
    times.push(t);
    states.push(Float64Array.from(x));
    if (times.length > maxPoints + 1) {
      times = times.filter((_, k) => k % 2 === 0);
      states = states.filter((_, k) => k % 2 === 0);
      merged *= 2;
    }
  });
  stepper.advance(snapshot.t + period);
  if (times[times.length - 1] !== lastTime) {
    // The period's end, in place of the last kept point when that would pass the bound.
    if (times.length > maxPoints) {
      times.pop();
      states.pop();
    }
    times.push(lastTime);
    states.push(Float64Array.from(last));
  }
  let N = times.length - 1;
  if (N >= 2 && times[N]! - times[N - 1]! < SLIVER * (times[N - 1]! - times[N - 2]!)) {
    times.splice(N - 1, 1);
    states.splice(N - 1, 1);
    N--;
  }
  // The charged states' swings over the period, as both the seam and the start read them.
  const swings = Array.from(system.stateColumns, (j) => swingOf(states, j));
  const shift = retime ? seamShift(system, times, states, swings) : 0;
  const start = driven ? quietestPoint(system, times, states, swings) : fastestPoint(system, times, states, swings);
  const rotated = (k: number) => (start + k) % N;
  const fractions = Float64Array.from({ length: N }, (_, k) => (times[rotated(k) + 1]! - times[rotated(k)]!) / period);
  const trajectory = Array.from({ length: N + 1 }, (_, k) => states[rotated(k)]!);
  const guess: PeriodStart = { t0: times[start]!, x: Float64Array.from(states[start]!), period: period + shift };
  return { guess, fractions, trajectory, merged };
}

/**
 * How much later than the recorded period's end the orbit would close: −(x(T) − x(0))/ẋ(T) for
 * the charged state moving fastest at the end for its swing, its rate from the last step (a
 * transient's measured period is off by the approach's coarser steps and its slow drift; the
 * shooting's first step then starts that much nearer). Zero when it exceeds `RETIME_REACH` of
 * the period: so far from closing, the swing is not yet near the orbit (a clipped swing whose
 * amplitude loop still moves), and the linear estimate would mislead. `swings`: one per state column.
 */
function seamShift(system: MnaSystem, times: readonly number[], states: readonly Float64Array[], swings: readonly number[]): number {
  const N = times.length - 1;
  if (N < 2) return 0;
  const period = times[N]! - times[0]!;
  const h = times[N]! - times[N - 1]!;
  let fastest = 0;
  let shift = 0;
  for (let c = 0; c < swings.length; c++) {
    const j = system.stateColumns[c]!;
    const rate = (states[N]![j]! - states[N - 1]![j]!) / h;
    const speed = (Math.abs(rate) * period) / swings[c]!;
    if (speed > fastest) {
      fastest = speed;
      shift = -(states[N]![j]! - states[0]![j]!) / rate;
    }
  }
  return Math.abs(shift) < RETIME_REACH * period ? shift : 0;
}

/** A seam shift beyond this fraction of the period is not corrected (see `seamShift`). */
const RETIME_REACH = 0.01;

/** Peak-to-peak of unknown j over the recorded states. */
function swingOf(states: readonly Float64Array[], j: number): number {
  let lo = Infinity;
  let hi = -Infinity;
  for (const x of states) {
    lo = Math.min(lo, x[j]!);
    hi = Math.max(hi, x[j]!);
  }
  return hi - lo;
}

/** The recorded point (not the last) where the charged state with the largest swing (`swings`, one per state column) changes fastest. */
function fastestPoint(system: MnaSystem, times: readonly number[], states: readonly Float64Array[], swings: readonly number[]): number {
  const N = times.length - 1;
  let widest = -1;
  let swing = -1;
  for (let c = 0; c < swings.length; c++) {
    if (swings[c]! > swing) {
      swing = swings[c]!;
      widest = system.stateColumns[c]!;
    }
  }
  if (widest < 0) return 0;
  let best = 0;
  let fastest = -1;
  for (let k = 0; k < N; k++) {
    const rate = Math.abs(states[k + 1]![widest]! - states[k]![widest]!) / (times[k + 1]! - times[k]!);
    if (rate > fastest) {
      fastest = rate;
      best = k;
    }
  }
  return best;
}

/**
 * The recorded point (not the last) where the charged states, each for its swing, change least:
 * a driven orbit needs no phase condition, and started there its map begins away from the fast
 * events of the period (a rectifier's conduction, where the diode's current and node follow the
 * state exponentially and Newton's linear model of the map holds only over a few thermal voltages).
 */
function quietestPoint(system: MnaSystem, times: readonly number[], states: readonly Float64Array[], swings: readonly number[]): number {
  const N = times.length - 1;
  let best = 0;
  let slowest = Infinity;
  for (let k = 0; k < N; k++) {
    let speed = 0;
    for (let c = 0; c < swings.length; c++) {
      if (!(swings[c]! > 0)) continue;
      const j = system.stateColumns[c]!;
      speed = Math.max(speed, Math.abs(states[k + 1]![j]! - states[k]![j]!) / ((times[k + 1]! - times[k]!) * swings[c]!));
    }
    if (speed < slowest) {
      slowest = speed;
      best = k;
    }
  }
  return best;
}

/** Each step of the grid split in two equal halves. */
function halved(fractions: Float64Array): Float64Array {
  const out = new Float64Array(2 * fractions.length);
  for (let k = 0; k < fractions.length; k++) {
    out[2 * k] = 0.5 * fractions[k]!;
    out[2 * k + 1] = 0.5 * fractions[k]!;
  }
  return out;
}

/**
 * The orbit's states at the halved grid's points: the originals, and between them the cubic
 * through the four nearest points (wrapping around the period), whose error is O(h⁴) where the
 * chord's midpoint is O(h²) — the halved grid's first period then starts its Newton solves at
 * the orbit's own discretisation error.
 */
function halvedPredictor(states: readonly Float64Array[], fractions: Float64Array): Float64Array[] {
  const N = fractions.length;
  const out: Float64Array[] = [];
  const n = states[0]!.length;
  for (let k = 0; k <= N; k++) {
    out.push(states[k]!);
    if (k === N) break;
    // Lagrange weights at the middle of step k (length h), on the points k − 1 … k + 2, at times
    // −b, 0, h, h + c from point k.
    const b = fractions[(k + N - 1) % N]!;
    const h = fractions[k]!;
    const c = fractions[(k + 1) % N]!;
    const t = 0.5 * h;
    const w0 = (t * (t - h) * (t - h - c)) / (-b * (-b - h) * (-b - h - c));
    const w1 = ((t + b) * (t - h) * (t - h - c)) / (b * -h * (-h - c));
    const w2 = ((t + b) * t * (t - h - c)) / ((h + b) * h * -c);
    const w3 = ((t + b) * t * (t - h)) / ((h + c + b) * (h + c) * c);
    const before = states[k === 0 ? N - 1 : k - 1]!;
    const after = states[k + 2 <= N ? k + 2 : 1]!;
    const here = states[k]!;
    const next = states[k + 1]!;
    const mid = new Float64Array(n);
    for (let i = 0; i < n; i++) mid[i] = w0 * before[i]! + w1 * here[i]! + w2 * next[i]! + w3 * after[i]!;
    out.push(mid);
  }
  return out;
}

/**
 * The periodic steady state near a settled run, on the run's own grid and on that grid halved;
 * the figures are extrapolated to zero step (Richardson, the formulas being second order:
 * m = m½ + (m½ − m₁)/3) and each carries the error bar |m − m₁| (the frequency |m − m½|).
 */
export function refineOrbit(
  system: MnaSystem,
  guess: PeriodStart,
  fractions: Float64Array,
  trajectory: readonly Float64Array[],
  read: ProbeReader,
  maxOrder: number,
  settings: {
    readonly tolerances?: Partial<Tolerances>;
    readonly autonomous?: boolean;
    readonly relative?: number;
    /** Times after the orbit's start where a source has a corner (a driven waveform bends there). */
    readonly corners?: readonly number[];
    /** Called before each period is integrated; throws to stop (a run's limits). */
    readonly check?: () => void;
    /** The orbit carries its Floquet multipliers (computed on the run's own grid). */
    readonly multipliers?: boolean;
    /** Largest number of periods each grid's shooting integrates. */
    readonly maxIterations?: number;
    /** Periods after which a shooting making no headway gives up (see `ShootingOptions.giveUpAfter`). */
    readonly giveUpAfter?: number;
    /** A Newton matrix to start the coarser grid's shooting from (a neighbouring orbit's). */
    readonly jacobian?: ShootingJacobian;
    /** Both grids' shootings matrix-free or not (see `ShootingOptions.matrixFree`). */
    readonly matrixFree?: boolean;
  } = {},
): RefinedOrbit {
  const options = {
    autonomous: settings.autonomous ?? true,
    ...(settings.tolerances ? { tolerances: settings.tolerances } : {}),
    ...(settings.relative === undefined ? {} : { relative: settings.relative }),
    ...(settings.check ? { check: settings.check } : {}),
    ...(settings.maxIterations === undefined ? {} : { maxIterations: settings.maxIterations }),
    ...(settings.giveUpAfter === undefined ? {} : { giveUpAfter: settings.giveUpAfter }),
    ...(settings.matrixFree === undefined ? {} : { matrixFree: settings.matrixFree }),
  };
  // The multipliers come from the run's own grid (a stability verdict and a rate, where the
  // grids differ in the fourth digit), at half the cost of the finer grid's.
  const coarse = shootOrbit(system, guess, fractions, trajectory, { ...options, ...(settings.jacobian ? { jacobian: settings.jacobian } : {}), multipliers: settings.multipliers ?? false });
  const { metrics: m1, extremes: e1, samples: s1, uniform: u1 } = orbitFigures(coarse, read, maxOrder, settings.corners);
  // The halved grid's map differs from the run's own by O(h²): its shooting iterates on the
  // coarser grid's Newton matrix (put back once where Broyden's updates stop contracting), so no
  // period of it carries the sensitivities unless that matrix too fails to contract.
  const fine = { ...shootOrbit(system, coarse.start, halved(fractions), halvedPredictor(coarse.states, fractions), { ...options, jacobian: coarse.jacobian, sensitivities: "given" }), multipliers: coarse.multipliers };
  const { metrics: m2, extremes: e2, samples: s2, uniform: u2 } = orbitFigures(fine, read, maxOrder, settings.corners);
  // The halved grid's lasting multipliers from tangent passes along the run's own grid's lasting
  // modes over the halved grid's last shooting period (see `projectedMultipliers`); where there is
  // no such period or the modes are not well separated, one more period of it with sensitivities
  // (matrix-free, an Arnoldi run of tangent passes).
  const finerMultipliers =
    settings.multipliers === true ? (projectedMultipliers(system, coarse, fine, settings.tolerances) ?? orbitMultipliers(system, fine, { ...options, jacobian: coarse.jacobian })) : [];
  // A figure extrapolates only while the two grids agree on it to a part in two; one at the
  // numerical floor (an even harmonic of a symmetric waveform) keeps the finer grid's value.
  const extrapolate = (a: number, b: number) => (Math.abs(b - a) < 0.5 * Math.abs(b) ? b + (b - a) / 3 : b);
  // How far the extrapolation moved the value from the run's own grid, (4/3)·|m½ − m₁|: the true
  // value lies within it whenever the error shrinks steadily as the grid is refined, even before
  // it follows h² (a limiter's corners resolved by few points, a slowly attracting orbit).
  const bar = (a: number, b: number) => Math.abs(extrapolate(a, b) - a);
  // The period is a smooth function of the whole orbit and its error follows h² from the
  // coarsest grid on where the waveform is smooth (the validation table), so its bar is the
  // extrapolation's own step, |m − m½| = |m½ − m₁|/3. A corner inside a step (an op-amp running
  // into its rail clamp) makes that step's error first order in h while the step control is
  // loose (accuracy=1e-3: a clipped Wien's frequency error was 1.95 times that bar, the value
  // for p = 1): with errors e₁ = C·hᵖ and e½ = C·(h/2)ᵖ, m's error is
  // |m½ − m₁|·(4·2⁻ᵖ − 1)/(3·(1 − 2⁻ᵖ)), 0 at p = 2 and at most (2/3)·|m½ − m₁| for p ≥ 1,
  // so with corners on either grid the bar is that.
  const periodBar = (a: number, b: number) => (c1.corners + c2.corners > 0 ? (2 / 3) * Math.abs(b - a) : Math.abs(extrapolate(a, b) - b));
  // The corners' share of the integrals' error on each grid (see `cornerIntegralBounds`), as it
  // passes into the extrapolated m½ + (m½ − m₁)/3: (4·c½ + c₁)/3.
  const c1 = cornerIntegralBounds(s1, u1, m1.rms, m1.thd, m1.harmonics);
  const c2 = cornerIntegralBounds(s2, u2, m2.rms, m2.thd, m2.harmonics);
  const cornerBar = (a: number, b: number) => (4 * b + a) / 3;
  // A THD the two grids do not agree on to a part in two is at their numerical floor (a linear
  // circuit driven by a sine): nothing then tells it from zero, so its bar reaches zero.
  const floorBar = (a: number, b: number) => (Math.abs(b - a) < 0.5 * Math.abs(b) ? 0 : Math.abs(b));
  return {
    frequency: extrapolate(m1.frequency, m2.frequency),
    amplitude: extrapolate(m1.amplitude, m2.amplitude),
    peakToPeak: extrapolate(m1.peakToPeak, m2.peakToPeak),
    rms: extrapolate(m1.rms, m2.rms),
    offset: extrapolate(m1.offset, m2.offset),
    thd: extrapolate(m1.thd, m2.thd),
    harmonics: harmonicList(Float64Array.from(m2.harmonics, (h, k) => extrapolate(m1.harmonics[k]!.amplitude, h.amplitude)), extrapolate(m1.frequency, m2.frequency)),
    numericalError: {
      frequency: periodBar(m1.frequency, m2.frequency),
      amplitude: Math.max(swingBar(e1, e2, bar(m1.amplitude, m2.amplitude), bar), 0.5 * cornerSwingBar(e1, e2, bar)),
      rms: Math.max(bar(m1.rms, m2.rms), cornerBar(c1.rms, c2.rms)),
      thd: Math.max(bar(m1.thd, m2.thd), cornerBar(c1.thd, c2.thd), floorBar(m1.thd, m2.thd)),
    },
    orbit: fine,
    points: [fractions.length, 2 * fractions.length],
    iterations: [coarse.iterations, fine.iterations],
    finerMultipliers,
  };
}

/**
 * The amplitude's bar: |m − m₁| of the half swing, or half the sum of each extremum's own, when
 * that is larger. The half swing is a difference, and its two extremes' errors can cancel on each
 * grid (a symmetric wave on an uneven grid: a diode Wien at accuracy=1e-3 had its maximum and
 * minimum each 3 µV off on the run's grid and its swing 0.2 µV off, the grids agreeing to 0.2 µV
 * and the bar 1.05 times short of scipy's); each extremum's error shrinks steadily on its own, and
 * |Δ(max − min)/2| ≤ (|Δmax| + |Δmin|)/2. (The two are equal but for rounding when the extremes
 * move alike, hence the margin.)
 */
function swingBar(coarse: OrbitExtremes, fine: OrbitExtremes, swing: number, bar: (a: number, b: number) => number): number {
  const extremes = 0.5 * (bar(coarse.maximum, fine.maximum) + bar(coarse.minimum, fine.minimum));
  return extremes > (1 + ROUNDING_MARGIN) * swing ? extremes : swing;
}

/** Relative margin above which two bars equal in exact arithmetic count as different. */
const ROUNDING_MARGIN = 1e-9;

/**
 * A bound on the peak-to-peak's error when an extremum sits on a corner on either grid (a diode
 * turning on right at it; see `OrbitExtremes`), else zero. Such an extremum is not resolved to
 * second order: its error shrinks like h, erratically, and the two grids' swings can agree by
 * chance (the corner's error cancelling the other extremum's). Each extremum then counts on its
 * own, with its extrapolation step and its interpolation spread on the run's own grid.
 */
function cornerSwingBar(coarse: OrbitExtremes, fine: OrbitExtremes, bar: (a: number, b: number) => number): number {
  const maximum = bar(coarse.maximum, fine.maximum);
  const minimum = bar(coarse.minimum, fine.minimum);
  if (!(coarse.maximumCorner || coarse.minimumCorner || fine.maximumCorner || fine.minimumCorner)) return 0;
  return maximum + coarse.maximumSpread + minimum + coarse.minimumSpread;
}

import { siPrefixExponent } from "../format/prefixes.js";
import { formatTickSI } from "../format/si.js";

/** A tick: major ticks carry a label and a grid line, minor ones (log axes) a fainter line. */
export interface Tick {
  readonly value: number;
  readonly label: string;
  readonly major: boolean;
}

/** `mantissa × 10^power` held apart, so each tick is one correctly rounded operation. */
interface Step {
  readonly mantissa: number;
  readonly power: number;
}

// Dividing by an exact power of ten (10^k is exact for k ≤ 22) rounds once, so 3 × 0.1 is
// written 0.3 instead of 0.30000000000000004.
function scaled(integer: number, power: number): number {
  return power >= 0 ? integer * 10 ** power : integer / 10 ** -power;
}

// Steps for angles: whole fractions of a half turn read better than 1-2-5 (common practice).
const DEGREE_STEPS = [15, 30, 45, 90, 180, 360];

/**
 * The 1-2-5 step (or 15°…360° for angles) nearest, on a log scale, to `span / target`, so the
 * axis gets between about 0.7 and 1.4 times `target` intervals.
 */
function niceStep(span: number, target: number, degrees: boolean): Step {
  const raw = span / Math.max(1, target);
  if (degrees && raw > 10) {
    const angle = DEGREE_STEPS.find((s) => s >= raw);
    if (angle !== undefined) return { mantissa: angle, power: 0 };
  }
  let power = Math.floor(Math.log10(raw));
  const normalised = raw / scaled(1, power);
  // Geometric midpoints between 1, 2, 5 and 10 decide which is nearest.
  let mantissa = normalised < Math.SQRT2 ? 1 : normalised < Math.sqrt(10) ? 2 : normalised < Math.sqrt(50) ? 5 : 10;
  if (mantissa === 10) {
    mantissa = 1;
    power += 1;
  }
  return { mantissa, power };
}

// The next 1-2-5 step below: 1 → 0.5, 2 → 1, 5 → 2 (angle steps fall back to 1-2-5).
function finer(step: Step): Step {
  if (step.mantissa === 1) return { mantissa: 5, power: step.power - 1 };
  if (step.mantissa === 2) return { mantissa: 1, power: step.power };
  if (step.mantissa === 5) return { mantissa: 2, power: step.power };
  const power = Math.floor(Math.log10(step.mantissa));
  return { mantissa: 1, power: step.power + power };
}

function multiples(lo: number, hi: number, step: Step): number[] {
  const size = scaled(step.mantissa, step.power);
  const first = Math.ceil(lo / size - 1e-9);
  const last = Math.floor(hi / size + 1e-9);
  const values: number[] = [];
  for (let i = first; i <= last && values.length <= 1000; i += 1) {
    values.push(scaled(i * step.mantissa, step.power));
  }
  return values;
}

/**
 * Multiples of a 1-2-5 step inside [lo, hi], about `target` intervals apart. A span that sits
 * on the rounding edge between two steps could hold a single multiple of the coarser one; the
 * next finer step then gives the axis at least two ticks.
 */
export function linearTickValues(lo: number, hi: number, target: number, degrees = false): number[] {
  let step = niceStep(hi - lo, target, degrees);
  let values = multiples(lo, hi, step);
  for (let k = 0; k < 3 && values.length < 2; k++) {
    step = finer(step);
    values = multiples(lo, hi, step);
  }
  return values;
}

function labelsWith(values: readonly number[], unit: string, exponent: number): string[] {
  return values.map((value) => formatTickSI(value, unit, exponent));
}

// Shorter widest label first, then shorter labels in all.
function lighter(a: readonly string[], b: readonly string[]): boolean {
  const widest = (labels: readonly string[]): number => Math.max(...labels.map((l) => [...l].length));
  const total = (labels: readonly string[]): number => labels.reduce((n, l) => n + [...l].length, 0);
  return widest(a) < widest(b) || (widest(a) === widest(b) && total(a) < total(b));
}

/**
 * Labelled ticks for a linear axis. One SI prefix serves the whole axis, so labels read
 * `0, 0.5 ms, 1 ms, 1.5 ms` rather than switching prefix midway: the prefix of the largest
 * tick, or the one below it when that gives shorter labels (`990 Hz … 1010 Hz` rather than
 * `0.99 kHz … 1.01 kHz`).
 */
export function linearTicks(lo: number, hi: number, target: number, unit: string): Tick[] {
  const values = linearTickValues(lo, hi, target, unit === "\u00b0");
  const largest = values.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
  const upper = siPrefixExponent(largest);
  let labels = labelsWith(values, unit, upper);
  if (upper > -15) {
    const lower = labelsWith(values, unit, upper - 3);
    if (lighter(lower, labels)) labels = lower;
  }
  return values.map((value, i) => ({ value, label: labels[i] ?? "", major: true }));
}

/**
 * Ticks for a log axis: decades labelled (every n-th when there are more than `maxLabels`),
 * minor ticks at 2…9 × 10^k. Less than two decades in view falls back to 1-2-5 within the
 * decade, then to linear steps.
 */
export function logTicks(lo: number, hi: number, maxLabels: number, unit: string): Tick[] {
  const k0 = Math.ceil(Math.log10(lo) - 1e-9);
  const k1 = Math.floor(Math.log10(hi) + 1e-9);
  const inView = (v: number): boolean => v >= lo * (1 - 1e-9) && v <= hi * (1 + 1e-9);
  const ticks: Tick[] = [];
  const decades = k1 - k0 + 1;
  if (decades >= 2) {
    const stride = Math.ceil(decades / Math.max(1, maxLabels));
    // Labelled decades on multiples of the stride (1, 1k, 1M …) when that still gives two.
    const aligned = Math.floor(k1 / stride) - Math.ceil(k0 / stride) + 1 >= 2;
    for (let k = k0 - 1; k <= k1; k += 1) {
      const decade = scaled(1, k);
      const labelled = aligned ? ((k % stride) + stride) % stride === 0 : (k - k0) % stride === 0;
      if (inView(decade)) ticks.push({ value: decade, label: labelled ? formatTickSI(decade, unit) : "", major: labelled });
      if (stride > 1) continue;
      for (let m = 2; m <= 9; m += 1) {
        const value = scaled(m, k);
        if (inView(value)) ticks.push({ value, label: "", major: false });
      }
    }
    return ticks.sort((a, b) => a.value - b.value);
  }
  for (let k = k0 - 1; k <= k1; k += 1) {
    for (let m = 1; m <= 9; m += 1) {
      const value = scaled(m, k);
      if (!inView(value)) continue;
      const major = m === 1 || m === 2 || m === 5;
      ticks.push({ value, label: major ? formatTickSI(value, unit) : "", major });
    }
  }
  if (ticks.filter((t) => t.major).length >= 2) return ticks;
  return linearTickValues(lo, hi, 5).filter((v) => v > 0).map((value) => ({ value, label: formatTickSI(value, unit), major: true }));
}

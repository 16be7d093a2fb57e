import { formatSI } from "../../format/si.js";
import type { Panel } from "../types.js";

/** A natural frequency s = real + j·imag (1/s and rad/s). */
export interface PolePoint {
  readonly real: number;
  readonly imag: number;
}

/** How far out the plane is shown, in multiples of the dominant pair's distance from 0. */
const REACH = 1.6;

// Points apart: the NaN between them breaks the line, so each is a dot of its own.
function scattered(values: readonly number[]): Float64Array {
  const out = new Float64Array(Math.max(0, 2 * values.length - 1)).fill(Number.NaN);
  values.forEach((v, i) => (out[2 * i] = v));
  return out;
}

/**
 * The poles on the complex plane (real part across, imaginary up) with the imaginary axis
 * marked: a pair right of it grows, left of it decays. The view reaches {@link REACH} times
 * the dominant pair's distance from the origin, so the pair that decides the start is not
 * squeezed against the axis by an op-amp's far poles; those are counted in the title.
 */
export function polesPanel(poles: readonly PolePoint[], dominant: PolePoint | null): Panel {
  const scale = dominant ? Math.hypot(dominant.real, dominant.imag) : Math.max(1, ...poles.map((p) => Math.hypot(p.real, p.imag)));
  const reach = REACH * (scale > 0 ? scale : 1);
  const near = poles.filter((p) => Math.hypot(p.real, p.imag) <= reach);
  const far = poles.length - near.length;
  const others = near.filter((p) => p !== dominant && !(dominant && p.real === dominant.real && Math.abs(p.imag) === Math.abs(dominant.imag)));
  const pair = dominant ? [dominant, { real: dominant.real, imag: -dominant.imag }] : [];
  const title = far === 0 ? "poles" : `poles (${far} more beyond ${formatSI(reach, "/s", 2)} from the origin, off the plot)`;
  return {
    title,
    xLabel: "real part (growth rate)",
    xUnit: "/s",
    yLabel: "imaginary part",
    yUnit: "rad/s",
    series: [
      { name: "dominant pair", x: scattered(pair.map((p) => p.real)), y: scattered(pair.map((p) => p.imag)), tone: 3, dots: true, style: "line" },
      { name: "other poles", x: scattered(others.map((p) => p.real)), y: scattered(others.map((p) => p.imag)), tone: 0, dots: true, style: "line" },
    ],
    markers: [{ x: 0, label: "imaginary axis: grows to the right" }],
    xRange: [-reach, Math.max(reach / 2, ...pair.map((p) => 1.5 * p.real))],
    yRange: [-reach, reach],
  };
}

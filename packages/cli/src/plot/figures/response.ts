import { formatSI } from "../../format/si.js";
import type { Figure, Marker, Panel } from "../types.js";

/** Input of {@link responseFigure}. */
export interface ResponsePlot {
  readonly title: string;
  /** Frequencies in Hz (drawn on a log axis). */
  readonly frequency: ArrayLike<number>;
  /** Magnitude as a ratio (V/V); drawn as 20·log10 in dB. */
  readonly magnitude: ArrayLike<number>;
  /** Phase in degrees. */
  readonly phase: ArrayLike<number>;
  /** Frequency of a notch (minimum of magnitude), marked "notch …". */
  readonly notch?: number;
  /** Frequency where the phase crosses −180°, marked on both panels. */
  readonly phaseCrossing?: number;
  readonly markers?: readonly Marker[];
}

/**
 * Phase in (−180°, 180°], with the line broken where it wraps: a passive network's phase
 * stays within a half turn of zero instead of running to −340° as an unwrapped sum would.
 */
export function wrappedPhase(frequency: ArrayLike<number>, phase: ArrayLike<number>): { x: Float64Array; y: Float64Array } {
  const x: number[] = [];
  const y: number[] = [];
  let previous = Number.NaN;
  for (let i = 0; i < Math.min(frequency.length, phase.length); i += 1) {
    const p = phase[i] as number;
    const wrapped = Number.isFinite(p) ? p - 360 * Math.ceil((p - 180) / 360) : Number.NaN;
    if (Math.abs(wrapped - previous) > 180) {
      x.push(Number.NaN);
      y.push(Number.NaN);
    }
    x.push(frequency[i] as number);
    y.push(wrapped);
    previous = wrapped;
  }
  return { x: Float64Array.from(x), y: Float64Array.from(y) };
}

/** A frequency response: magnitude in dB over phase in degrees, on one log frequency axis. */
export function responseFigure(input: ResponsePlot): Figure {
  const markers: Marker[] = [...(input.markers ?? [])];
  if (input.notch !== undefined && Number.isFinite(input.notch)) markers.push({ x: input.notch, label: `notch ${formatSI(input.notch, "Hz", 3)}` });
  if (input.phaseCrossing !== undefined && Number.isFinite(input.phaseCrossing)) {
    markers.push({ x: input.phaseCrossing, label: `\u2212180\u00b0 at ${formatSI(input.phaseCrossing, "Hz", 3)}` });
  }
  const decibels = Float64Array.from(input.magnitude, (m) => 20 * Math.log10(m));
  const common = { xLabel: "frequency", xUnit: "Hz", xLog: true, markers, height: 380 };
  const panels: Panel[] = [
    { ...common, yLabel: "magnitude", yUnit: "dB", series: [{ name: "", x: input.frequency, y: decibels, tone: 0, style: "line" }] },
    { ...common, yLabel: "phase", yUnit: "\u00b0", yRange: [-180, 180], series: [{ name: "", ...wrappedPhase(input.frequency, input.phase), tone: 3, style: "line" }] },
  ];
  return { title: input.title, panels, sharedX: true };
}

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
    { ...common, yLabel: "phase", yUnit: "\u00b0", series: [{ name: "", x: input.frequency, y: input.phase, tone: 3, style: "line" }] },
  ];
  return { title: input.title, panels, sharedX: true };
}

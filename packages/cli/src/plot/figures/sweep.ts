import { formatSI } from "../../format/si.js";
import type { Figure, Marker, Panel, Series } from "../types.js";

/** Input of {@link sweepFigure}; metrics are NaN where a step did not oscillate. */
export interface SweepPlot {
  readonly title: string;
  /** The swept setting: its name (`R`, `P1.at`), unit and the value at each step. */
  readonly setting: { readonly name: string; readonly unit: string; readonly values: ArrayLike<number>; readonly log?: boolean };
  readonly amplitude: ArrayLike<number>;
  /** @defaultValue `"V"` */
  readonly amplitudeUnit?: string;
  readonly frequency: ArrayLike<number>;
  /** THD as fractions; drawn in percent. */
  readonly thd: ArrayLike<number>;
  /** The setting at which oscillation starts, marked on every panel. */
  readonly threshold?: number;
  /** Settings that did not oscillate: drawn at zero amplitude, so the panel shows every setting. */
  readonly silent?: ArrayLike<boolean>;
}

/** Smallest span of the metric axes, as a fraction of the largest value: 2 % (see `yMinSpan`). */
const METRIC_SPAN = 0.02;

// Dots make a sweep of a few steps readable; past this many they only add weight.
const DOTS_UP_TO = 60;

/**
 * The amplitude axis when some settings are silent: a little below zero, so their dots at
 * zero sit inside the plot rather than on its frame, and room above for the threshold label.
 */
function silentRange(amplitude: ArrayLike<number>): [number, number] {
  const top = Math.max(0, ...Array.from(amplitude).filter(Number.isFinite));
  const span = top > 0 ? top : 1;
  return [-0.06 * span, top + 0.3 * span];
}

/** Amplitude, frequency and THD against a swept setting: three panels on one x axis. */
export function sweepFigure(input: SweepPlot): Figure {
  const { setting } = input;
  const x = setting.values;
  const dots = x.length <= DOTS_UP_TO;
  const markers: Marker[] =
    input.threshold === undefined || !Number.isFinite(input.threshold)
      ? []
      : [{ x: input.threshold, label: `start threshold ${formatSI(input.threshold, setting.unit, 3)}` }];
  const amplitudeUnit = input.amplitudeUnit ?? "V";
  const common = { xLabel: setting.name, xUnit: setting.unit, xLog: setting.log === true, markers, height: 300 };
  const silent = Float64Array.from(x, (_, i) => (input.silent?.[i] === true ? 0 : Number.NaN));
  const amplitude: Series[] = [{ name: "", x, y: input.amplitude, tone: 0, style: "line", dots }];
  if (silent.some(Number.isFinite)) amplitude.push({ name: "no oscillation", x, y: silent, muted: true, dots: true, style: "line" });
  const panels: Panel[] = [
    { ...common, yLabel: "amplitude (peak)", yUnit: amplitudeUnit, yMinSpan: METRIC_SPAN, series: amplitude, ...(amplitude.length > 1 ? { yRange: silentRange(input.amplitude) } : {}) },
    { ...common, yLabel: "frequency", yUnit: "Hz", yMinSpan: METRIC_SPAN, series: [{ name: "", x, y: input.frequency, tone: 1, style: "line", dots }] },
    { ...common, yLabel: "THD", yUnit: "%", series: [{ name: "", x, y: Float64Array.from(input.thd, (v) => v * 100), tone: 2, style: "line", dots }] },
  ];
  return { title: input.title, panels, sharedX: true };
}

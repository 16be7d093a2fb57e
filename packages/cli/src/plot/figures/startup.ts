import { formatPercent } from "../../format/ratio.js";
import { formatSI } from "../../format/si.js";
import type { Figure, Marker, Panel, Series } from "../types.js";
import { quantityOf, type ProbeTrace } from "./quantity.js";

/** One harmonic of the settled waveform (amplitude in the probe's unit, peak). */
export interface HarmonicLevel {
  readonly order: number;
  readonly frequency: number;
  readonly amplitude: number;
}

/** Input of {@link startupFigure}. */
export interface StartupPlot {
  readonly title: string;
  readonly time: ArrayLike<number>;
  readonly probe: ProbeTrace;
  /** Per-cycle envelope (peak, measured from `offset`) at the given times. */
  readonly envelope?: { readonly time: ArrayLike<number>; readonly values: ArrayLike<number> };
  /** Level the envelope is measured from. @defaultValue 0 */
  readonly offset?: number;
  readonly startupTime?: number;
  readonly settlingTime?: number;
  readonly harmonics?: readonly HarmonicLevel[];
  /** THD as a fraction, printed in the spectrum title. */
  readonly thd?: number;
  /** The envelope's bounce: drawn in a panel of its own with the fitted decaying oscillation. */
  readonly bounce?: EnvelopeBounce;
}

/** The envelope's own oscillation as fitted: frequency, damping and the fitted curve. */
export interface EnvelopeBounce {
  /** Hz. */
  readonly frequency: number;
  readonly dampingRatio: number;
  /** The fitted envelope (peak, from `offset`) at the given times. */
  readonly fit: { readonly time: ArrayLike<number>; readonly values: ArrayLike<number> };
}

/** Harmonics further below the fundamental than this are numerical noise; they sit on the floor. */
export const SPECTRUM_FLOOR_DBC = -160;

// offset ± envelope as one series: the NaN between the halves breaks the line, so the legend
// has one "± envelope" entry for both.
function envelopeSeries(envelope: NonNullable<StartupPlot["envelope"]>, offset: number): { x: Float64Array; y: Float64Array } {
  const n = Math.min(envelope.time.length, envelope.values.length);
  const x = new Float64Array(2 * n + 1);
  const y = new Float64Array(2 * n + 1);
  for (let i = 0; i < n; i += 1) {
    const t = envelope.time[i] as number;
    const e = envelope.values[i] as number;
    x[i] = t;
    y[i] = offset + e;
    x[n + 1 + i] = t;
    y[n + 1 + i] = offset - e;
  }
  x[n] = Number.NaN;
  y[n] = Number.NaN;
  return { x, y };
}

function spectrumPanel(harmonics: readonly HarmonicLevel[], thd: number | undefined): Panel {
  const fundamental = harmonics.find((h) => h.order === 1) ?? [...harmonics].sort((a, b) => b.amplitude - a.amplitude)[0];
  const reference = fundamental?.amplitude ?? Number.NaN;
  const x = Float64Array.from(harmonics, (h) => h.frequency);
  const y = Float64Array.from(harmonics, (h) => Math.max(SPECTRUM_FLOOR_DBC, 20 * Math.log10(h.amplitude / reference)));
  const parts = ["spectrum"];
  if (fundamental !== undefined) parts.push(`fundamental ${formatSI(fundamental.frequency, "Hz")}`);
  if (thd !== undefined) parts.push(`THD ${formatPercent(thd, 3)}`);
  return {
    title: parts.join(", "),
    xLabel: "frequency",
    xUnit: "Hz",
    yLabel: "level",
    yUnit: "dBc",
    series: [{ name: "", x, y, style: "bars", tone: 0 }],
    height: 320,
  };
}

/** The times of the fitted curve's first two maxima above its last value: one bounce apart. */
function bouncePeaks(fit: EnvelopeBounce["fit"]): number[] {
  const n = Math.min(fit.time.length, fit.values.length);
  const level = fit.values[n - 1] as number;
  const peaks: number[] = [];
  for (let i = 1; i + 1 < n && peaks.length < 2; i++) {
    const v = fit.values[i] as number;
    if (v > level && v >= (fit.values[i - 1] as number) && v > (fit.values[i + 1] as number)) peaks.push(fit.time[i] as number);
  }
  return peaks;
}

// The envelope alone at its own scale, with the fitted bounce and its first two peaks marked.
function bouncePanel(envelope: NonNullable<StartupPlot["envelope"]>, bounce: EnvelopeBounce, unit: string, quantity: string): Panel {
  const zeta = Math.abs(bounce.dampingRatio) < 5e-4 ? 0 : bounce.dampingRatio;
  const label = `bounce ${formatSI(bounce.frequency, "Hz", 4)}, \u03b6 ${zeta.toFixed(3)}`;
  const markers: Marker[] = bouncePeaks(bounce.fit).map((x, k) => ({ x, label: k === 0 ? label : "one bounce later" }));
  return {
    title: `envelope: ${label}`,
    xLabel: "time",
    xUnit: "s",
    yLabel: `${quantity} envelope`,
    yUnit: unit,
    series: [
      { name: "envelope", x: envelope.time, y: envelope.values, style: "line", tone: 1 },
      { name: "fitted decaying oscillation", x: bounce.fit.time, y: bounce.fit.values, style: "dashed", tone: 2 },
    ],
    markers,
    height: 320,
  };
}

/**
 * The start-up plot: the probe waveform with ± its envelope and markers at the start-up and
 * settling times; when the envelope bounces, the envelope at its own scale with the fitted
 * decaying oscillation and its peaks marked; and the spectrum of the settled waveform in dBc.
 */
export function startupFigure(input: StartupPlot): Figure {
  const offset = input.offset ?? 0;
  const markers: Marker[] = [];
  if (input.startupTime !== undefined && Number.isFinite(input.startupTime)) {
    markers.push({ x: input.startupTime, label: `start-up ${formatSI(input.startupTime, "s", 3)}` });
  }
  if (input.settlingTime !== undefined && Number.isFinite(input.settlingTime)) {
    markers.push({ x: input.settlingTime, label: `settled ${formatSI(input.settlingTime, "s", 3)}` });
  }
  const series: Series[] = [{ name: input.probe.name, x: input.time, y: input.probe.values, style: "line", tone: 0 }];
  if (input.envelope !== undefined) {
    const { x, y } = envelopeSeries(input.envelope, offset);
    series.push({ name: "\u00b1 envelope", x, y, style: "dashed", tone: 1 });
  }
  const panels: Panel[] = [
    {
      xLabel: "time",
      xUnit: "s",
      yLabel: quantityOf(input.probe.unit),
      yUnit: input.probe.unit,
      series,
      markers,
    },
  ];
  if (input.bounce !== undefined && input.envelope !== undefined) panels.push(bouncePanel(input.envelope, input.bounce, input.probe.unit, quantityOf(input.probe.unit)));
  if (input.harmonics !== undefined && input.harmonics.length > 0) panels.push(spectrumPanel(input.harmonics, input.thd));
  return { title: input.title, panels };
}

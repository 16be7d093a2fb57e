import { formatSI } from "../../format/si.js";
import type { Figure, Marker, Panel, Series } from "../types.js";
import { quantityOf, type ProbeTrace } from "./quantity.js";
import { spectrumPanel, type HarmonicLevel } from "./spectrum.js";

export { SPECTRUM_FLOOR_DBC } from "./spectrum.js";
export type { HarmonicLevel } from "./spectrum.js";

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
  /** The settled frequency: the last few cycles get a panel of their own. */
  readonly frequency?: number;
  /** The settled amplitude (peak): the envelope's dB view is relative to it. */
  readonly amplitude?: number;
  /** The envelope's growth rate in 1/s, named on the dB view (a straight slope there). */
  readonly growthRate?: number;
  /** How far the settled amplitude may be off numerically: the spectrum marks the floor it sets. */
  readonly amplitudeError?: number;
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

/** Settled cycles the close-up panel shows. */
export const LAST_CYCLES = 3;

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

function finiteCount(values: ArrayLike<number>): number {
  let n = 0;
  for (let i = 0; i < values.length; i += 1) if (Number.isFinite(values[i] as number)) n += 1;
  return n;
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

function timeMarkers(input: StartupPlot): Marker[] {
  const markers: Marker[] = [];
  if (input.startupTime !== undefined && Number.isFinite(input.startupTime)) {
    markers.push({ x: input.startupTime, label: `start-up ${formatSI(input.startupTime, "s", 3)}` });
  }
  if (input.settlingTime !== undefined && Number.isFinite(input.settlingTime)) {
    markers.push({ x: input.settlingTime, label: `settled ${formatSI(input.settlingTime, "s", 3)}` });
  }
  return markers;
}

/**
 * The whole run: the probe waveform, ± its envelope (named in the legend only when it has
 * points to draw), and the start-up and settling times marked.
 */
export function waveformPanel(input: StartupPlot): Panel {
  const offset = input.offset ?? 0;
  const series: Series[] = [{ name: input.probe.name, x: input.time, y: input.probe.values, style: "line", tone: 0 }];
  if (input.envelope !== undefined && finiteCount(input.envelope.values) > 0) {
    const { x, y } = envelopeSeries(input.envelope, offset);
    series.push({ name: "\u00b1 envelope", x, y, style: "dashed", tone: 1 });
  }
  return { title: "whole run", xLabel: "time", xUnit: "s", yLabel: quantityOf(input.probe.unit), yUnit: input.probe.unit, series, markers: timeMarkers(input) };
}

/** The last {@link LAST_CYCLES} cycles of the run at full resolution, or null without a frequency. */
export function lastCyclesPanel(input: StartupPlot): Panel | null {
  const f = input.frequency;
  const n = input.time.length;
  if (f === undefined || !(f > 0) || n < 2) return null;
  const end = input.time[n - 1] as number;
  const from = end - LAST_CYCLES / f;
  if (!(from > (input.time[0] as number))) return null;
  let first = n - 1;
  while (first > 0 && (input.time[first - 1] as number) >= from) first -= 1;
  const x = Float64Array.from({ length: n - first }, (_, i) => input.time[first + i] as number);
  const y = Float64Array.from({ length: n - first }, (_, i) => input.probe.values[first + i] as number);
  return {
    title: `last ${LAST_CYCLES} cycles`,
    xLabel: "time",
    xUnit: "s",
    yLabel: quantityOf(input.probe.unit),
    yUnit: input.probe.unit,
    series: [{ name: "", x, y, style: "line", tone: 0 }],
    xRange: [from, end],
  };
}

/**
 * The envelope in dB relative to the settled amplitude: exponential growth is a straight
 * slope here (growth rate σ gives 20·σ/ln 10 dB per second), the settled level is 0 dB.
 */
export function envelopeDbPanel(input: StartupPlot): Panel | null {
  const reference = input.amplitude;
  if (input.envelope === undefined || reference === undefined || !(reference > 0)) return null;
  const y = Float64Array.from(input.envelope.values, (e) => (e > 0 ? 20 * Math.log10(e / reference) : Number.NaN));
  if (finiteCount(y) === 0) return null;
  const rate = input.growthRate;
  const slope = rate !== undefined && Number.isFinite(rate) ? `; growth ${formatSI((20 * rate) / Math.LN10 / 1000, "", 3)} dB/ms` : "";
  return {
    title: `envelope in dB of the settled amplitude${slope}`,
    xLabel: "time",
    xUnit: "s",
    yLabel: "envelope",
    yUnit: "dB",
    series: [{ name: "", x: input.envelope.time, y, style: "line", tone: 1 }],
    markers: timeMarkers(input),
  };
}

/** The panels of a start-up: whole run, last cycles, envelope in dB, spectrum (those that apply). */
export function startupPanels(input: StartupPlot): { waveform: Panel; lastCycles: Panel | null; envelopeDb: Panel | null; bounce: Panel | null; spectrum: Panel | null } {
  return {
    waveform: waveformPanel(input),
    lastCycles: lastCyclesPanel(input),
    envelopeDb: envelopeDbPanel(input),
    bounce: input.bounce !== undefined && input.envelope !== undefined ? bouncePanel(input.envelope, input.bounce, input.probe.unit, quantityOf(input.probe.unit)) : null,
    spectrum: input.harmonics !== undefined && input.harmonics.length > 0 ? spectrumPanel(input.harmonics, input.thd, input.amplitudeError) : null,
  };
}

/**
 * The start-up plot: the whole run (waveform, ± envelope, start-up and settling marked) with
 * its last cycles beside it, then the envelope in dB, the envelope's bounce when it has one
 * (the fitted decaying oscillation, its first two peaks marked) and the spectrum.
 */
export function startupFigure(input: StartupPlot): Figure {
  const p = startupPanels(input);
  const panels = [p.waveform, p.lastCycles, p.envelopeDb, p.bounce, p.spectrum].filter((x): x is Panel => x !== null);
  if (panels.length === 1) return { title: input.title, panels };
  return { title: input.title, panels, columns: 2, width: 1400, panelHeight: 420 };
}

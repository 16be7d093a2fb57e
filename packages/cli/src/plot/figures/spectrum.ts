import { formatPercent } from "../../format/ratio.js";
import { formatDecibel } from "../../format/ratio.js";
import { formatSI } from "../../format/si.js";
import type { Panel, Series } from "../types.js";

/** One harmonic of the settled waveform (amplitude in the probe's unit, peak). */
export interface HarmonicLevel {
  readonly order: number;
  readonly frequency: number;
  readonly amplitude: number;
}

/**
 * Levels below this are rounding noise of double-precision arithmetic whatever the run (about
 * 2⁻⁵³ relative, −320 dB, reached only after many operations; common practice puts the usable
 * floor of a simulated spectrum near −160 dBc).
 */
export const SPECTRUM_FLOOR_DBC = -160;

/**
 * The numerical floor of a spectrum in dBc: a harmonic smaller than the settled amplitude's
 * own numerical error is not resolved by the run (it may be the step size's, not the
 * circuit's). Without an error estimate, {@link SPECTRUM_FLOOR_DBC}.
 */
export function numericalFloorDbc(fundamental: number, amplitudeError: number | undefined): number {
  if (amplitudeError === undefined || !(amplitudeError > 0) || !(fundamental > 0)) return SPECTRUM_FLOOR_DBC;
  return Math.max(SPECTRUM_FLOOR_DBC, 20 * Math.log10(amplitudeError / fundamental));
}

/**
 * The spectrum of the settled waveform in dBc: a bar per harmonic grown from the bottom of the
 * axis, ticks at the harmonics, the numerical floor drawn as a level, and harmonics below it
 * in a muted tone of their own so they do not read as the circuit's.
 */
export function spectrumPanel(harmonics: readonly HarmonicLevel[], thd: number | undefined, amplitudeError: number | undefined): Panel {
  const fundamental = harmonics.find((h) => h.order === 1) ?? [...harmonics].sort((a, b) => b.amplitude - a.amplitude)[0];
  const reference = fundamental?.amplitude ?? Number.NaN;
  const floor = numericalFloorDbc(reference, amplitudeError);
  const dBc = (h: HarmonicLevel) => Math.max(SPECTRUM_FLOOR_DBC, 20 * Math.log10(h.amplitude / reference));
  const resolved = harmonics.filter((h) => dBc(h) >= floor);
  const buried = harmonics.filter((h) => dBc(h) < floor);
  const bars = (list: readonly HarmonicLevel[], name: string, tone: number): Series => ({
    name,
    x: Float64Array.from(list, (h) => h.frequency),
    y: Float64Array.from(list, dBc),
    style: "bars",
    tone,
  });
  // The legend tells the two kinds of bar apart; with one kind it would only repeat the title.
  const series = [bars(resolved, buried.length > 0 ? "harmonic" : "", 0)];
  if (buried.length > 0) series.push({ ...bars(buried, "below the numerical floor", 0), muted: true });
  const lowest = Math.min(floor, ...harmonics.map(dBc));
  const parts = ["spectrum"];
  if (fundamental !== undefined) parts.push(`fundamental ${formatSI(fundamental.frequency, "Hz")}`);
  if (thd !== undefined) parts.push(`THD ${formatPercent(thd, 3)}`);
  return {
    title: parts.join(", "),
    xLabel: "frequency (ticks at the harmonics)",
    xUnit: "Hz",
    yLabel: "level",
    yUnit: "dBc",
    series,
    xTicks: harmonics.map((h) => h.frequency),
    yRange: [Math.floor((lowest - 10) / 10) * 10, 10],
    levels: [{ y: floor, label: `numerical floor ${formatDecibel(floor, "dBc", 0)}` }],
    height: 320,
  };
}

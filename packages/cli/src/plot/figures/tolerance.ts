import { formatSI } from "../../format/si.js";
import { histogram } from "../histogram.js";
import type { Figure, Marker, Panel } from "../types.js";

/** A specification limit pair; labels default to `min` and `max`. */
export interface SpecLimit {
  readonly min?: number;
  readonly max?: number;
  readonly minLabel?: string;
  readonly maxLabel?: string;
  /** How many samples met this limit, in words ("97.5 % of samples within"), added to the panel title. */
  readonly yieldText?: string;
}

/** Input of {@link toleranceFigure}: one value per Monte Carlo run (NaN when it had none). */
export interface TolerancePlot {
  readonly title: string;
  readonly frequency: ArrayLike<number>;
  readonly amplitude: ArrayLike<number>;
  /** @defaultValue `"V"` */
  readonly amplitudeUnit?: string;
  /** THD as fractions (limits too); drawn in percent. */
  readonly thd: ArrayLike<number>;
  readonly startupTime: ArrayLike<number>;
  readonly limits?: {
    readonly frequency?: SpecLimit;
    readonly amplitude?: SpecLimit;
    readonly thd?: SpecLimit;
    readonly startupTime?: SpecLimit;
  };
  /** Bins per histogram; by default Sturges' rule (see `defaultBinCount`). */
  readonly bins?: number;
}

function limitMarkers(limit: SpecLimit | undefined, scale: number): Marker[] {
  const markers: Marker[] = [];
  if (limit?.min !== undefined) markers.push({ x: limit.min * scale, label: limit.minLabel ?? "min" });
  if (limit?.max !== undefined) markers.push({ x: limit.max * scale, label: limit.maxLabel ?? "max" });
  return markers;
}

function histogramPanel(name: string, unit: string, values: ArrayLike<number>, limit: SpecLimit | undefined, bins: number | undefined, scale = 1): Panel {
  const scaled = Float64Array.from(values, (v) => v * scale);
  const { edges, counts } = histogram(scaled, bins);
  const centres = Float64Array.from(counts, (_, i) => ((edges[i] as number) + (edges[i + 1] as number)) / 2);
  const missing = scaled.length - scaled.filter(Number.isFinite).length;
  const notes = [missing === 0 ? "" : `${missing} of ${scaled.length} runs without a value`, limit?.yieldText ?? ""].filter((t) => t !== "");
  const title = notes.length === 0 ? name : `${name} (${notes.join("; ")})`;
  const hasData = missing < scaled.length;
  return {
    title,
    xLabel: name,
    xUnit: unit,
    yLabel: "runs",
    yUnit: "",
    series: hasData ? [{ name: "", x: centres, y: Float64Array.from(counts), style: "bars", tone: 0, barWidth: (edges[1] as number) - (edges[0] as number), base: 0 }] : [],
    markers: limitMarkers(limit, scale),
  };
}

/**
 * Monte Carlo histograms of frequency, amplitude, THD and start-up time in a 2 × 2 grid, with
 * the spec limits as labelled vertical lines.
 */
export function toleranceFigure(input: TolerancePlot): Figure {
  const limits = input.limits ?? {};
  const panels: Panel[] = [
    histogramPanel("frequency", "Hz", input.frequency, limits.frequency, input.bins),
    histogramPanel("amplitude", input.amplitudeUnit ?? "V", input.amplitude, limits.amplitude, input.bins),
    histogramPanel("THD", "%", input.thd, limits.thd, input.bins, 100),
    histogramPanel("start-up time", "s", input.startupTime, limits.startupTime, input.bins),
  ];
  const runs = input.frequency.length;
  const title = `${input.title} \u2014 ${formatSI(runs, "", 6)} ${runs === 1 ? "run" : "runs"}`;
  return { title, panels, columns: 2, width: 1400, panelHeight: 440 };
}

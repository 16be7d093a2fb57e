import { renderFigure, type Figure, type Panel } from "../plot/index.js";
import { scriptJson, tag, textTag } from "./markup.js";

/** One plot of the page: a figure (usually of one panel) and how the page treats it. */
export interface PagePlot {
  /** Unique in the page: the figure's element id and the SVG's clip ids derive from it. */
  readonly id: string;
  readonly figure: Figure;
  /** Zoom and pan along x (time axes). */
  readonly zoom?: boolean;
  /** Plots with the same link zoom together (a run's waveform and its envelope in dB). */
  readonly link?: string;
  /** Its place in the page's grid: the full width, two thirds, one third or half. @defaultValue "wide" */
  readonly place?: "wide" | "main" | "side" | "half";
  readonly caption?: string;
}

/** Points per series the hover data keeps: the largest and smallest of each slice. */
const HOVER_POINTS = 4000;
/** Line columns per pixel in a zoomable plot: zoomed 8 times, a pixel still has its own points. */
const ZOOM_DETAIL = 8;

const rounded = (v: number): number | null => (Number.isFinite(v) ? Number(v.toPrecision(6)) : null);

/** The finite points of a series, thinned to about `HOVER_POINTS` keeping each slice's extremes. */
function hoverPoints(x: ArrayLike<number>, y: ArrayLike<number>): { x: (number | null)[]; y: (number | null)[] } {
  const keep: number[] = [];
  const n = Math.min(x.length, y.length);
  for (let i = 0; i < n; i += 1) if (Number.isFinite(x[i] as number) && Number.isFinite(y[i] as number)) keep.push(i);
  const slice = Math.max(1, Math.ceil(keep.length / (HOVER_POINTS / 2)));
  const chosen: number[] = [];
  for (let s = 0; s < keep.length; s += slice) {
    let lo = keep[s]!;
    let hi = keep[s]!;
    for (let k = s; k < Math.min(keep.length, s + slice); k += 1) {
      const i = keep[k]!;
      if ((y[i] as number) < (y[lo] as number)) lo = i;
      if ((y[i] as number) > (y[hi] as number)) hi = i;
    }
    chosen.push(...(lo === hi ? [lo] : lo < hi ? [lo, hi] : [hi, lo]));
  }
  return { x: chosen.map((i) => rounded(x[i] as number)), y: chosen.map((i) => rounded(y[i] as number)) };
}

function hoverData(panel: Panel): unknown[] {
  return panel.series.map((s) => ({ name: s.name, unit: panel.yUnit, ...hoverPoints(s.x, s.y) }));
}

const ZOOM_BUTTONS: readonly [string, string][] = [
  ["in", "zoom in"],
  ["out", "zoom out"],
  ["left", "earlier"],
  ["right", "later"],
  ["reset", "whole range"],
];

/**
 * A plot as a `<figure>`: the inline SVG (without its XML declaration), the hover data the
 * page script reads, zoom buttons when it zooms, and a caption.
 */
export function plotMarkup(plot: PagePlot): string {
  const figure: Figure = { ...plot.figure, id: plot.id, ...(plot.zoom ? { detail: ZOOM_DETAIL } : {}) };
  const svg = renderFigure(figure).replace(/^<\?xml[^>]*>\n/, "").trim();
  const data = textTag("script", { type: "application/json", class: "plot-data" }, "").replace("></script>", `>${scriptJson(figure.panels.map(hoverData))}</script>`);
  const bar = plot.zoom
    ? tag("div", { class: "zoom-bar", role: "toolbar", "aria-label": "zoom" }, ZOOM_BUTTONS.map(([action, label]) => textTag("button", { type: "button", "data-action": action }, label)).join("") + textTag("span", { class: "zoom-hint" }, "wheel to zoom, drag to pan, double-click for the whole range"))
    : "";
  const caption = plot.caption === undefined ? "" : textTag("figcaption", {}, plot.caption);
  return tag("figure", { class: `plot ${plot.place ?? "wide"}`, id: plot.id, "data-zoom": plot.zoom === true, "data-link": plot.link }, bar + svg + data + caption);
}

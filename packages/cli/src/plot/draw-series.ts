import { decimateColumns } from "./decimate.js";
import { barWidthOf } from "./domains.js";
import type { SeriesLook } from "./look.js";
import { INK } from "./palette.js";
import type { PanelPlan } from "./plan.js";
import { element, escapeXml, px } from "./svg.js";
import type { Series } from "./types.js";

// Coordinates far outside the plot are pulled in to this distance: the clip hides them
// either way, and the file never carries numbers like 1e12.
const FAR = 10_000;
const MAX_DOTS = 2000;
const MAX_AUTO_BAR = 48;

function clampFar(value: number, lo: number, hi: number): number {
  if (!Number.isFinite(value)) return value;
  return Math.min(hi + FAR, Math.max(lo - FAR, value));
}

function pixels(series: Series, plan: PanelPlan): { xs: Float64Array; ys: Float64Array } {
  const n = Math.min(series.x.length, series.y.length);
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  const { plot } = plan;
  for (let i = 0; i < n; i += 1) {
    xs[i] = clampFar(plan.x.map(series.x[i] as number), plot.x, plot.x + plot.width);
    ys[i] = clampFar(plan.y.map(series.y[i] as number), plot.y, plot.y + plot.height);
  }
  return { xs, ys };
}

function drawLine(xs: Float64Array, ys: Float64Array, look: SeriesLook, detail: number): string {
  let markup = "";
  for (const run of decimateColumns(xs, ys, 1 / detail)) {
    if (run.length >= 4) {
      let points = "";
      for (let i = 0; i < run.length; i += 2) points += `${i === 0 ? "" : " "}${px(run[i] as number)},${px(run[i + 1] as number)}`;
      markup += element("polyline", {
        points,
        fill: "none",
        stroke: look.colour,
        "stroke-width": "1.6",
        "stroke-linejoin": "round",
        "stroke-linecap": "round",
        "stroke-dasharray": look.dash,
      });
    } else {
      // A point with no finite neighbour still shows, as a dot.
      markup += element("circle", { cx: run[0] as number, cy: run[1] as number, r: 1.6, fill: look.colour });
    }
  }
  return markup;
}

function drawDots(xs: Float64Array, ys: Float64Array, look: SeriesLook): string {
  let markup = "";
  let drawn = 0;
  for (let i = 0; i < xs.length && drawn < MAX_DOTS; i += 1) {
    const x = xs[i] as number;
    const y = ys[i] as number;
    if (!Number.isFinite(x) || !Number.isFinite(y)) continue;
    markup += element("circle", { cx: x, cy: y, r: 2.6, fill: look.colour, stroke: INK.plot, "stroke-width": "0.8" });
    drawn += 1;
  }
  return markup;
}

function barPixelWidth(series: Series, plan: PanelPlan, xs: Float64Array): number {
  if (!plan.x.log) {
    const width = barWidthOf(series);
    const [d0, d1] = plan.x.domain;
    const span = (width / (d1 - d0)) * plan.plot.width;
    return series.barWidth === undefined ? Math.min(MAX_AUTO_BAR, span) : span;
  }
  const sorted = xs.filter(Number.isFinite).sort();
  let gap = Number.POSITIVE_INFINITY;
  for (let i = 1; i < sorted.length; i += 1) {
    const d = (sorted[i] as number) - (sorted[i - 1] as number);
    if (d > 0.5 && d < gap) gap = d;
  }
  return Number.isFinite(gap) ? Math.min(MAX_AUTO_BAR, 0.7 * gap) : 8;
}

function drawBars(series: Series, plan: PanelPlan, xs: Float64Array, ys: Float64Array, look: SeriesLook): string {
  const { plot } = plan;
  const bottom = plot.y + plot.height;
  const width = Math.max(1, barPixelWidth(series, plan, xs));
  const mappedBase = series.base === undefined ? bottom : plan.y.map(series.base);
  const base = Number.isFinite(mappedBase) ? Math.min(bottom + 2, Math.max(plot.y - 2, mappedBase)) : bottom;
  // More bars than pixel columns: each column keeps the bar reaching farthest from the base.
  const keep = new Map<number, number>();
  const crowded = xs.length > 2 * plot.width;
  for (let i = 0; i < xs.length; i += 1) {
    const x = xs[i] as number;
    const y = ys[i] as number;
    if (!Number.isFinite(x) || !Number.isFinite(y)) continue;
    const key = crowded ? Math.floor(x) : i;
    const held = keep.get(key);
    if (held === undefined || Math.abs(y - base) > Math.abs((ys[held] as number) - base)) keep.set(key, i);
  }
  let markup = "";
  for (const i of keep.values()) {
    const top = Math.min(bottom + 2, Math.max(plot.y - 2, ys[i] as number));
    markup += element("rect", {
      x: (xs[i] as number) - width / 2,
      y: Math.min(top, base),
      width,
      height: Math.abs(top - base),
      fill: look.colour,
      "fill-opacity": "0.55",
      stroke: look.colour,
      "stroke-width": "0.8",
    });
  }
  return markup;
}

/** One series as a group: its name as a tooltip, then lines, bars or dots; `detail` columns per pixel. */
export function drawSeries(series: Series, look: SeriesLook, plan: PanelPlan, detail = 1): string {
  const { xs, ys } = pixels(series, plan);
  let markup = series.name === "" ? "" : `<title>${escapeXml(series.name)}</title>`;
  if (look.bars) markup += drawBars(series, plan, xs, ys, look);
  else markup += drawLine(xs, ys, look, detail);
  if (series.dots === true) markup += drawDots(xs, ys, look);
  return element("g", { class: look.bars ? "series bars" : "series" }, markup);
}

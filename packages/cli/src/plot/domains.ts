import { domainOf, extentOf, include, showable, type Extent } from "./range.js";
import type { Panel, Series } from "./types.js";

/** Fraction of the data span added above and below on an automatic y axis. */
export const Y_PADDING = 0.05;

function smallestSpacing(x: ArrayLike<number>): number {
  const sorted = Float64Array.from(x).filter(Number.isFinite).sort();
  let smallest = Number.POSITIVE_INFINITY;
  for (let i = 1; i < sorted.length; i += 1) {
    const gap = (sorted[i] as number) - (sorted[i - 1] as number);
    if (gap > 0 && gap < smallest) smallest = gap;
  }
  return smallest;
}

/** Width of one bar in x units: as given, else 70 % of the closest spacing of the bars. */
export function barWidthOf(series: Series): number {
  if (series.barWidth !== undefined && series.barWidth > 0) return series.barWidth;
  const spacing = smallestSpacing(series.x);
  if (Number.isFinite(spacing)) return 0.7 * spacing;
  const only = extentOf(series.x, false)?.[0] ?? 0;
  return only === 0 ? 1 : Math.abs(only) * 0.1;
}

/** What the x axis must show: every x value and marker (bars with room for their width). */
export function xExtentOf(panel: Panel): Extent {
  const log = panel.xLog === true;
  let extent: Extent = undefined;
  for (const series of panel.series) {
    let own = extentOf(series.x, log);
    if (own !== undefined && series.style === "bars") {
      const half = barWidthOf(series) / 2;
      own = log ? [own[0] / 1.15, own[1] * 1.15] : [own[0] - half, own[1] + half];
    }
    if (own !== undefined) extent = include(include(extent, own[0], log), own[1], log);
  }
  for (const marker of panel.markers ?? []) extent = include(extent, marker.x, log);
  return extent;
}

/** Fraction of the span added at both ends of an automatic x axis that carries bars. */
export const X_PADDING_BARS = 0.03;

/** The x domain: a fixed range, or the extent (unpadded, so a line fills the width). */
export function xDomainOf(panel: Panel, extent: Extent): [number, number] {
  if (panel.xRange !== undefined) return [panel.xRange[0], panel.xRange[1]];
  const bars = panel.series.some((s) => s.style === "bars");
  return domainOf(extent, panel.xLog === true, bars ? X_PADDING_BARS : 0);
}

/** The y domain: a fixed range, or the points inside the x domain (and bar bases), padded. */
export function yDomainOf(panel: Panel, xDomain: readonly [number, number]): [number, number] {
  if (panel.yRange !== undefined) return [panel.yRange[0], panel.yRange[1]];
  const xLog = panel.xLog === true;
  const yLog = panel.yLog === true;
  const [x0, x1] = xDomain;
  const slack = (x1 - x0) * 1e-9;
  let extent: Extent = undefined;
  for (const series of panel.series) {
    const n = Math.min(series.x.length, series.y.length);
    for (let i = 0; i < n; i += 1) {
      const x = series.x[i] as number;
      if (!showable(x, xLog) || x < x0 - slack || x > x1 + slack) continue;
      extent = include(extent, series.y[i] as number, yLog);
    }
    if (series.style === "bars" && series.base !== undefined && extent !== undefined) {
      extent = include(extent, series.base, yLog);
    }
  }
  for (const level of panel.levels ?? []) extent = include(extent, level.y, yLog);
  return domainOf(widened(extent, panel.yMinSpan ?? 0, yLog), yLog, Y_PADDING);
}

/** An extent widened about its middle to at least `fraction` of its largest magnitude. */
function widened(extent: Extent, fraction: number, log: boolean): Extent {
  if (extent === undefined || log || !(fraction > 0)) return extent;
  const [lo, hi] = extent;
  const least = fraction * Math.max(Math.abs(lo), Math.abs(hi));
  if (hi - lo >= least) return extent;
  const middle = (lo + hi) / 2;
  const low = middle - least / 2;
  // Magnitudes stay non-negative: a widened axis of amplitudes does not dip below zero.
  return lo >= 0 && low < 0 ? [0, least] : [low, middle + least / 2];
}

/** Whether any series has a point the panel can draw. */
export function hasDrawablePoint(panel: Panel): boolean {
  const xLog = panel.xLog === true;
  const yLog = panel.yLog === true;
  return panel.series.some((series) => {
    const n = Math.min(series.x.length, series.y.length);
    for (let i = 0; i < n; i += 1) {
      if (showable(series.x[i] as number, xLog) && showable(series.y[i] as number, yLog)) return true;
    }
    return false;
  });
}

import { hasDrawablePoint, xDomainOf, xExtentOf, yDomainOf } from "./domains.js";
import { DEFAULT_CELL_WIDTH, DEFAULT_PANEL_HEIGHT, FONT_SIZE, SPACING, type Box } from "./geometry.js";
import { layoutLegend, legendHeight, type LegendLayout } from "./legend.js";
import { lookOf } from "./look.js";
import { domainOf, include, type Extent } from "./range.js";
import { makeScale, type Scale } from "./scale.js";
import { textWidth } from "./text.js";
import { linearTicks, logTicks, type Tick } from "./ticks.js";
import { MARKER_LABEL_ROW, MARKER_LABEL_ROWS } from "./draw-markers.js";
import { siPrefixExponent } from "../format/prefixes.js";
import { formatTickSI } from "../format/si.js";
import type { Figure, Panel } from "./types.js";

/** Everything needed to draw one panel, worked out before any markup is written. */
export interface PanelPlan {
  readonly index: number;
  readonly panel: Panel;
  readonly cell: Box;
  readonly plot: Box;
  readonly x: Scale;
  readonly y: Scale;
  readonly xTicks: readonly Tick[];
  readonly yTicks: readonly Tick[];
  readonly legend: LegendLayout;
  readonly legendTop: number;
  readonly titleBaseline: number | undefined;
  readonly showXLabels: boolean;
  readonly empty: boolean;
}

/** The figure's size and its panels' plans. */
export interface FigurePlan {
  readonly width: number;
  readonly height: number;
  readonly panels: readonly PanelPlan[];
}

const clamp = (v: number, lo: number, hi: number): number => Math.min(hi, Math.max(lo, v));

function widestLabel(ticks: readonly Tick[]): number {
  return ticks.reduce((w, t) => Math.max(w, textWidth(t.label, FONT_SIZE.tick)), 0);
}

// Blanks every other (then every fifth …) x label when neighbours would overlap.
function thinLabels(ticks: readonly Tick[], scale: Scale): Tick[] {
  const labelled = ticks.filter((t) => t.label !== "");
  if (labelled.length < 3) return [...ticks];
  const room = widestLabel(labelled) + 10;
  const gap = Math.abs(scale.map(labelled[1]?.value ?? 0) - scale.map(labelled[0]?.value ?? 0));
  const strides = [1, 2, 5, 10];
  const stride = strides.find((s) => gap * s >= room) ?? strides.length * 5;
  if (stride === 1) return [...ticks];
  let k = 0;
  return ticks.map((t) => {
    if (t.label === "") return t;
    const keep = k % stride === 0;
    k += 1;
    return keep ? t : { ...t, label: "" };
  });
}

// Pixels per labelled tick interval (linear) and per labelled decade (log), and the fewest
// intervals a short axis still gets.
const X_TICK_SPACING = { linear: 140, decade: 70, fewest: 3 } as const;
const Y_TICK_SPACING = { linear: 65, decade: 26, fewest: 4 } as const;

/** Pixels the marker labels take at the top of the plot (see `drawMarkers`), or 0 without labels. */
function labelBand(panel: Panel): number {
  const labelled = (panel.markers ?? []).filter((m) => m.label !== "").length;
  return labelled === 0 ? 0 : Math.min(labelled, MARKER_LABEL_ROWS) * MARKER_LABEL_ROW + 8;
}

/** A y domain raised so that its data stays below a band of `band` pixels at the top. */
function withHeadroom(domain: [number, number], band: number, height: number, log: boolean): [number, number] {
  if (band <= 0 || height <= 2 * band) return domain;
  const [lo, hi] = domain;
  const share = band / (height - band);
  if (log) return [lo, 10 ** (Math.log10(hi) + (Math.log10(hi) - Math.log10(lo)) * share)];
  return [lo, hi + (hi - lo) * share];
}

function ticksFor(scale: Scale, length: number, unit: string, spacing: typeof X_TICK_SPACING | typeof Y_TICK_SPACING): Tick[] {
  const [lo, hi] = scale.domain;
  if (scale.log) return logTicks(lo, hi, Math.max(2, Math.floor(length / spacing.decade)), unit);
  return linearTicks(lo, hi, clamp(length / spacing.linear, spacing.fewest, 12), unit);
}

function sharedXDomain(figure: Figure): [number, number] {
  const fixed = figure.panels.find((p) => p.xRange !== undefined);
  if (fixed !== undefined) return xDomainOf(fixed, undefined);
  const log = figure.panels[0]?.xLog === true;
  let extent: Extent = undefined;
  for (const panel of figure.panels) {
    const own = xExtentOf(panel);
    if (own !== undefined) extent = include(include(extent, own[0], log), own[1], log);
  }
  return domainOf(extent, log, 0);
}

/** Ticks at given values (a spectrum's harmonics), labelled to four digits with one prefix. */
function givenTicks(values: readonly number[], scale: Scale, unit: string): Tick[] {
  const [lo, hi] = scale.domain;
  const inside = values.filter((v) => v >= lo && v <= hi);
  const exponent = siPrefixExponent(inside.reduce((m, v) => Math.max(m, Math.abs(v)), 0));
  return inside.map((value) => ({ value, label: formatTickSI(Number(value.toPrecision(4)), unit, exponent), major: true }));
}

/** Lays out the grid of cells and, in each, the title, legend, plot area and axes. */
export function planFigure(figure: Figure): FigurePlan {
  const count = figure.panels.length;
  const columns = Math.min(figure.columns ?? 1, count);
  const width = figure.width ?? DEFAULT_CELL_WIDTH * columns;
  const cellWidth = width / columns;
  const rows = Math.ceil(count / columns);
  const rowHeights: number[] = [];
  for (let r = 0; r < rows; r += 1) {
    const inRow = figure.panels.slice(r * columns, (r + 1) * columns);
    rowHeights.push(Math.max(...inRow.map((p) => p.height ?? figure.panelHeight ?? DEFAULT_PANEL_HEIGHT)));
  }
  const rowTops = rowHeights.map((_, r) => SPACING.figureTitleBand + rowHeights.slice(0, r).reduce((a, b) => a + b, 0));
  const shared = figure.sharedX === true ? sharedXDomain(figure) : undefined;

  // First pass: everything that does not depend on the left margin.
  const drafts = figure.panels.map((panel, index) => {
    const row = Math.floor(index / columns);
    const column = index % columns;
    const cell: Box = { x: column * cellWidth, y: rowTops[row] ?? 0, width: cellWidth, height: rowHeights[row] ?? 0 };
    const showXLabels = figure.sharedX !== true || index + columns >= count;
    const xDomain = shared ?? xDomainOf(panel, xExtentOf(panel));
    const yDomain = yDomainOf(panel, xDomain);
    const legend = layoutLegend(
      panel.series.map((s, k) => ({ name: s.name, look: lookOf(s, k) })),
      cellWidth - 2 * SPACING.cellPad - 80,
    );
    let top = cell.y + SPACING.topPad;
    const titleBaseline = panel.title === undefined || panel.title === "" ? undefined : top + FONT_SIZE.panelTitle;
    if (titleBaseline !== undefined) top += SPACING.titleBand;
    const legendTop = top;
    top += legendHeight(legend) + 8;
    const bottomBand = showXLabels ? SPACING.tickGap + FONT_SIZE.tick + 12 + FONT_SIZE.axisTitle + 10 : 14;
    const plotHeight = Math.max(40, cell.y + cell.height - bottomBand - top);
    const y = makeScale(panel.yLog === true, panel.yRange === undefined ? withHeadroom(yDomain, labelBand(panel), plotHeight, panel.yLog === true) : yDomain, top + plotHeight, top);
    const yTicks = ticksFor(y, plotHeight, panel.yUnit, Y_TICK_SPACING);
    const leftNeed = SPACING.cellPad + FONT_SIZE.axisTitle + 12 + widestLabel(yTicks) + SPACING.tickGap + SPACING.tickLength;
    return { index, panel, cell, column, showXLabels, xDomain, y, yTicks, legend, legendTop, titleBaseline, top, plotHeight, leftNeed };
  });

  // Panels in one column share their left margin, so stacked x axes line up.
  const leftOfColumn = new Map<number, number>();
  for (const d of drafts) leftOfColumn.set(d.column, Math.max(leftOfColumn.get(d.column) ?? 0, d.leftNeed));

  const panels = drafts.map((d): PanelPlan => {
    const left = leftOfColumn.get(d.column) ?? d.leftNeed;
    const cellRight = d.cell.x + d.cell.width;
    let plotWidth = Math.max(40, d.cell.width - left - SPACING.rightPad);
    let x = makeScale(d.panel.xLog === true, d.xDomain, d.cell.x + left, d.cell.x + left + plotWidth);
    const xTicksOf = (scale: Scale): Tick[] => thinLabels(d.panel.xTicks === undefined ? ticksFor(scale, plotWidth, d.panel.xUnit, X_TICK_SPACING) : givenTicks(d.panel.xTicks, scale, d.panel.xUnit), scale);
    let xTicks = xTicksOf(x);
    // A wide last label ("1.005 kHz") narrows the plot rather than running out of the cell.
    const overflow = Math.max(...xTicks.filter((t) => t.label !== "").map((t) => x.map(t.value) + textWidth(t.label, FONT_SIZE.tick) / 2 - (cellRight - 6)), 0);
    if (d.showXLabels && overflow > 0) {
      plotWidth = Math.max(40, plotWidth - overflow);
      x = makeScale(d.panel.xLog === true, d.xDomain, d.cell.x + left, d.cell.x + left + plotWidth);
      xTicks = xTicksOf(x);
    }
    const plot: Box = { x: d.cell.x + left, y: d.top, width: plotWidth, height: d.plotHeight };
    return {
      index: d.index,
      panel: d.panel,
      cell: d.cell,
      plot,
      x,
      y: d.y,
      xTicks,
      yTicks: d.yTicks,
      legend: d.legend,
      legendTop: d.legendTop,
      titleBaseline: d.titleBaseline,
      showXLabels: d.showXLabels,
      empty: !hasDrawablePoint(d.panel),
    };
  });
  const height = SPACING.figureTitleBand + rowHeights.reduce((a, b) => a + b, 0) + SPACING.figureBottom;
  return { width, height, panels };
}

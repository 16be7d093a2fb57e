import type { Figure, Panel } from "./types.js";

function fail(rule: string): never {
  throw new RangeError(`renderFigure: ${rule}`);
}

function checkRange(where: string, range: readonly [number, number] | undefined, log: boolean): void {
  if (range === undefined) return;
  const [lo, hi] = range;
  if (!(Number.isFinite(lo) && Number.isFinite(hi) && lo < hi)) fail(`${where} must be two finite numbers, low < high, got [${lo}, ${hi}]`);
  if (log && !(lo > 0)) fail(`${where} of a log axis must be above zero, got [${lo}, ${hi}]`);
}

function checkPanel(panel: Panel, index: number): void {
  const where = `panel ${index + 1}`;
  checkRange(`${where} xRange`, panel.xRange, panel.xLog === true);
  checkRange(`${where} yRange`, panel.yRange, panel.yLog === true);
  if (panel.height !== undefined && !(panel.height > 0 && Number.isFinite(panel.height))) fail(`${where} height must be a positive number, got ${panel.height}`);
  for (const series of panel.series) {
    if (series.x.length !== series.y.length) {
      fail(`${where} series ${JSON.stringify(series.name)} has ${series.x.length} x values and ${series.y.length} y values`);
    }
  }
}

/** Checks a figure at the public entry, so the layout code can trust it. */
export function validateFigure(figure: Figure): void {
  if (figure.panels.length === 0) fail("a figure needs at least one panel");
  const columns = figure.columns ?? 1;
  if (!(Number.isInteger(columns) && columns >= 1)) fail(`columns must be a positive integer, got ${columns}`);
  if (figure.width !== undefined && !(figure.width > 0 && Number.isFinite(figure.width))) fail(`width must be a positive number, got ${figure.width}`);
  if (figure.panelHeight !== undefined && !(figure.panelHeight > 0 && Number.isFinite(figure.panelHeight))) {
    fail(`panelHeight must be a positive number, got ${figure.panelHeight}`);
  }
  figure.panels.forEach(checkPanel);
}

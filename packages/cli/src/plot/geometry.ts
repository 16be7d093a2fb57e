/** A rectangle in pixels. */
export interface Box {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

/** Font sizes in pixels, in one place so spacing follows them. */
export const FONT_SIZE = { figureTitle: 17, panelTitle: 13.5, axisTitle: 12.5, tick: 11.5, legend: 12, marker: 11.5, note: 13 } as const;

/** Fixed spacing in pixels. */
export const SPACING = {
  figureTitleBand: 46,
  figureBottom: 8,
  cellPad: 12,
  titleBand: 22,
  legendRow: 18,
  tickLength: 4,
  tickGap: 7,
  rightPad: 28,
  topPad: 10,
} as const;

/** Default figure dimensions. */
export const DEFAULT_CELL_WIDTH = 900;
export const DEFAULT_PANEL_HEIGHT = 500;

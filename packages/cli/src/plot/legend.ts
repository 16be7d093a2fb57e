import { textWidth } from "./text.js";
import { FONT_SIZE, SPACING } from "./geometry.js";
import type { SeriesLook } from "./look.js";

/** A legend entry placed relative to the legend's top-left corner. */
export interface PlacedEntry {
  readonly look: SeriesLook;
  readonly name: string;
  readonly dx: number;
  readonly row: number;
}

/** Entries laid out in rows that wrap at `width`. */
export interface LegendLayout {
  readonly entries: readonly PlacedEntry[];
  readonly rows: number;
}

const SWATCH = 22;
const SWATCH_GAP = 6;
const ENTRY_GAP = 18;

/** One entry per distinct named look, in series order, wrapped into rows. */
export function layoutLegend(items: readonly { name: string; look: SeriesLook }[], width: number): LegendLayout {
  const seen = new Set<string>();
  const entries: PlacedEntry[] = [];
  let dx = 0;
  let row = 0;
  for (const { name, look } of items) {
    const key = `${name}\u0000${look.colour}\u0000${look.dash ?? ""}\u0000${look.bars}`;
    if (name === "" || seen.has(key)) continue;
    seen.add(key);
    const entryWidth = SWATCH + SWATCH_GAP + textWidth(name, FONT_SIZE.legend);
    if (dx > 0 && dx + entryWidth > width) {
      row += 1;
      dx = 0;
    }
    entries.push({ look, name, dx, row });
    dx += entryWidth + ENTRY_GAP;
  }
  return { entries, rows: entries.length === 0 ? 0 : row + 1 };
}

/** Height the legend takes, including its gap below. */
export function legendHeight(layout: LegendLayout): number {
  return layout.rows === 0 ? 0 : layout.rows * SPACING.legendRow + 4;
}

/** Geometry of the swatch, shared with the renderer. */
export const LEGEND_SWATCH = { width: SWATCH, gap: SWATCH_GAP } as const;

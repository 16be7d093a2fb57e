/**
 * Onset's own palette: six muted tones (blue, orange, sage, wine, rose, olive). Every pair is
 * more than 20 CIELAB ΔE apart (about 24 at worst) for normal vision and under simulated
 * protanopia, deuteranopia and tritanopia, as the tests check. Lines also change dash pattern
 * with their index, so a greyscale print still separates them.
 */
export const SERIES_TONES: readonly string[] = ["#2d6a9f", "#d07a2b", "#7a9c64", "#7c3a5a", "#bf819d", "#4e541c"];

/** Dash patterns by style; automatic lines cycle through {@link AUTO_DASHES}. */
export const DASHES = { line: undefined, dashed: "7 4", dotted: "1.6 3" } as const;

/** Dash patterns given to lines without a style, by their index in the panel. */
export const AUTO_DASHES: readonly (string | undefined)[] = [undefined, "7 4", "1.6 3", "10 3 2 3"];

/** Colours of everything that is not data. */
export const INK = {
  text: "#2b2d33",
  mutedText: "#62666e",
  axis: "#8a8d93",
  frame: "#cfd0d3",
  grid: "#e7e8ea",
  minorGrid: "#f1f2f3",
  zeroLine: "#b9bbc0",
  background: "#fafaf8",
  plot: "#ffffff",
  marker: "#4d5361",
} as const;

/** The one font stack: generic families only. */
export const FONT_FAMILY = "system-ui, sans-serif";

/** The colour of palette slot `tone` (wrapping around). */
export function toneColour(tone: number): string {
  const count = SERIES_TONES.length;
  return SERIES_TONES[((Math.trunc(tone) % count) + count) % count] ?? "#2d6a9f";
}

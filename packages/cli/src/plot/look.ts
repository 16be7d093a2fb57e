import { AUTO_DASHES, DASHES, INK, toneColour } from "./palette.js";
import type { Series } from "./types.js";

/** How a series is painted. */
export interface SeriesLook {
  readonly colour: string;
  readonly dash: string | undefined;
  readonly bars: boolean;
}

/** The look of the `index`-th series of a panel. */
export function lookOf(series: Series, index: number): SeriesLook {
  const colour = series.muted === true ? INK.axis : toneColour(series.tone ?? index);
  if (series.style === "bars") return { colour, dash: undefined, bars: true };
  const dash = series.style === undefined ? AUTO_DASHES[index % AUTO_DASHES.length] : DASHES[series.style];
  return { colour, dash, bars: false };
}

/** How a series is drawn. Without a style, lines get a dash pattern by their place in the panel. */
export type SeriesStyle = "line" | "dashed" | "dotted" | "bars";

/** One set of points. Non-finite points (and non-positive ones on a log axis) break the line. */
export interface Series {
  /** Shown in the legend; an empty name leaves the series out of it. */
  readonly name: string;
  readonly x: ArrayLike<number>;
  readonly y: ArrayLike<number>;
  readonly style?: SeriesStyle;
  /** Palette slot (0–5); by default the series' index in its panel. */
  readonly tone?: number;
  /** A dot on every finite point, for short series such as a sweep of a few steps. */
  readonly dots?: boolean;
  /** Bars: width in x units (a histogram's bin width). By default 70 % of the closest spacing. */
  readonly barWidth?: number;
  /** Bars: the level they grow from. By default the bottom of the y axis. */
  readonly base?: number;
  /** Drawn in the muted grey of the axes: data shown for completeness, not to be read as a result. */
  readonly muted?: boolean;
}

/** A labelled vertical line at an x value: an event ("settled 20.1 ms") or a limit ("max"). */
export interface Marker {
  readonly x: number;
  readonly label: string;
}

/** A labelled horizontal line at a y value: a floor, a required level. */
export interface Level {
  readonly y: number;
  readonly label: string;
}

/** One plot area with its axes, legend and markers. */
export interface Panel {
  readonly title?: string;
  readonly xLabel: string;
  /** Unit of the x values, printed with an SI prefix on each tick (`s`, `Hz`; `""` for none). */
  readonly xUnit: string;
  readonly yLabel: string;
  readonly yUnit: string;
  readonly series: readonly Series[];
  readonly markers?: readonly Marker[];
  readonly levels?: readonly Level[];
  /** x ticks at these values (a spectrum's harmonics) instead of round numbers. */
  readonly xTicks?: readonly number[];
  /**
   * Smallest span of an automatic y axis as a fraction of its largest value, so a change of
   * 0.1 % does not fill the axis as if it were large. @defaultValue 0
   */
  readonly yMinSpan?: number;
  readonly xLog?: boolean;
  readonly yLog?: boolean;
  /** Fixed x range; by default the data and markers, unpadded (bars get room for their width). */
  readonly xRange?: readonly [number, number];
  /** Fixed y range; by default the data with 5 % padding on each side. */
  readonly yRange?: readonly [number, number];
  /** Height of the panel's cell in pixels; a row takes its tallest panel. */
  readonly height?: number;
}

/** A whole picture: a title and panels in a grid, filled row by row. */
export interface Figure {
  readonly title: string;
  readonly panels: readonly Panel[];
  /** @defaultValue 1 */
  readonly columns?: number;
  /** Total width in pixels. @defaultValue 900 per column */
  readonly width?: number;
  /** Default cell height in pixels. @defaultValue 500 */
  readonly panelHeight?: number;
  /**
   * Panels share one x range; only the bottom panel of each column prints x tick labels and
   * the x axis title.
   */
  readonly sharedX?: boolean;
  /**
   * Line columns kept per pixel: 1 for a picture, more for a page that zooms into it (each
   * step of zoom then still has points to show). @defaultValue 1
   */
  readonly detail?: number;
  /** A name unique in the page the figure is embedded in; its clip ids derive from it. */
  readonly id?: string;
}

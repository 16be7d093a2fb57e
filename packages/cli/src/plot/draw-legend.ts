import { FONT_SIZE, SPACING } from "./geometry.js";
import { LEGEND_SWATCH } from "./legend.js";
import { INK } from "./palette.js";
import type { PanelPlan } from "./plan.js";
import { element, textElement } from "./svg.js";

/** The legend row(s) above the plot, aligned with its left edge. */
export function drawLegend(plan: PanelPlan): string {
  if (plan.legend.entries.length === 0) return "";
  let markup = "";
  for (const entry of plan.legend.entries) {
    const x = plan.plot.x + entry.dx;
    const middle = plan.legendTop + entry.row * SPACING.legendRow + SPACING.legendRow / 2;
    const swatch = entry.look.bars
      ? element("rect", { x: x + 5, y: middle - 5, width: 12, height: 10, fill: entry.look.colour, "fill-opacity": "0.55", stroke: entry.look.colour, "stroke-width": "0.8" })
      : element("line", { x1: x, y1: middle, x2: x + LEGEND_SWATCH.width, y2: middle, stroke: entry.look.colour, "stroke-width": "2", "stroke-dasharray": entry.look.dash });
    const label = textElement(
      { x: x + LEGEND_SWATCH.width + LEGEND_SWATCH.gap, y: middle + FONT_SIZE.legend * 0.35, "font-size": FONT_SIZE.legend, fill: INK.text },
      entry.name,
    );
    markup += element("g", { class: "legend-entry" }, swatch + label);
  }
  return element("g", { class: "legend" }, markup);
}

import { drawGrid, drawXAxis, drawYAxis } from "./draw-axes.js";
import { drawLegend } from "./draw-legend.js";
import { drawLevels, drawMarkers } from "./draw-markers.js";
import { drawSeries } from "./draw-series.js";
import { FONT_SIZE } from "./geometry.js";
import { lookOf } from "./look.js";
import { INK } from "./palette.js";
import type { PanelPlan } from "./plan.js";
import { element, px, textElement } from "./svg.js";

/**
 * What a page script needs to zoom and read a panel: its plot box in pixels and its axes'
 * domains, as data attributes of the panel's group (a plain SVG viewer ignores them).
 */
function panelData(plan: PanelPlan): Record<string, string> {
  const { plot, panel } = plan;
  const box = [plot.x, plot.y, plot.width, plot.height].map(px).join(" ");
  return {
    "data-plot": box,
    "data-x": `${plan.x.domain[0]} ${plan.x.domain[1]}${plan.x.log ? " log" : ""}`,
    "data-y": `${plan.y.domain[0]} ${plan.y.domain[1]}${plan.y.log ? " log" : ""}`,
    "data-x-unit": panel.xUnit,
    "data-y-unit": panel.yUnit,
  };
}

/**
 * One panel as a `<g class="panel">`; `clipId` must be unique in the document. `detail` is
 * how many columns a line keeps per pixel (more than 1 for a page that zooms in).
 */
export function renderPanel(plan: PanelPlan, clipId: string, detail = 1): string {
  const { plot, panel } = plan;
  const area = { x: plot.x, y: plot.y, width: plot.width, height: plot.height };
  let markup = element("defs", {}, element("clipPath", { id: clipId }, element("rect", area)));
  if (plan.titleBaseline !== undefined && panel.title !== undefined) {
    markup += textElement(
      { class: "panel-title", x: plot.x, y: plan.titleBaseline, "font-size": FONT_SIZE.panelTitle, "font-weight": "600", fill: INK.text },
      panel.title,
    );
  }
  markup += drawLegend(plan);
  markup += element("rect", { ...area, class: "plot-area", fill: INK.plot });
  markup += drawGrid(plan);
  const data = panel.series.map((series, k) => drawSeries(series, lookOf(series, k), plan, detail)).join("");
  // The inner group is what a page script stretches to zoom; the clip stays with the plot box.
  markup += element("g", { class: "data", "clip-path": `url(#${clipId})` }, element("g", { class: "zoom" }, data));
  markup += drawLevels(plan);
  markup += drawMarkers(plan);
  markup += element("rect", { ...area, fill: "none", stroke: INK.frame, "stroke-width": "0.8", "shape-rendering": "crispEdges" });
  markup += drawXAxis(plan);
  markup += drawYAxis(plan);
  if (plan.empty) {
    markup += textElement(
      { class: "no-data", x: plot.x + plot.width / 2, y: plot.y + plot.height / 2, "text-anchor": "middle", "font-size": FONT_SIZE.note, fill: INK.mutedText },
      "no data",
    );
  }
  return element("g", { class: "panel", ...panelData(plan) }, markup);
}

import { drawGrid, drawXAxis, drawYAxis } from "./draw-axes.js";
import { drawLegend } from "./draw-legend.js";
import { drawMarkers } from "./draw-markers.js";
import { drawSeries } from "./draw-series.js";
import { FONT_SIZE } from "./geometry.js";
import { lookOf } from "./look.js";
import { INK } from "./palette.js";
import type { PanelPlan } from "./plan.js";
import { element, textElement } from "./svg.js";

/** One panel as a `<g class="panel">`; `clipId` must be unique in the document. */
export function renderPanel(plan: PanelPlan, clipId: string): string {
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
  markup += element("rect", { ...area, fill: INK.plot });
  markup += drawGrid(plan);
  const data = panel.series.map((series, k) => drawSeries(series, lookOf(series, k), plan)).join("");
  markup += element("g", { class: "data", "clip-path": `url(#${clipId})` }, data);
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
  return element("g", { class: "panel" }, markup);
}

import { FONT_SIZE, SPACING } from "./geometry.js";
import { INK } from "./palette.js";
import type { PanelPlan } from "./plan.js";
import { element, textElement } from "./svg.js";

/** Grid lines behind the data: faint minor lines, major lines, and a line at y = 0. */
export function drawGrid(plan: PanelPlan): string {
  const { plot } = plan;
  const right = plot.x + plot.width;
  const bottom = plot.y + plot.height;
  let markup = "";
  for (const major of [false, true]) {
    const stroke = major ? INK.grid : INK.minorGrid;
    const width = major ? "0.8" : "0.6";
    for (const tick of plan.xTicks) {
      if (tick.major !== major) continue;
      const x = plan.x.map(tick.value);
      markup += element("line", { class: "x-grid", x1: x, y1: plot.y, x2: x, y2: bottom, stroke, "stroke-width": width });
    }
    for (const tick of plan.yTicks) {
      if (tick.major !== major) continue;
      const y = plan.y.map(tick.value);
      markup += element("line", { x1: plot.x, y1: y, x2: right, y2: y, stroke, "stroke-width": width });
    }
  }
  const [y0, y1] = plan.y.domain;
  if (!plan.y.log && y0 < 0 && y1 > 0) {
    const y = plan.y.map(0);
    markup += element("line", { x1: plot.x, y1: y, x2: right, y2: y, stroke: INK.zeroLine, "stroke-width": "0.9" });
  }
  return element("g", { class: "grid", "shape-rendering": "crispEdges" }, markup);
}

/** Tick marks, tick labels and the axis title below the plot. */
export function drawXAxis(plan: PanelPlan): string {
  const { plot, cell } = plan;
  const bottom = plot.y + plot.height;
  let marks = "";
  let labels = "";
  for (const tick of plan.xTicks) {
    const x = plan.x.map(tick.value);
    const length = tick.major ? SPACING.tickLength : SPACING.tickLength / 2;
    marks += element("line", { x1: x, y1: bottom, x2: x, y2: bottom + length, stroke: INK.axis, "stroke-width": "0.8" });
    if (plan.showXLabels && tick.label !== "") {
      labels += textElement(
        { class: "tick-label", x, y: bottom + SPACING.tickGap + FONT_SIZE.tick, "text-anchor": "middle", "font-size": FONT_SIZE.tick, fill: INK.mutedText },
        tick.label,
      );
    }
  }
  let markup = element("g", { class: "tick-marks" }, marks) + labels;
  if (plan.showXLabels && plan.panel.xLabel !== "") {
    markup += textElement(
      { class: "axis-title", x: plot.x + plot.width / 2, y: cell.y + cell.height - 10, "text-anchor": "middle", "font-size": FONT_SIZE.axisTitle, fill: INK.text },
      plan.panel.xLabel,
    );
  }
  return element("g", { class: "x-axis" }, markup);
}

/** Tick marks, tick labels and the rotated axis title left of the plot. */
export function drawYAxis(plan: PanelPlan): string {
  const { plot, cell } = plan;
  let marks = "";
  let labels = "";
  for (const tick of plan.yTicks) {
    const y = plan.y.map(tick.value);
    const length = tick.major ? SPACING.tickLength : SPACING.tickLength / 2;
    marks += element("line", { x1: plot.x - length, y1: y, x2: plot.x, y2: y, stroke: INK.axis, "stroke-width": "0.8" });
    if (tick.label !== "") {
      labels += textElement(
        { class: "tick-label", x: plot.x - SPACING.tickGap - SPACING.tickLength / 2, y: y + FONT_SIZE.tick * 0.35, "text-anchor": "end", "font-size": FONT_SIZE.tick, fill: INK.mutedText },
        tick.label,
      );
    }
  }
  let markup = element("g", { class: "tick-marks" }, marks) + labels;
  if (plan.panel.yLabel !== "") {
    const x = cell.x + SPACING.cellPad + FONT_SIZE.axisTitle * 0.8;
    const y = plot.y + plot.height / 2;
    markup += textElement(
      { class: "axis-title", x, y, transform: `rotate(-90 ${x.toFixed(1)} ${y.toFixed(1)})`, "text-anchor": "middle", "font-size": FONT_SIZE.axisTitle, fill: INK.text },
      plan.panel.yLabel,
    );
  }
  return element("g", { class: "y-axis" }, markup);
}

import { FONT_SIZE } from "./geometry.js";
import { INK } from "./palette.js";
import type { PanelPlan } from "./plan.js";
import { element, textElement } from "./svg.js";
import { textWidth } from "./text.js";

/** Rows the marker labels step through, and their height: the plan keeps that band free of data. */
export const MARKER_LABEL_ROWS = 3;
export const MARKER_LABEL_ROW = 16;

/**
 * Vertical dashed lines with their labels near the top of the plot. Labels step down through
 * three rows in x order, so neighbouring markers ("start-up", "settled") do not collide, and
 * flip to the left of their line near the right edge.
 */
export function drawMarkers(plan: PanelPlan): string {
  const { plot } = plan;
  const right = plot.x + plot.width;
  const [lo, hi] = plan.x.domain;
  const visible = (plan.panel.markers ?? []).filter((m) => Number.isFinite(plan.x.map(m.x)) && m.x >= lo && m.x <= hi);
  const sorted = [...visible].sort((a, b) => a.x - b.x);
  let markup = "";
  sorted.forEach((marker, k) => {
    const x = plan.x.map(marker.x);
    let group = element("line", {
      x1: x,
      y1: plot.y,
      x2: x,
      y2: plot.y + plot.height,
      stroke: INK.marker,
      "stroke-width": "1.2",
      "stroke-dasharray": "5 3",
    });
    if (marker.label !== "") {
      const width = textWidth(marker.label, FONT_SIZE.marker);
      const leftward = x + 5 + width > right;
      const textX = leftward ? x - 5 : x + 5;
      const baseline = plot.y + 15 + (k % MARKER_LABEL_ROWS) * MARKER_LABEL_ROW;
      group += element("rect", {
        x: leftward ? textX - width - 3 : textX - 3,
        y: baseline - FONT_SIZE.marker,
        width: width + 6,
        height: FONT_SIZE.marker + 4,
        rx: 2,
        fill: INK.plot,
        "fill-opacity": "0.85",
      });
      group += textElement(
        { class: "marker-label", x: textX, y: baseline, "text-anchor": leftward ? "end" : "start", "font-size": FONT_SIZE.marker, fill: INK.marker },
        marker.label,
      );
    }
    markup += element("g", { class: "marker", "data-x": String(marker.x) }, group);
  });
  return element("g", { class: "markers" }, markup);
}

/** Horizontal dashed lines with their labels at the right end, above the line. */
export function drawLevels(plan: PanelPlan): string {
  const { plot } = plan;
  const [lo, hi] = plan.y.domain;
  let markup = "";
  for (const level of plan.panel.levels ?? []) {
    if (!(level.y >= lo && level.y <= hi)) continue;
    const y = plan.y.map(level.y);
    let group = element("line", { x1: plot.x, y1: y, x2: plot.x + plot.width, y2: y, stroke: INK.marker, "stroke-width": "1.2", "stroke-dasharray": "2 3" });
    if (level.label !== "") {
      const width = textWidth(level.label, FONT_SIZE.marker);
      const x = plot.x + plot.width - 6;
      group += element("rect", { x: x - width - 3, y: y - FONT_SIZE.marker - 5, width: width + 6, height: FONT_SIZE.marker + 4, rx: 2, fill: INK.plot, "fill-opacity": "0.85" });
      group += textElement({ class: "level-label", x, y: y - 5, "text-anchor": "end", "font-size": FONT_SIZE.marker, fill: INK.marker }, level.label);
    }
    markup += element("g", { class: "level" }, group);
  }
  return markup === "" ? "" : element("g", { class: "levels" }, markup);
}

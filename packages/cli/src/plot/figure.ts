import { FONT_SIZE, SPACING } from "./geometry.js";
import { FONT_FAMILY, INK } from "./palette.js";
import { renderPanel } from "./panel.js";
import { planFigure } from "./plan.js";
import { element, escapeXml, textElement } from "./svg.js";
import type { Figure } from "./types.js";
import { validateFigure } from "./validate.js";

// FNV-1a (Fowler, Noll, Vo), 32 bit: a stable short tag so clip ids of two figures embedded
// in one page do not collide, while the same figure always gives the same file.
function tagOf(text: string): string {
  let hash = 0x811c9dc5;
  for (let i = 0; i < text.length; i += 1) {
    hash ^= text.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193);
  }
  return (hash >>> 0).toString(36);
}

/**
 * A figure as a standalone SVG 1.1 document: panels in a grid (row by row), each with its
 * axes, SI-prefixed tick labels, legend and markers.
 *
 * @remarks
 * Lines are reduced to a few points per pixel column (see `decimateColumns`), so a million
 * samples give a file of tens of kilobytes. Non-finite points break lines; a panel without a
 * drawable point says "no data". All text is escaped.
 *
 * @throws RangeError when the figure breaks a rule (no panels, x and y of different lengths,
 * a fixed range that is empty or not positive on a log axis); the message starts with
 * `renderFigure:`.
 */
export function renderFigure(figure: Figure): string {
  validateFigure(figure);
  const plan = planFigure(figure);
  const tag = tagOf(`${figure.id === undefined ? "" : `${figure.id}\u0000`}${figure.title}\u0000${figure.panels.length}`);
  const title = textElement(
    { class: "figure-title", x: SPACING.cellPad + 4, y: 29, "font-size": FONT_SIZE.figureTitle, "font-weight": "600", fill: INK.text },
    figure.title,
  );
  const body =
    `<title>${escapeXml(figure.title)}</title>` +
    element("rect", { width: plan.width, height: plan.height, fill: INK.background }) +
    title +
    plan.panels.map((p) => renderPanel(p, `onset-${tag}-plot${p.index + 1}`, figure.detail ?? 1)).join("");
  const svg = element(
    "svg",
    {
      xmlns: "http://www.w3.org/2000/svg",
      version: "1.1",
      width: Math.round(plan.width),
      height: Math.round(plan.height),
      viewBox: `0 0 ${Math.round(plan.width)} ${Math.round(plan.height)}`,
      "font-family": FONT_FAMILY,
    },
    body,
  );
  return `<?xml version="1.0" encoding="UTF-8"?>\n${svg}\n`;
}

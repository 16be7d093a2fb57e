import { describe, expect, it } from "vitest";
import { renderFigure } from "../../../../packages/cli/src/plot/figure.js";
import { polesPanel } from "../../../../packages/cli/src/plot/figures/poles.js";
import { byClass, byName, parseSvg, type SvgNode } from "../svg-tree.js";

// A Wien bridge of our own just above its threshold: the pair σ ± jω with σ = 830 /s,
// ω = 2π·2439 rad/s, one far op-amp pole at −2·10⁶ /s.
const dominant = { real: 830, imag: 2 * Math.PI * 2439 };
const poles = [dominant, { real: 830, imag: -dominant.imag }, { real: -2e6, imag: 0 }, { real: -5000, imag: 0 }];

describe("polesPanel(poles, dominant)", () => {
  const panel = polesPanel(poles, dominant);
  const plot = byClass(parseSvg(renderFigure({ title: "poles", panels: [panel] })), "panel")[0] as SvgNode;

  it("marks the imaginary axis at real part 0", () => {
    expect(panel.markers).toEqual([{ x: 0, label: "imaginary axis: grows to the right" }]);
  });

  it("draws the dominant pair and the near poles as dots, and counts the far ones in the title", () => {
    expect(panel.series[0]!.x.length).toBe(3);
    expect(Array.from(panel.series[1]!.x)).toEqual([-5000]);
    expect(panel.title).toMatch(/^poles \(1 more beyond /);
    expect(byName(plot, "circle").length).toBeGreaterThanOrEqual(3);
  });

  it("shows the pair right of the axis when it grows", () => {
    const [lo, hi] = panel.xRange!;
    expect(lo).toBeLessThan(0);
    expect(hi).toBeGreaterThan(dominant.real);
  });
});

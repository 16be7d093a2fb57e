import { describe, expect, it } from "vitest";
import { renderFigure } from "../../../../packages/cli/src/plot/figure.js";
import { toleranceFigure } from "../../../../packages/cli/src/plot/figures/tolerance.js";
import { byClass, byName, parseSvg, type SvgNode } from "../svg-tree.js";

const runs = 200;
const spread = (k: number): number => ((k * 37) % 101) / 100 - 0.5;

describe("toleranceFigure(input)", () => {
  const figure = toleranceFigure({
    title: "Monte Carlo",
    frequency: Float64Array.from({ length: runs }, (_, k) => 1000 + 20 * spread(k)),
    amplitude: Float64Array.from({ length: runs }, (_, k) => 4 + 0.4 * spread(k)),
    thd: Float64Array.from({ length: runs }, (_, k) => 0.004 + 0.001 * spread(k)),
    startupTime: Float64Array.from({ length: runs }, (_, k) => (k < 5 ? Number.NaN : 0.015 + 0.004 * spread(k))),
    limits: { frequency: { min: 980, max: 1020 }, thd: { max: 0.005, maxLabel: "< 0.5 %" }, startupTime: { max: 0.04 } },
    bins: 8,
  });
  const root = parseSvg(renderFigure(figure));
  const panels = byClass(root, "panel");

  it("lays four histograms out in a 2 × 2 grid", () => {
    expect(panels).toHaveLength(4);
    expect(figure.columns).toBe(2);
    expect(byClass(root, "panel-title").map((t) => t.text)).toEqual(["frequency", "amplitude", "THD", "start-up time (5 of 200 runs without a value)"]);
  });

  it("counts every run that has a value, in the requested bins", () => {
    const counts = figure.panels.map((p) => Array.from(p.series[0]?.y ?? []).reduce((a, b) => a + b, 0));
    expect(counts).toEqual([200, 200, 200, 195]);
    expect(panels.map((p) => byName(byClass(p, "series")[0] as SvgNode, "rect").length)).toEqual([8, 8, 8, 8]);
  });

  it("draws the spec limits as labelled lines, THD limits in percent", () => {
    expect(panels.map((p) => byClass(p, "marker-label").map((m) => m.text))).toEqual([["min", "max"], [], ["< 0.5 %"], ["max"]]);
    expect(figure.panels[2]?.markers?.[0]?.x).toBeCloseTo(0.5, 12);
  });
});

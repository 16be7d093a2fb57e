import { describe, expect, it } from "vitest";
import { renderFigure } from "../../../../packages/cli/src/plot/figure.js";
import { transientFigure } from "../../../../packages/cli/src/plot/figures/transient.js";
import { byClass, parseSvg, type SvgNode } from "../svg-tree.js";

const time = Float64Array.from({ length: 201 }, (_, i) => i * 5e-5);
const wave = Float64Array.from(time, (t) => Math.sin(2 * Math.PI * 500 * t));

describe("transientFigure(input)", () => {
  it("puts probes of one unit in one panel with a legend entry each", () => {
    const figure = transientFigure({ title: "t", time, probes: [{ name: "out", unit: "V", values: wave }, { name: "o-ref", unit: "V", values: wave.map((v) => v / 3) }] });
    expect(figure.panels).toHaveLength(1);
    const root = parseSvg(renderFigure(figure));
    expect(byClass(root, "legend-entry")).toHaveLength(2);
    expect(byClass(root, "axis-title").map((t) => t.text)).toEqual(["time", "voltage"]);
  });

  it("stacks voltages and currents in panels of their own on one time axis", () => {
    const figure = transientFigure({ title: "t", time, probes: [{ name: "out", unit: "V", values: wave }, { name: "R1.i", unit: "A", values: wave.map((v) => v * 1e-3) }] });
    expect(figure.panels.map((p) => p.yUnit)).toEqual(["V", "A"]);
    expect(figure.sharedX).toBe(true);
    const [, currents] = byClass(parseSvg(renderFigure(figure)), "panel") as [SvgNode, SvgNode];
    expect(byClass(byClass(currents, "y-axis")[0] as SvgNode, "tick-label").map((t) => t.text)).toContain("1 mA");
  });

  it("renders a figure without probes", () => {
    const root = parseSvg(renderFigure(transientFigure({ title: "nothing", time: [], probes: [] })));
    expect(byClass(root, "no-data")).toHaveLength(1);
  });
});

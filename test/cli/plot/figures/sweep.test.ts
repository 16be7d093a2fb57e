import { describe, expect, it } from "vitest";
import { renderFigure } from "../../../../packages/cli/src/plot/figure.js";
import { sweepFigure } from "../../../../packages/cli/src/plot/figures/sweep.js";
import { byClass, byName, parseSvg, type SvgNode } from "../svg-tree.js";

const setting = Float64Array.from({ length: 11 }, (_, k) => 20e3 + k * 2e3);
const starts = (r: number): boolean => r >= 29e3;

describe("sweepFigure(input)", () => {
  const figure = sweepFigure({
    title: "sweep",
    setting: { name: "R2", unit: "\u03a9", values: setting },
    amplitude: setting.map((r) => (starts(r) ? (r - 28e3) / 2e3 : Number.NaN)),
    frequency: setting.map((r) => (starts(r) ? 1000 : Number.NaN)),
    thd: setting.map((r) => (starts(r) ? 0.001 * (r - 28e3) / 1e3 : Number.NaN)),
    threshold: 29.1e3,
  });
  const root = parseSvg(renderFigure(figure));
  const panels = byClass(root, "panel");

  it("stacks amplitude, frequency and THD on one x axis labelled only at the bottom", () => {
    expect(panels).toHaveLength(3);
    expect(byClass(root, "axis-title").map((t) => t.text)).toEqual(["amplitude (peak)", "frequency", "R2", "THD"]);
    const labels = panels.map((p) => byClass(byClass(p, "x-axis")[0] as SvgNode, "tick-label").map((t) => t.text));
    expect(labels[0]).toEqual([]);
    expect(labels[1]).toEqual([]);
    expect(labels[2]).toContain("30 k\u03a9");
  });

  it("marks the start threshold on every panel", () => {
    expect(panels.map((p) => byClass(p, "marker-label")[0]?.text)).toEqual(Array(3).fill("start threshold 29.1 k\u03a9"));
  });

  it("draws THD in percent and dots on the steps that oscillate", () => {
    expect(figure.panels[2]?.series[0]?.y[10]).toBeCloseTo(1.2, 12);
    expect(byName(panels[0] as SvgNode, "circle")).toHaveLength(6);
  });

  it("uses a log x axis for a log sweep", () => {
    const log = sweepFigure({ title: "log", setting: { name: "C", unit: "F", values: [1e-9, 1e-8, 1e-7], log: true }, amplitude: [1, 1, 1], frequency: [1, 1, 1], thd: [0, 0, 0] });
    expect(log.panels.every((p) => p.xLog === true)).toBe(true);
    const bottom = byClass(parseSvg(renderFigure(log)), "panel")[2] as SvgNode;
    expect(byClass(byClass(bottom, "x-axis")[0] as SvgNode, "tick-label").map((t) => t.text)).toEqual(["1 nF", "10 nF", "100 nF"]);
  });
});

describe("sweepFigure: what a first reading got wrong", () => {
  const amplitude = setting.map((r) => (starts(r) ? (r - 28e3) / 2e3 : Number.NaN));
  const silent = Array.from(setting, (r) => !starts(r));
  const figure = sweepFigure({ title: "sweep", setting: { name: "R2", unit: "\u03a9", values: setting }, amplitude, frequency: amplitude.map(() => 1000), thd: amplitude.map(() => 0.01), threshold: 29.1e3, silent });
  const root = parseSvg(renderFigure(figure));
  const [first] = byClass(root, "panel") as [SvgNode];

  it("shows the silent settings as muted dots at zero amplitude, inside the plot", () => {
    const dots = figure.panels[0]!.series[1]!;
    expect(dots.name).toBe("no oscillation");
    expect(dots.muted).toBe(true);
    expect(Array.from(dots.y).filter((v) => v === 0)).toHaveLength(silent.filter(Boolean).length);
    expect(figure.panels[0]!.yRange![0]).toBeLessThan(0);
  });

  it("keeps the threshold label above every point: the label band is free of data", () => {
    const label = byClass(first, "marker-label")[0]!;
    const labelBottom = Number(label.attributes.y) + 3;
    const highest = Math.min(...byName(first, "circle").map((c) => Number(c.attributes.cy)));
    expect(highest).toBeGreaterThan(labelBottom);
  });

  it("does not blow a 0.1 % change up to the full axis: the axis spans at least 2 % of its value", () => {
    const flat = sweepFigure({ title: "flat", setting: { name: "R2", unit: "\u03a9", values: [1, 2, 3] }, amplitude: [3.16, 3.162, 3.1632], frequency: [1000, 1000.5, 1001], thd: [0.01, 0.01, 0.01] });
    const plot = byClass(parseSvg(renderFigure(flat)), "panel")[1] as SvgNode;
    const [lo, hi] = (plot.attributes["data-y"] ?? "").split(" ").map(Number) as [number, number];
    expect(hi - lo).toBeGreaterThanOrEqual(0.02 * 1001);
  });
});

import { describe, expect, it } from "vitest";
import { renderFigure } from "../../../packages/cli/src/plot/figure.js";
import type { Figure, Panel } from "../../../packages/cli/src/plot/types.js";
import { byClass, byName, parseSvg, pointsOf, type SvgNode } from "./svg-tree.js";

const time = Float64Array.from({ length: 101 }, (_, i) => i * 1e-4); // 0 … 10 ms
const sine = Float64Array.from(time, (t) => Math.sin(2 * Math.PI * 300 * t));

function panel(overrides: Partial<Panel> = {}): Panel {
  return { xLabel: "time", xUnit: "s", yLabel: "voltage", yUnit: "V", series: [{ name: "out", x: time, y: sine }], ...overrides };
}

function render(figure: Partial<Figure> & { panels: Panel[] }): SvgNode {
  return parseSvg(renderFigure({ title: "test", ...figure }));
}

function tickLabels(node: SvgNode, axis: "x-axis" | "y-axis"): string[] {
  return byClass(node, axis).flatMap((a) => byClass(a, "tick-label").map((t) => t.text));
}

function plotArea(panelNode: SvgNode): { x: number; y: number; width: number; height: number } {
  const rect = byName(byName(panelNode, "clipPath")[0] as SvgNode, "rect")[0] as SvgNode;
  const n = (k: string): number => Number(rect.attributes[k]);
  return { x: n("x"), y: n("y"), width: n("width"), height: n("height") };
}

describe("renderFigure(figure)", () => {
  it("writes a standalone SVG 1.1 document with its size and view box", () => {
    const svg = renderFigure({ title: "one", panels: [panel()] });
    expect(svg.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n<svg ')).toBe(true);
    const root = parseSvg(svg);
    expect(root.attributes.xmlns).toBe("http://www.w3.org/2000/svg");
    expect(root.attributes.version).toBe("1.1");
    expect(root.attributes.viewBox).toBe(`0 0 ${root.attributes.width} ${root.attributes.height}`);
    expect(Number(root.attributes.width)).toBe(900);
    expect(byName(root, "title")[0]?.text).toBe("one");
  });

  it("draws one panel group per panel, one polyline per unbroken series and one legend entry per name", () => {
    const root = render({
      columns: 2,
      panels: [
        panel({ series: [{ name: "a", x: time, y: sine }, { name: "b", x: time, y: sine.map((v) => v / 2) }] }),
        panel({ series: [{ name: "c", x: time, y: sine }] }),
        panel({ series: [{ name: "", x: time, y: sine }] }),
      ],
    });
    const panels = byClass(root, "panel");
    expect(panels).toHaveLength(3);
    expect(panels.map((p) => byName(p, "polyline").length)).toEqual([2, 1, 1]);
    expect(panels.map((p) => byClass(p, "legend-entry").length)).toEqual([2, 1, 0]);
    expect(byClass(panels[0] as SvgNode, "legend-entry").map((e) => byName(e, "text")[0]?.text)).toEqual(["a", "b"]);
    expect(Number(root.attributes.width)).toBe(1800);
  });

  it("labels a 0…10 ms time axis in 2 ms steps", () => {
    expect(tickLabels(render({ panels: [panel()] }), "x-axis")).toEqual(["0", "2 ms", "4 ms", "6 ms", "8 ms", "10 ms"]);
  });

  it("puts decade ticks on a log axis from 10 Hz to 100 kHz", () => {
    const f = Float64Array.from({ length: 81 }, (_, i) => 10 * 10 ** (i / 20));
    const root = render({ panels: [{ xLabel: "frequency", xUnit: "Hz", xLog: true, yLabel: "magnitude", yUnit: "dB", series: [{ name: "", x: f, y: f.map((v) => -Math.log10(v)) }] }] });
    expect(tickLabels(root, "x-axis")).toEqual(["10 Hz", "100 Hz", "1 kHz", "10 kHz", "100 kHz"]);
    // Each decade gets eight minor tick marks (2…9), drawn shorter than the decade marks.
    const marks = byName(byClass(byClass(root, "x-axis")[0] as SvgNode, "tick-marks")[0] as SvgNode, "line");
    expect(marks).toHaveLength(5 + 4 * 8);
  });

  it("escapes <, & and > in titles, labels, legends and markers", () => {
    const nasty = `R<1> & "C" 'x'`;
    const svg = renderFigure({ title: nasty, panels: [panel({ title: nasty, xLabel: nasty, yLabel: nasty, series: [{ name: nasty, x: time, y: sine }], markers: [{ x: 0.005, label: nasty }] })] });
    expect(svg).not.toContain("R<1>");
    expect(svg).toContain("R&lt;1&gt; &amp; &quot;C&quot; &apos;x&apos;");
    const root = parseSvg(svg);
    expect(byClass(root, "figure-title")[0]?.text).toBe(nasty);
    expect(byClass(root, "panel-title")[0]?.text).toBe(nasty);
    expect(byClass(root, "marker-label")[0]?.text).toBe(nasty);
    expect(byClass(root, "axis-title").map((t) => t.text)).toEqual([nasty, nasty]);
  });

  it("skips non-finite points and breaks the line there", () => {
    const y = Float64Array.from(sine);
    y[30] = Number.NaN;
    y[60] = Number.POSITIVE_INFINITY;
    y[61] = Number.NEGATIVE_INFINITY;
    const svg = renderFigure({ title: "gaps", panels: [panel({ series: [{ name: "out", x: time, y }] })] });
    expect(svg).not.toMatch(/NaN|Infinity/);
    const lines = byName(parseSvg(svg), "polyline");
    expect(lines).toHaveLength(3);
    expect(lines.map((l) => pointsOf(l).length)).toEqual([30, 29, 39]);
  });

  it("skips points a log axis cannot show", () => {
    const f = Float64Array.from([0, -1, 10, 100, 1000]);
    const root = render({ panels: [panel({ xLog: true, xUnit: "Hz", series: [{ name: "", x: f, y: Float64Array.from([1, 2, 3, 4, 5]) }] })] });
    expect(pointsOf(byName(root, "polyline")[0] as SvgNode)).toHaveLength(3);
  });

  it("survives empty, all-NaN and constant series", () => {
    const empty = render({ panels: [panel({ series: [] }), panel({ series: [{ name: "nan", x: time, y: time.map(() => Number.NaN) }] })] });
    expect(byClass(empty, "no-data")).toHaveLength(2);
    expect(byName(empty, "polyline")).toHaveLength(0);
    const flat = render({ panels: [panel({ series: [{ name: "dc", x: time, y: time.map(() => 2.5) }] })] });
    expect(tickLabels(flat, "y-axis")).toContain("2.5 V");
    const points = pointsOf(byName(flat, "polyline")[0] as SvgNode);
    const area = plotArea(byClass(flat, "panel")[0] as SvgNode);
    expect(points.every(([, y]) => Math.abs(y - (area.y + area.height / 2)) < 0.1)).toBe(true);
  });

  it("keeps a million samples to a small file with the extremes of the waveform", () => {
    const n = 1_000_000;
    const t = Float64Array.from({ length: n }, (_, i) => (i / n) * 0.02);
    const v = Float64Array.from(t, (s, i) => 3 * Math.sin(2 * Math.PI * 1000 * s) + (i === 654_321 ? 5 : 0));
    const svg = renderFigure({ title: "long", panels: [panel({ series: [{ name: "out", x: t, y: v }] })] });
    expect(svg.length).toBeLessThan(150_000);
    const root = parseSvg(svg);
    const area = plotArea(byClass(root, "panel")[0] as SvgNode);
    const points = pointsOf(byName(root, "polyline")[0] as SvgNode);
    expect(points.length).toBeLessThanOrEqual(4 * (Math.ceil(area.width) + 1));
    // One raised sample is the maximum (above 3.5 V, the sine alone reaches 3 V); decimation
    // must still draw its pixel.
    const ys = points.map(([, y]) => y);
    const span = Math.max(...ys) - Math.min(...ys);
    // The automatic y range is the data span plus 5 % at each end, so the drawn line spans
    // height / 1.1 pixels (to the 0.1 px rounding of the coordinates).
    expect(Math.abs(span - area.height / 1.1)).toBeLessThan(0.2);
    expect(tickLabels(root, "y-axis")).toContain("6 V");
  });

  it("shares the x axis of stacked panels: one range, labels only at the bottom", () => {
    const later = Float64Array.from(time, (t) => t + 0.005);
    const root = render({ sharedX: true, panels: [panel(), panel({ series: [{ name: "late", x: later, y: sine }] })] });
    const [upper, lower] = byClass(root, "panel") as [SvgNode, SvgNode];
    expect(tickLabels(upper, "x-axis")).toEqual([]);
    expect(tickLabels(lower, "x-axis")).toEqual(["0", "2 ms", "4 ms", "6 ms", "8 ms", "10 ms", "12 ms", "14 ms"]);
    expect(plotArea(upper).x).toBe(plotArea(lower).x);
    expect(plotArea(upper).width).toBe(plotArea(lower).width);
  });

  it("draws markers as lines with their labels, and bars as rectangles", () => {
    const root = render({
      panels: [
        panel({ markers: [{ x: 0.002, label: "start-up 2 ms" }, { x: 0.02, label: "outside" }] }),
        { xLabel: "order", xUnit: "", yLabel: "level", yUnit: "dBc", series: [{ name: "", x: [1, 2, 3], y: [0, -40, -60], style: "bars" }] },
      ],
    });
    const [first, second] = byClass(root, "panel") as [SvgNode, SvgNode];
    // The marker outside the data widens the automatic range to include it.
    expect(byClass(first, "marker-label").map((m) => m.text)).toEqual(["start-up 2 ms", "outside"]);
    const bars = byName(byClass(second, "series")[0] as SvgNode, "rect");
    expect(bars).toHaveLength(3);
    const heights = bars.map((b) => Number(b.attributes.height));
    expect(heights[0]).toBeGreaterThan(heights[1] as number);
    expect(heights[1]).toBeGreaterThan(heights[2] as number);
  });

  it("honours fixed ranges and clips what falls outside", () => {
    const root = render({ panels: [panel({ yRange: [-0.5, 0.5] })] });
    expect(tickLabels(root, "y-axis")).toEqual(["\u2212400 mV", "\u2212200 mV", "0", "200 mV", "400 mV"]);
    const data = byClass(root, "data")[0] as SvgNode;
    expect(data.attributes["clip-path"]).toMatch(/^url\(#onset-[0-9a-z]+-plot1\)$/);
  });

  it("rejects a figure that breaks a rule, naming the rule", () => {
    expect(() => renderFigure({ title: "", panels: [] })).toThrow(new RangeError("renderFigure: a figure needs at least one panel"));
    expect(() => renderFigure({ title: "", panels: [panel({ series: [{ name: "v", x: [1, 2], y: [1] }] })] })).toThrow(
      new RangeError('renderFigure: panel 1 series "v" has 2 x values and 1 y values'),
    );
    expect(() => renderFigure({ title: "", panels: [panel({ yLog: true, yRange: [0, 1] })] })).toThrow(
      new RangeError("renderFigure: panel 1 yRange of a log axis must be above zero, got [0, 1]"),
    );
    expect(() => renderFigure({ title: "", panels: [panel({ xRange: [1, 1] })] })).toThrow(
      new RangeError("renderFigure: panel 1 xRange must be two finite numbers, low < high, got [1, 1]"),
    );
    expect(() => renderFigure({ title: "", columns: 0, panels: [panel()] })).toThrow(new RangeError("renderFigure: columns must be a positive integer, got 0"));
  });

  it("gives the same figure the same file", () => {
    expect(renderFigure({ title: "same", panels: [panel()] })).toBe(renderFigure({ title: "same", panels: [panel()] }));
  });
});

import { describe, expect, it } from "vitest";
import { renderFigure } from "../../../../packages/cli/src/plot/figure.js";
import { responseFigure } from "../../../../packages/cli/src/plot/figures/response.js";
import { byClass, parseSvg, type SvgNode } from "../svg-tree.js";

const frequency = Float64Array.from({ length: 121 }, (_, i) => 10 * 10 ** (i / 30));
// A notch response of our own: |H| = |1 − x²| / |1 − x² + 4jx| with x = f / 1 kHz.
const x = (f: number): number => f / 1000;
const magnitude = Float64Array.from(frequency, (f) => Math.abs(1 - x(f) ** 2) / Math.hypot(1 - x(f) ** 2, 4 * x(f)));
const phase = Float64Array.from(frequency, (f) => (-Math.atan2(4 * x(f), 1 - x(f) ** 2) * 180) / Math.PI);

describe("responseFigure(input)", () => {
  const figure = responseFigure({ title: "notch", frequency, magnitude, phase, notch: 1000, phaseCrossing: 1000 });
  const root = parseSvg(renderFigure(figure));
  const [upper, lower] = byClass(root, "panel") as [SvgNode, SvgNode];

  // Decibels of a voltage ratio: 20·log10 (IEC 60027-3); a ratio of 0.1 is −20 dB.
  it("draws magnitude in dB over phase in degrees", () => {
    expect(figure.panels.map((p) => p.yUnit)).toEqual(["dB", "\u00b0"]);
    expect(figure.panels[0]?.series[0]?.y[60]).toBe(Number.NEGATIVE_INFINITY);
    expect(figure.panels[0]?.series[0]?.y[0]).toBeCloseTo(20 * Math.log10(magnitude[0] as number), 12);
    expect(byClass(byClass(lower, "y-axis")[0] as SvgNode, "tick-label").map((t) => t.text)).toContain("\u221290\u00b0");
  });

  it("shares one log frequency axis with decade labels at the bottom only", () => {
    expect(byClass(byClass(upper, "x-axis")[0] as SvgNode, "tick-label")).toHaveLength(0);
    expect(byClass(byClass(lower, "x-axis")[0] as SvgNode, "tick-label").map((t) => t.text)).toEqual(["10 Hz", "100 Hz", "1 kHz", "10 kHz", "100 kHz"]);
  });

  it("marks the notch and the −180° crossing on both panels", () => {
    const expected = ["notch 1 kHz", "\u2212180\u00b0 at 1 kHz"];
    expect(byClass(upper, "marker-label").map((m) => m.text)).toEqual(expected);
    expect(byClass(lower, "marker-label").map((m) => m.text)).toEqual(expected);
  });
});

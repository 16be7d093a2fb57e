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

describe("wrappedPhase(frequency, phase)", () => {
  // A three-section RC ladder (passive) turns up to −270°; an unwrapped sum of its sections'
  // phases reads −340° where the true phase is +20°. Wrapping is modulo 360° by definition.
  it("puts every phase in (−180°, 180°] and breaks the line where it wraps", async () => {
    const { wrappedPhase } = await import("../../../../packages/cli/src/plot/figures/response.js");
    const { x, y } = wrappedPhase([1, 2, 3, 4], [-100, -170, -190, -340]);
    expect(Array.from(y)).toEqual([-100, -170, Number.NaN, 170, 20]);
    expect(Array.from(x)).toEqual([1, 2, Number.NaN, 3, 4]);
    expect(Array.from(wrappedPhase([1], [-180]).y)).toEqual([180]);
  });

  it("draws the phase panel on a fixed ±180° axis", () => {
    const f = responseFigure({ title: "ladder", frequency: [1, 10], magnitude: [1, 0.1], phase: [-10, -340] });
    expect(f.panels[1]?.yRange).toEqual([-180, 180]);
    expect(Math.max(...Array.from(f.panels[1]!.series[0]!.y).filter(Number.isFinite))).toBeLessThanOrEqual(180);
  });
});

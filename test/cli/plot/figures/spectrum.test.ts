import { describe, expect, it } from "vitest";
import { renderFigure } from "../../../../packages/cli/src/plot/figure.js";
import { numericalFloorDbc, spectrumPanel, SPECTRUM_FLOOR_DBC } from "../../../../packages/cli/src/plot/figures/spectrum.js";
import { byClass, parseSvg, type SvgNode } from "../svg-tree.js";

// A clipped sine of our own: odd harmonics real, even ones at the µV level a symmetric
// circuit leaves only through the solver's rounding.
const harmonics = [
  { order: 1, frequency: 2441.5, amplitude: 3.2 },
  { order: 2, frequency: 4883, amplitude: 4.7e-7 },
  { order: 3, frequency: 7324.5, amplitude: 0.072 },
  { order: 4, frequency: 9766, amplitude: 1.1e-7 },
  { order: 5, frequency: 12207.5, amplitude: 0.0024 },
];

describe("numericalFloorDbc(fundamental, amplitudeError)", () => {
  // dBc = 20·log10(a / a₁) (common practice): 24 µV under 3.2 V is −102.5 dBc.
  it("is the amplitude's error bar relative to the fundamental, in dBc", () => {
    expect(numericalFloorDbc(3.2, 24e-6)).toBeCloseTo(20 * Math.log10(24e-6 / 3.2), 12);
    expect(numericalFloorDbc(3.2, 24e-6)).toBeCloseTo(-102.5, 1);
  });

  it("falls back to the rounding floor without an error bar, and never goes below it", () => {
    expect(numericalFloorDbc(3.2, undefined)).toBe(SPECTRUM_FLOOR_DBC);
    expect(numericalFloorDbc(3.2, 1e-30)).toBe(SPECTRUM_FLOOR_DBC);
  });
});

describe("spectrumPanel(harmonics, thd, amplitudeError)", () => {
  const panel = spectrumPanel(harmonics, 0.0224, 24e-6);
  const root = parseSvg(renderFigure({ title: "spectrum", panels: [panel] }));
  const plot = byClass(root, "panel")[0] as SvgNode;

  it("marks the numerical floor as a labelled level", () => {
    expect(byClass(plot, "level-label").map((t) => t.text)).toEqual(["numerical floor \u2212102 dBc"]);
  });

  it("keeps harmonics below the floor apart, in the muted grey, named in the legend", () => {
    expect(panel.series.map((s) => [s.name, Array.from(s.x), s.muted === true])).toEqual([
      ["harmonic", [2441.5, 7324.5, 12207.5], false],
      ["below the numerical floor", [4883, 9766], true],
    ]);
    expect(byClass(plot, "legend-entry")).toHaveLength(2);
  });

  it("puts the frequency ticks at the harmonics", () => {
    expect(byClass(byClass(plot, "x-axis")[0] as SvgNode, "tick-label").map((t) => t.text)).toEqual(["2.442 kHz", "4.883 kHz", "7.325 kHz", "9.766 kHz", "12.21 kHz"]);
  });

  it("grows the bars from the bottom of the axis, below the lowest level", () => {
    const [low, high] = panel.yRange!;
    expect(low).toBeLessThan(Math.min(...panel.series.flatMap((s) => Array.from(s.y))));
    expect(high).toBeGreaterThan(0);
  });

  it("names nothing in the legend when every harmonic is above the floor", () => {
    expect(spectrumPanel(harmonics.filter((h) => h.order % 2 === 1), undefined, 24e-6).series.map((s) => s.name)).toEqual([""]);
  });
});

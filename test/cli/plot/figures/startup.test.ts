import { describe, expect, it } from "vitest";
import { renderFigure } from "../../../../packages/cli/src/plot/figure.js";
import { SPECTRUM_FLOOR_DBC, startupFigure } from "../../../../packages/cli/src/plot/figures/startup.js";
import { byClass, byName, parseSvg, type SvgNode } from "../svg-tree.js";

const time = Float64Array.from({ length: 3001 }, (_, i) => i * 1e-5);
const envelopeAt = (t: number): number => 2 / (1 + Math.exp(-(t - 0.012) / 0.002));
const values = Float64Array.from(time, (t) => envelopeAt(t) * Math.sin(2 * Math.PI * 1000 * t));
const cycles = Float64Array.from({ length: 30 }, (_, k) => (k + 0.5) * 1e-3);
const harmonics = [
  { order: 1, frequency: 1000, amplitude: 2 },
  { order: 2, frequency: 2000, amplitude: 0.02 },
  { order: 3, frequency: 3000, amplitude: 0.002 },
  { order: 4, frequency: 4000, amplitude: 0 },
];

describe("startupFigure(input)", () => {
  const figure = startupFigure({
    title: "start-up",
    time,
    probe: { name: "out", unit: "V", values },
    envelope: { time: cycles, values: cycles.map(envelopeAt) },
    startupTime: 0.0132,
    settlingTime: 0.0201,
    harmonics,
    thd: 0.01012,
  });
  const root = parseSvg(renderFigure(figure));
  const [wavePanel, spectrum] = byClass(root, "panel") as [SvgNode, SvgNode];

  it("marks the start-up and settling times with their values", () => {
    expect(byClass(wavePanel, "marker-label").map((m) => m.text)).toEqual(["start-up 13.2 ms", "settled 20.1 ms"]);
  });

  it("draws ± envelope as one legend entry and two lines beside the waveform", () => {
    expect(byClass(wavePanel, "legend-entry").map((e) => byName(e, "text")[0]?.text)).toEqual(["out", "\u00b1 envelope"]);
    expect(byName(wavePanel, "polyline")).toHaveLength(3);
  });

  // dBc is 20·log10 of the amplitude relative to the carrier, here the fundamental (common
  // practice): 0.02 V against 2 V is −40 dBc.
  it("puts the spectrum below, as bars in dBc, floored for a zero harmonic", () => {
    expect(figure.panels[1]?.series[0]?.y).toEqual(Float64Array.from([0, -40, -60, SPECTRUM_FLOOR_DBC]));
    expect(byName(spectrum, "rect").filter((r) => r.attributes["fill-opacity"] === "0.55")).toHaveLength(4);
    expect(byClass(spectrum, "panel-title")[0]?.text).toBe("spectrum, fundamental 1 kHz, THD 1.01 %");
  });

  it("leaves the spectrum out without harmonics and the markers out without times", () => {
    const bare = startupFigure({ title: "bare", time, probe: { name: "out", unit: "V", values } });
    expect(bare.panels).toHaveLength(1);
    expect(bare.panels[0]?.markers).toEqual([]);
  });

  it("draws the envelope's bounce in a panel of its own, the fit beside the envelope and its first two peaks marked one bounce apart", () => {
    // A fitted envelope 2·(1 + 0.3·e^(−20t)·cos(2π·5t)): its maxima above the level lie where
    // tan(2π·5t) = −20/(2π·5), one bounce period 0.2 s apart (mathematics).
    const fitTime = Float64Array.from({ length: 4001 }, (_, i) => i * 2.5e-4);
    const fitValues = fitTime.map((t) => 2 * (1 + 0.3 * Math.exp(-20 * t) * Math.cos(2 * Math.PI * 5 * t)));
    const withBounce = startupFigure({
      title: "bounce",
      time,
      probe: { name: "out", unit: "V", values },
      envelope: { time: fitTime, values: fitValues },
      bounce: { frequency: 5, dampingRatio: 0.5370, fit: { time: fitTime, values: fitValues } },
    });
    expect(withBounce.panels).toHaveLength(2);
    const panel = withBounce.panels[1]!;
    expect(panel.title).toBe("envelope: bounce 5 Hz, \u03b6 0.537");
    expect(panel.series.map((x) => x.name)).toEqual(["envelope", "fitted decaying oscillation"]);
    const first = (2 * Math.PI - Math.atan(20 / (2 * Math.PI * 5))) / (2 * Math.PI * 5);
    const [a, b] = panel.markers!;
    expect(Math.abs(a!.x - first)).toBeLessThan(3e-4);
    expect(Math.abs(b!.x - a!.x - 0.2)).toBeLessThan(5e-4);
    expect(a!.label).toBe("bounce 5 Hz, \u03b6 0.537");
    const svg = parseSvg(renderFigure(withBounce));
    expect(byClass(byClass(svg, "panel")[1]!, "marker-label").map((m) => m.text)).toEqual(["bounce 5 Hz, \u03b6 0.537", "one bounce later"]);
  });
});

describe("startupFigure: the settled cycles and the envelope in dB", () => {
  const full = startupFigure({
    title: "start-up",
    time,
    probe: { name: "out", unit: "V", values },
    envelope: { time: cycles, values: cycles.map(envelopeAt) },
    startupTime: 0.0132,
    harmonics,
    frequency: 1000,
    amplitude: 2,
    growthRate: 500,
  });

  it("sets the last 3 cycles beside the whole run, at full resolution", () => {
    const last = full.panels[1]!;
    expect(last.title).toBe("last 3 cycles");
    expect(last.xRange![1] - last.xRange![0]).toBeCloseTo(3e-3, 12);
    expect(last.series[0]!.x.length).toBe(301);
    expect(full.columns).toBe(2);
  });

  // A growth rate σ makes the envelope e^(σt): 20·log10(e^σ) = 8.686·σ dB per second.
  it("draws the envelope in dB of the settled amplitude, naming the slope the growth rate gives", () => {
    const db = full.panels[2]!;
    expect(db.yUnit).toBe("dB");
    expect(db.title).toBe("envelope in dB of the settled amplitude; growth 4.34 dB/ms");
    expect(db.series[0]!.y[29]).toBeCloseTo(20 * Math.log10(envelopeAt(cycles[29]!) / 2), 12);
  });

  it("names the envelope in the legend only when it has points to draw", () => {
    const none = startupFigure({ title: "t", time, probe: { name: "out", unit: "V", values }, envelope: { time: [], values: [] } });
    expect(none.panels[0]!.series.map((s) => s.name)).toEqual(["out"]);
  });
});

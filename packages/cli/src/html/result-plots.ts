import type { Figure, Panel } from "../plot/index.js";
import { polesPanel, responseFigure, startupPanels, transientFigure } from "../plot/index.js";
import type { AnalysisRun } from "../report/plain-types.js";
import { responsePlot } from "../analyses/response.js";
import { startupPlot } from "../analyses/startup.js";
import type { PagePlot } from "./plots.js";

/** Pixel sizes of the page's plots by their place in the grid (the SVG scales to its column). */
const SIZE = { main: { width: 880, height: 380 }, side: { width: 440, height: 380 }, half: { width: 660, height: 360 }, wide: { width: 1320, height: 380 } } as const;
type Place = keyof typeof SIZE;

/** One panel as a figure of its own: the panel's title becomes the figure's. */
export function single(panel: Panel, place: Place): Figure {
  const { title, ...rest } = panel;
  const size = SIZE[place];
  return { title: title ?? "", panels: [{ ...rest, height: size.height }], width: size.width };
}

/** The page plots of one analysis, in reading order; `key` makes their ids unique. */
export function resultPlots(run: AnalysisRun, key: string): PagePlot[] {
  const r = run.result;
  switch (r.analysis) {
    case "startup": {
      const p = startupPanels(startupPlot(r, ""));
      const link = `${key}-time`;
      const plots: PagePlot[] = [{ id: `${key}-run`, figure: single(p.waveform, p.lastCycles ? "main" : "wide"), zoom: true, link, place: p.lastCycles ? "main" : "wide" }];
      if (p.lastCycles) plots.push({ id: `${key}-last`, figure: single(p.lastCycles, "side"), zoom: true, place: "side" });
      if (p.envelopeDb) plots.push({ id: `${key}-envelope`, figure: single(p.envelopeDb, "half"), zoom: true, link, place: "half" });
      if (p.bounce) plots.push({ id: `${key}-bounce`, figure: single(p.bounce, "half"), zoom: true, link, place: "half" });
      if (p.spectrum) plots.push({ id: `${key}-spectrum`, figure: single(p.spectrum, "half"), place: "half" });
      return plots;
    }
    case "transient": {
      const figure = transientFigure({ title: "transient", time: r.time, probes: r.signals.map((s) => ({ name: s.name, unit: s.unit, values: s.values })) });
      return [{ id: `${key}-transient`, figure: { ...figure, width: SIZE.wide.width }, zoom: true, place: "wide" }];
    }
    case "poles":
      return [{ id: `${key}-poles`, figure: single(polesPanel(r.poles, r.dominant), "half"), place: "half" }];
    case "response":
      return [{ id: `${key}-response`, figure: { ...responseFigure(responsePlot(r, "frequency response")), width: SIZE.wide.width }, place: "wide" }];
    case "steady": {
      if (!r.found) return [];
      const figure = transientFigure({ title: `one period of the steady state on ${r.probe}`, time: r.waveform.time, probes: [{ name: r.probe, unit: r.unit, values: r.waveform.values }] });
      return [{ id: `${key}-steady`, figure: { ...figure, width: SIZE.wide.width }, zoom: true, place: "wide" }];
    }
    case "bias":
      return [];
  }
}

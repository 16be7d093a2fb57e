import type { Figure, Marker, Panel } from "../types.js";
import { groupByUnit, quantityOf, type ProbeTrace } from "./quantity.js";

/** Input of {@link transientFigure}. */
export interface TransientPlot {
  readonly title: string;
  /** Time points in s, shared by every probe. */
  readonly time: ArrayLike<number>;
  readonly probes: readonly ProbeTrace[];
  readonly markers?: readonly Marker[];
}

/**
 * Probe waveforms against time. Probes of one unit share a panel; voltages and currents get
 * panels of their own, stacked on one time axis.
 */
export function transientFigure(input: TransientPlot): Figure {
  const groups = groupByUnit(input.probes);
  const stacked = groups.length > 1;
  const panels: Panel[] = groups.map((group) => ({
    xLabel: "time",
    xUnit: "s",
    yLabel: quantityOf(group.unit),
    yUnit: group.unit,
    series: group.members.map(({ probe, index }) => ({ name: probe.name, x: input.time, y: probe.values, tone: index })),
    ...(input.markers === undefined ? {} : { markers: input.markers }),
    ...(stacked ? { height: 360 } : {}),
  }));
  if (panels.length === 0) panels.push({ xLabel: "time", xUnit: "s", yLabel: "value", yUnit: "", series: [] });
  return { title: input.title, panels, sharedX: true };
}

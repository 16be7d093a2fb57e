import type { SpecMetric } from "@onset/core";
import { formatPercent, formatPlain, formatSI, formatWithError } from "../format/index.js";
import { NOT_A_NUMBER } from "../format/symbols.js";

/** A value in SI base units with a prefix (`4.73 V`, `1.012 kHz`), or `—` when absent. */
export function si(value: number | null | undefined, unit: string, significant = 4): string {
  return value === null || value === undefined ? NOT_A_NUMBER : formatSI(value, unit, significant);
}

/** A settled figure with its error bar when it has one (`1.2239 V ± 0.0004 V`), else as measured; unit `1` is a fraction, shown in percent. */
export function withBar(value: number | null | undefined, error: number | undefined, unit: string): string {
  if (value === null || value === undefined) return si(null, unit);
  if (error === undefined) return unit === "1" ? percent(value) : si(value, unit);
  return formatWithError(value, error, unit);
}

/** A fraction as percent, or `—`. */
export function percent(value: number | null | undefined, significant = 4): string {
  return value === null || value === undefined ? NOT_A_NUMBER : formatPercent(value, significant);
}

/**
 * A rate in 1/s (growth rates, pole real parts): `983.2 /s`; prefixes would read as ks, so
 * rates beyond 10⁵ /s (the far poles of op-amps) are written with a power of ten: `−2.046e6 /s`.
 */
export function perSecond(value: number | null | undefined): string {
  if (value === null || value === undefined) return NOT_A_NUMBER;
  if (Math.abs(value) >= 1e5 && Number.isFinite(value)) {
    const [mantissa, exponent] = value.toExponential(3).split("e");
    return `${formatPlain(Number(mantissa), 4)}e${Number(exponent)} /s`;
  }
  return `${formatPlain(value, 4)} /s`;
}

/** The unit a spec metric is measured in (`1` for a fraction shown as percent); the swing's figures are in the probe's unit. */
export function metricUnit(metric: SpecMetric | string, probeUnit = "V"): string {
  switch (metric) {
    case "frequency":
    case "predictedFrequency":
      return "Hz";
    case "amplitude":
    case "offset":
    case "rms":
    case "peakToPeak":
      return probeUnit;
    case "startup":
    case "settling":
    case "startupTime":
    case "settlingTime":
      return "s";
    case "growthRate":
    case "predictedGrowthRate":
      return "/s";
    default:
      return "1";
  }
}

/** A metric's value in its unit: THD and yield as percent, growth rates per second, the swing's figures in the probe's unit. */
export function metric(metricName: SpecMetric | string, value: number | null | undefined, probeUnit = "V"): string {
  const unit = metricUnit(metricName, probeUnit);
  if (unit === "1") return percent(value);
  if (unit === "/s") return perSecond(value);
  return si(value, unit);
}

/** How metrics are called in reports. */
export const METRIC_LABELS: Readonly<Record<string, string>> = {
  frequency: "frequency",
  amplitude: "amplitude",
  thd: "THD",
  startupTime: "start-up time",
  settlingTime: "settling time",
  growthRate: "growth rate",
  offset: "offset",
  rms: "rms",
  peakToPeak: "peak-to-peak",
  predictedFrequency: "predicted frequency",
  predictedGrowthRate: "predicted growth rate",
};

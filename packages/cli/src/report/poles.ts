import { onImaginaryAxis, type PolesResult, type QuantityUnit } from "@onset/core";
import type { Paint } from "../color.js";
import type { PredictionCheck } from "./prediction.js";
import { table } from "./table.js";
import { perSecond, si } from "./values.js";

/** The poles table (rightmost first), the dominant pair and, with a start-up run, prediction against simulation. */
export function polesReport(r: PolesResult, check: PredictionCheck | null, unit: QuantityUnit, p: Paint): string[] {
  const lines = [p.bold("poles at the bias point") + p.dim(`  (${r.poles.length} finite, rightmost first)`)];
  lines.push(
    ...table(
      [{ header: "real", align: "right" }, { header: "imaginary", align: "right" }, { header: "frequency", align: "right" }],
      r.poles.map((pole) => [perSecond(pole.real), si(pole.imag, "rad/s"), pole.imag === 0 ? "" : si(Math.abs(pole.imag) / (2 * Math.PI), "Hz")]),
    ),
  );
  if (r.dominant === null) lines.push("  no complex pair: the circuit does not ring at its bias point");
  else {
    const where = r.starts
      ? p.green("right half-plane: an oscillation starts")
      : onImaginaryAxis(r.dominant)
        ? p.red("on the imaginary axis (to rounding): it neither grows nor decays, no oscillation starts by itself")
        : p.red("not in the right half-plane: it decays, no oscillation starts");
    lines.push(`  dominant pair ${si(r.frequency, "Hz")}, growth rate ${perSecond(r.growthRate)}; ${where}`);
  }
  if (check) {
    lines.push("", `  predicted against simulated (start-up on ${check.probe})`);
    lines.push(
      ...table(
        [{ header: "" }, { header: "predicted", align: "right" }, { header: "simulated", align: "right" }],
        [
          ["frequency", si(check.predicted.frequency, "Hz"), si(check.simulated.frequency, "Hz")],
          ["growth rate", perSecond(check.predicted.growthRate), perSecond(check.simulated.growthRate)],
          ["start-up time", si(check.predicted.startupTime, "s"), si(check.simulated.startupTime, "s")],
        ],
        "    ",
      ),
    );
    lines.push(
      p.dim(`    predicted start-up time = ln(0.9 × settled amplitude / start level) / growth rate, start level ${si(check.startLevel, unit, 3)}`),
      p.dim("    (√2 × the excitation's noise r.m.s. at the probe, linearised at the bias point)"),
    );
  }
  return lines;
}

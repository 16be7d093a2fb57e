import type { AnalysisResult } from "@onset/core";
import { csvDocument, csvField, csvNumber } from "./csv.js";

function* columnRows(time: Float64Array, columns: readonly Float64Array[]): Generator<string[]> {
  for (let k = 0; k < time.length; k++) yield [csvNumber(time[k]), ...columns.map((c) => csvNumber(c[k]))];
}

/** A column heading: the name and its unit, `o (V)`, `time (s)`. */
function headed(name: string, unit: string): string {
  return `${name} (${unit})`;
}

/**
 * The CSV of one result, or null when it has none; every heading carries its unit. Transient:
 * `time (s)` then one column per probe, named as written (`o (V)`, `o-ref (V)`, `R1.i (A)`,
 * `U1.pole (V)`); start-up: `time (s)` and the probe (steady: over one period of the orbit, from its start); response: `frequency (Hz)`, `magnitude`
 * (a ratio), `magnitude (dB)`, `phase (deg)`; bias: `name,quantity,value,unit`; poles:
 * `real (1/s)`, `imag (rad/s)`, `frequency (Hz)`. Values in SI base units.
 */
export function resultCsv(r: AnalysisResult): string | null {
  switch (r.analysis) {
    case "transient":
      return csvDocument([headed("time", "s"), ...r.signals.map((s) => headed(s.name, s.unit))], columnRows(r.time, r.signals.map((s) => s.values)));
    case "startup":
    case "steady":
      return csvDocument([headed("time", "s"), headed(r.probe, r.unit)], columnRows(r.waveform.time, [r.waveform.values]));
    case "response":
      return csvDocument(
        [headed("frequency", "Hz"), "magnitude", headed("magnitude", "dB"), headed("phase", "deg")],
        r.points.map((p) => [csvNumber(p.frequency), csvNumber(p.magnitude), csvNumber(p.magnitudeDb), csvNumber(p.phase)]),
      );
    case "bias":
      return csvDocument(["name", "quantity", "value", "unit"], [
        ...r.nodes.map((n) => [csvField(n.node), "voltage", csvNumber(n.voltage), "V"]),
        ...r.sources.map((s) => [csvField(`${s.part}.i`), "current", csvNumber(s.current), "A"]),
      ]);
    case "poles":
      return csvDocument([headed("real", "1/s"), headed("imag", "rad/s"), headed("frequency", "Hz")], r.poles.map((p) => [csvNumber(p.real), csvNumber(p.imag), csvNumber(Math.abs(p.imag) / (2 * Math.PI))]));
  }
}

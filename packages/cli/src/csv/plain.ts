import type { AnalysisResult } from "@onset/core";
import { csvDocument, csvField, csvNumber } from "./csv.js";

function* columnRows(time: Float64Array, columns: readonly Float64Array[]): Generator<string[]> {
  for (let k = 0; k < time.length; k++) yield [csvNumber(time[k]), ...columns.map((c) => csvNumber(c[k]))];
}

/**
 * The CSV of one result, or null when it has none. Transient: `time` then one column per probe,
 * named as written (`o`, `o-ref`, `R1.i`); start-up: `time` and the probe; response:
 * `frequency,magnitude,dB,phase` (Hz, ratio, dB, degrees); bias: `name,quantity,value`;
 * poles: `real,imag,frequency` (1/s, rad/s, Hz). Values in SI base units.
 */
export function resultCsv(r: AnalysisResult): string | null {
  switch (r.analysis) {
    case "transient":
      return csvDocument(["time", ...r.signals.map((s) => s.name)], columnRows(r.time, r.signals.map((s) => s.values)));
    case "startup":
      return csvDocument(["time", r.probe], columnRows(r.waveform.time, [r.waveform.values]));
    case "response":
      return csvDocument(
        ["frequency", "magnitude", "dB", "phase"],
        r.points.map((p) => [csvNumber(p.frequency), csvNumber(p.magnitude), csvNumber(p.magnitudeDb), csvNumber(p.phase)]),
      );
    case "bias":
      return csvDocument(["name", "quantity", "value"], [
        ...r.nodes.map((n) => [csvField(n.node), "voltage", csvNumber(n.voltage)]),
        ...r.sources.map((s) => [csvField(`${s.part}.i`), "current", csvNumber(s.current)]),
      ]);
    case "poles":
      return csvDocument(["real", "imag", "frequency"], r.poles.map((p) => [csvNumber(p.real), csvNumber(p.imag), csvNumber(Math.abs(p.imag) / (2 * Math.PI))]));
  }
}

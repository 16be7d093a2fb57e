import type { Circuit, OptionValue, PartSpec } from "../circuit/circuit.js";
import { runPoles } from "../analyses/poles.js";
import { builtinPresets } from "../devices/registry.js";
import type { DesignedPart } from "./designed-file.js";

/** One line of a generated file: a part with its value, tolerance, options and comment. */
export type Line = DesignedPart;

/** One value a design chose, with the formula's ideal beside it. */
export interface DesignChoice {
  readonly part: string;
  readonly ideal: number;
  readonly chosen: number;
  readonly unit: "Ω" | "F";
}

/** A topology sized for one request: its lines and what the file's header and analyses say about them. */
export interface Sizing {
  readonly lines: readonly Line[];
  readonly probe: string;
  readonly formulaFrequency: number;
  readonly choices: readonly DesignChoice[];
  readonly gainNote: string;
  readonly thdLimit: number;
  readonly description: readonly string[];
  /** The start-up run's length (s) when the loop is slower than `until=auto` follows; else auto. */
  readonly until?: number;
  /** Monte Carlo samples the file asks for (a slow loop's runs are long: fewer). */
  readonly runs: number;
}

export const RESISTOR_TOLERANCE = 0.01;
export const CAPACITOR_TOLERANCE = 0.05;

export function opampLine(nodes: readonly string[], preset: string, rails: readonly [number, number]): Line {
  return { kind: "opamp", name: "U1", nodes, options: { preset, rails: [rails[0], rails[1]] } };
}

function partsOf(lines: readonly Line[]): PartSpec[] {
  return lines.map((l) => {
    let options: Record<string, OptionValue> = { ...l.options };
    const preset = typeof options.preset === "string" ? builtinPresets[l.kind]?.[options.preset] : undefined;
    if (preset) options = { ...preset, ...options };
    return l.value === undefined ? { kind: l.kind, name: l.name, nodes: l.nodes, options } : { kind: l.kind, name: l.name, nodes: l.nodes, value: l.value, options };
  });
}

/** The dominant pole pair of the lines' circuit at its bias point (Hz, 1/s; NaN when none). */
export function predict(lines: readonly Line[]): { frequency: number; growthRate: number } {
  const circuit: Circuit = { parts: partsOf(lines), analyses: [], tolerances: [] };
  const poles = runPoles(circuit, { kind: "poles" });
  return { frequency: poles.frequency ?? Number.NaN, growthRate: poles.growthRate ?? Number.NaN };
}

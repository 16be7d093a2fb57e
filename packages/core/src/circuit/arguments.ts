import type { AnalysisOptions } from "./analysis-schema.js";
import type { AnalysisSpec, Circuit, Probe } from "./circuit.js";
import { inputError, type OnsetError } from "./diagnostic.js";

/**
 * The one error a public function throws for arguments it cannot take: an `OnsetError` with
 * code `bad-argument`, its message beginning with the function's name (documented in
 * docs/language.md, §6).
 */
export function badArgument(message: string): OnsetError {
  return inputError("bad-argument", message, { hint: "see the function's documentation for the arguments it takes" });
}

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === "object" && value !== null;
}

/** Checks the shape of a circuit at a public entry: parts, analyses and tolerances as arrays of objects. */
export function checkCircuit(api: string, circuit: unknown): asserts circuit is Circuit {
  if (!isObject(circuit)) throw badArgument(`${api}: circuit must be an object with parts and analyses, got ${describe(circuit)}`);
  for (const key of ["parts", "analyses"] as const) {
    const list = circuit[key];
    if (!Array.isArray(list) || !list.every(isObject)) throw badArgument(`${api}: circuit.${key} must be an array of objects, got ${describe(list)}`);
  }
  const tolerances = circuit.tolerances;
  if (tolerances !== undefined && (!Array.isArray(tolerances) || !tolerances.every(isObject))) throw badArgument(`${api}: circuit.tolerances must be an array of objects`);
  for (const part of circuit.parts as unknown[]) {
    const p = part as Record<string, unknown>;
    if (typeof p.kind !== "string" || typeof p.name !== "string" || !Array.isArray(p.nodes) || !p.nodes.every((n) => typeof n === "string")) {
      throw badArgument(`${api}: every part needs a kind, a name and nodes (strings), got ${describe(part)}`);
    }
  }
}

/** Checks an analysis argument: an object of the expected kind. */
export function checkAnalysis<K extends AnalysisSpec["kind"]>(api: string, analysis: unknown, kind: K): asserts analysis is Extract<AnalysisSpec, { kind: K }> {
  if (!isObject(analysis) || analysis.kind !== kind) throw badArgument(`${api}: analysis must be a ${kind} analysis ({ kind: "${kind}", … }), got ${describe(analysis)}`);
}

/**
 * Checks an analysis argument's fields against its statement's options table (`max-step` is the
 * field `maxStep`): what the language refuses in a file, the API refuses too — a required probe
 * missing, a word not among the choices, a number out of range, not whole, or not finite.
 */
export function checkAnalysisFields(api: string, analysis: Readonly<Record<string, unknown>>, table: AnalysisOptions): void {
  for (const [key, option] of Object.entries(table)) {
    const field = key.replace(/-([a-z])/g, (_, c: string) => c.toUpperCase());
    const value = analysis[field];
    if (value === undefined) {
      if (option.required) throw badArgument(`${api}: analysis.${field} is required (${option.summary})`);
      continue;
    }
    if (option.type === "number" && !(option.words ?? []).includes(value as string)) {
      const ok =
        typeof value === "number" &&
        Number.isFinite(value) &&
        (option.min === undefined || (option.minExclusive ? value > option.min : value >= option.min)) &&
        (option.max === undefined || value <= option.max) &&
        (!option.integer || Number.isInteger(value));
      if (!ok) throw badArgument(`${api}: analysis.${field} must be ${numberRule(option)}, got ${describe(value)}`);
    } else if (option.type === "word" && !option.words.includes(value as string)) {
      throw badArgument(`${api}: analysis.${field} must be one of ${option.words.map((w) => JSON.stringify(w)).join(", ")}, got ${describe(value)}`);
    } else if (option.type === "probe" && !isProbe(value)) {
      throw badArgument(`${api}: analysis.${field} must be a probe (${PROBE_SHAPES}), got ${describe(value)}`);
    } else if (option.type === "probes" && !(Array.isArray(value) && value.every(isProbe))) {
      throw badArgument(`${api}: analysis.${field} must be an array of probes (${PROBE_SHAPES}), got ${describe(value)}`);
    } else if (option.type === "source" && !(typeof value === "string" && value !== "")) {
      throw badArgument(`${api}: analysis.${field} must be the name of an independent source, got ${describe(value)}`);
    }
  }
}

/** The probe shapes, as messages spell them. */
const PROBE_SHAPES = '{ kind: "node", node }, { kind: "difference", plus, minus }, { kind: "current", part } or { kind: "state", part, state }, names as strings';

/** The names each kind of probe carries (see `Probe`). */
const PROBE_FIELDS: Readonly<Record<Probe["kind"], readonly string[]>> = { node: ["node"], difference: ["plus", "minus"], current: ["part"], state: ["part", "state"] };

/** A probe of a known kind whose names are strings. */
function isProbe(value: unknown): value is Probe {
  if (!isObject(value) || typeof value.kind !== "string" || !Object.hasOwn(PROBE_FIELDS, value.kind)) return false;
  return PROBE_FIELDS[value.kind as Probe["kind"]].every((name) => typeof value[name] === "string");
}

function numberRule(range: { readonly min?: number; readonly minExclusive?: boolean; readonly max?: number; readonly integer?: boolean }): string {
  const kind = range.integer ? "a whole number" : "a finite number";
  if (range.min !== undefined && range.max !== undefined) return range.minExclusive ? `${kind} above ${range.min} up to ${range.max}` : `${kind} from ${range.min} to ${range.max}`;
  if (range.min !== undefined) return `${kind} ${range.minExclusive ? "above" : "of at least"} ${range.min}`;
  return range.max !== undefined ? `${kind} up to ${range.max}` : kind;
}

/** Checks an optional options argument: absent or an object. */
export function checkOptions(api: string, options: unknown): void {
  if (options !== undefined && !isObject(options)) throw badArgument(`${api}: options must be an object, got ${describe(options)}`);
}

/** Checks a time in seconds: finite and above 0 (or absent when `optional`). */
export function checkSeconds(api: string, name: string, value: unknown, optional = false): void {
  if (optional && value === undefined) return;
  if (!(typeof value === "number" && Number.isFinite(value) && value > 0)) throw badArgument(`${api}: ${name} must be a finite time above 0 s, got ${describe(value)}`);
}

/** A value as messages show it, short. */
export function describe(value: unknown): string {
  if (typeof value === "string") return JSON.stringify(value.length > 40 ? `${value.slice(0, 40)}…` : value);
  if (typeof value === "number" || typeof value === "boolean" || typeof value === "bigint" || value === undefined || value === null) return String(value);
  if (Array.isArray(value)) return `an array of ${value.length}`;
  return typeof value === "function" ? "a function" : "an object";
}

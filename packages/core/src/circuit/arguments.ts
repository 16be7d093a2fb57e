import type { AnalysisSpec, Circuit } from "./circuit.js";
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

import { badArgument, describeArgument } from "@onset/core";
import type { Program } from "./syntax.js";

// The package's public functions check their arguments here before anything else (docs/language.md
// §6): what they cannot take is an OnsetError with code `bad-argument` whose message begins with
// the function's name; the functions behind them trust what they are given.

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === "object" && value !== null;
}

/** The programs this package made: the only syntax trees its functions accept. */
const made = new WeakSet<object>();

/** Marks a program made by `parseText` or `loadProgram`. */
export function madeProgram<P extends Program>(program: P): P {
  made.add(program);
  return program;
}

export function checkText(api: string, name: string, value: unknown): asserts value is string {
  if (typeof value !== "string") throw badArgument(`${api}: ${name} must be a string, got ${describeArgument(value)}`);
}

export function checkOptionalText(api: string, name: string, value: unknown): void {
  if (value !== undefined) checkText(api, name, value);
}

/** An options argument: absent or an object. */
export function checkOptionsObject(api: string, name: string, value: unknown): asserts value is Record<string, unknown> | undefined {
  if (value !== undefined && !isObject(value)) throw badArgument(`${api}: ${name} must be an object, got ${describeArgument(value)}`);
}

/** A syntax tree this package made (a copy or a hand-built tree is refused: the functions behind trust its shape). */
export function checkMadeProgram(api: string, value: unknown): asserts value is Program {
  if (!isObject(value) || !made.has(value)) {
    throw badArgument(`${api}: program must be one that parseText or loadProgram returned (unchanged), got ${describeArgument(value)}`);
  }
}

/** An include reader: absent, or an object with a `resolve` function. */
export function checkResolver(api: string, name: string, value: unknown): void {
  if (value !== undefined && !(isObject(value) && typeof value.resolve === "function")) {
    throw badArgument(`${api}: ${name} must be an include reader ({ resolve(from, path, { maxBytes }) }), got ${describeArgument(value)}`);
  }
}

/** Overrides by name: absent, or an object of numbers or value texts (`"2.2k"`). */
export function checkOverrides(api: string, value: unknown): void {
  if (value === undefined) return;
  if (!isObject(value) || Array.isArray(value) || !Object.values(value).every((v) => typeof v === "number" || typeof v === "string")) {
    throw badArgument(`${api}: overrides must be an object of numbers or value texts by name, got ${describeArgument(value)}`);
  }
}

/** Options with `overrides` and `limits` (of `elaborate`, `checkProgram`, `buildCircuit`). */
export function checkProgramOptions(api: string, value: unknown): void {
  checkOptionsObject(api, "options", value);
  checkOverrides(api, value?.overrides);
  checkOptionsObject(api, "options.limits", value?.limits);
}

/** A whole number that may be used as an offset into a text. */
export function checkOffset(api: string, name: string, value: unknown): void {
  if (!(typeof value === "number" && Number.isSafeInteger(value) && value >= 0)) throw badArgument(`${api}: ${name} must be a whole number ≥ 0, got ${describeArgument(value)}`);
}

/** A loaded source as `loadSource` returns it. */
export function checkCircuitSource(api: string, value: unknown): void {
  if (!isObject(value)) throw badArgument(`${api}: source must be what loadSource returned, got ${describeArgument(value)}`);
  checkMadeProgram(api, value.program);
  const sources = value.sources;
  if (!(isObject(sources) && typeof sources.get === "function")) throw badArgument(`${api}: source.sources must be a map of texts by file name, got ${describeArgument(sources)}`);
}

/** A diagnostic as the functions of both packages make it. */
export function checkDiagnostic(api: string, value: unknown): void {
  const d = value;
  const ok =
    isObject(d) &&
    (d.severity === "error" || d.severity === "warning") &&
    typeof d.message === "string" &&
    (d.hint === undefined || typeof d.hint === "string") &&
    (d.notes === undefined || (Array.isArray(d.notes) && d.notes.every((n) => typeof n === "string"))) &&
    (d.span === undefined || (isObject(d.span) && typeof d.span.file === "string" && isOffset(d.span.start) && isOffset(d.span.end)));
  if (!ok) throw badArgument(`${api}: diagnostic must have a severity (error or warning), a message and an optional span { file, start, end }, got ${describeArgument(value)}`);
}

function isOffset(value: unknown): boolean {
  return typeof value === "number" && Number.isSafeInteger(value) && value >= 0;
}

/** Where the renderer finds texts: an object with a `get(file)` function. */
export function checkSourceFiles(api: string, value: unknown): void {
  if (!(isObject(value) && typeof value.get === "function")) throw badArgument(`${api}: sources must be a map of texts by file name (an object with get), got ${describeArgument(value)}`);
}

const WORD = /^[^\s"#=()]+$/u;
const finite = (v: unknown) => typeof v === "number" && Number.isFinite(v);
const word = (v: unknown) => typeof v === "string" && WORD.test(v);
const line = (v: unknown) => typeof v === "string" && !/[\r\n]/.test(v);
const optionValue = (v: unknown) => finite(v) || word(v) || (Array.isArray(v) && v.length > 0 && v.every((x) => finite(x) || word(x)));

/** A designed file as `designOscillator` returns it: words without spaces, finite numbers, one-line comments. */
export function checkDesignedFile(api: string, value: unknown): void {
  const bad = (what: string) => badArgument(`${api}: file.${what}, got ${describeArgument(value)}`);
  if (!isObject(value)) throw badArgument(`${api}: file must be a designed file ({ header, title, parts, analyses, spec }), got ${describeArgument(value)}`);
  const list = (key: string) => {
    const v = value[key];
    if (!Array.isArray(v)) throw bad(`${key} must be an array`);
    return v as unknown[];
  };
  if (!list("header").every(line)) throw bad("header must be lines of text");
  if (!line(value.title)) throw bad("title must be one line of text");
  for (const p of list("parts")) {
    const ok =
      isObject(p) &&
      word(p.kind) &&
      word(p.name) &&
      Array.isArray(p.nodes) &&
      p.nodes.every(word) &&
      (p.value === undefined || finite(p.value)) &&
      (p.tolerance === undefined || finite(p.tolerance)) &&
      (p.comment === undefined || line(p.comment)) &&
      (p.options === undefined || (isObject(p.options) && Object.entries(p.options).every(([k, v]) => word(k) && optionValue(v))));
    if (!ok) throw bad("parts must each have a kind, a name and nodes (words), and a finite value");
  }
  for (const a of list("analyses")) {
    const ok = isObject(a) && word(a.keyword) && (a.options === undefined || (Array.isArray(a.options) && a.options.every((o) => Array.isArray(o) && o.length === 2 && word(o[0]) && (finite(o[1]) || word(o[1])))));
    if (!ok) throw bad("analyses must each have a keyword and [name, value] options");
  }
  for (const c of list("spec")) {
    const ok = isObject(c) && word(c.metric) && (c.test === "below" || c.test === "above" || c.test === "within") && finite(c.value) && (c.tolerance === undefined || finite(c.tolerance));
    if (!ok) throw bad("spec must hold criteria { metric, test, value }");
  }
}

import { badArgument, describe } from "../circuit/arguments.js";
import { isSeriesName, type SeriesName } from "./eseries.js";

// The design entries' door (docs/language.md §6): what they cannot take is an OnsetError
// `bad-argument` whose message begins with the function's name.

/** A finite number above 0. */
export function checkPositive(api: string, name: string, value: unknown): asserts value is number {
  if (!(typeof value === "number" && Number.isFinite(value) && value > 0)) throw badArgument(`${api}: ${name} must be a finite number above 0, got ${describe(value)}`);
}

/** A model's result, which arguments at the edge of the number range can make infinite or NaN: refused, not returned. */
export function finiteResult(api: string, value: number, args: string): number {
  if (!Number.isFinite(value)) throw badArgument(`${api}: ${args} are outside the range the formula can evaluate (it gives ${value})`);
  return value;
}

/** A finite number. */
export function checkFinite(api: string, name: string, value: unknown): asserts value is number {
  if (!(typeof value === "number" && Number.isFinite(value))) throw badArgument(`${api}: ${name} must be a finite number, got ${describe(value)}`);
}

export function checkSeries(api: string, value: unknown): asserts value is SeriesName {
  if (!(typeof value === "string" && isSeriesName(value))) throw badArgument(`${api}: series must be E6, E12, E24 or E96, got ${describe(value)}`);
}

export function checkFunction(api: string, name: string, value: unknown): asserts value is (...args: never[]) => unknown {
  if (typeof value !== "function") throw badArgument(`${api}: ${name} must be a function, got ${describe(value)}`);
}

/** A caller's callback whose every result must be a finite number above 0. */
export function positiveResults<A extends unknown[]>(api: string, name: string, f: (...args: A) => unknown): (...args: A) => number {
  return (...args) => {
    const value = f(...args);
    if (!(typeof value === "number" && Number.isFinite(value) && value > 0)) throw badArgument(`${api}: ${name} must return a finite number above 0, returned ${describe(value)}`);
    return value;
  };
}

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === "object" && value !== null;
}

const TOPOLOGIES = ["wien", "twin-t", "phase-shift"];

/** The request of `designOscillator`: its shape and types (its ranges are checked where they are used, with their own codes). */
export function checkDesignRequest(api: string, request: unknown, options: unknown): void {
  if (!isObject(request)) throw badArgument(`${api}: request must be an object ({ topology, frequency, … }), got ${describe(request)}`);
  if (!TOPOLOGIES.includes(request.topology as string)) throw badArgument(`${api}: topology must be one of ${TOPOLOGIES.join(", ")}, got ${describe(request.topology)}`);
  if (typeof request.frequency !== "number") throw badArgument(`${api}: frequency must be a number (Hz), got ${describe(request.frequency)}`);
  if (request.capacitor !== undefined && typeof request.capacitor !== "number") throw badArgument(`${api}: capacitor must be a number (F), got ${describe(request.capacitor)}`);
  if (request.series !== undefined) checkSeries(api, request.series);
  if (request.preset !== undefined && typeof request.preset !== "string") throw badArgument(`${api}: preset must be a preset name, got ${describe(request.preset)}`);
  if (request.startupTime !== undefined) checkPositive(api, "startupTime", request.startupTime);
  const rails = request.rails;
  if (rails !== undefined && !(Array.isArray(rails) && rails.length === 2 && rails.every((r) => typeof r === "number" && Number.isFinite(r)) && rails[0] < 0 && rails[1] > 0)) {
    throw badArgument(`${api}: rails must be [negative, positive] finite volts, got ${describe(rails)}`);
  }
  if (request.limit !== undefined && typeof request.limit !== "string") throw badArgument(`${api}: limit must be an amplitude limit's name, got ${describe(request.limit)}`);
  if (options !== undefined && !isObject(options)) throw badArgument(`${api}: options must be an object, got ${describe(options)}`);
  if (options?.simulate !== undefined) checkFunction(api, "options.simulate", options.simulate);
}

const orNull = (v: unknown) => v === null || (typeof v === "number" && !Number.isNaN(v));

/** What a caller's `simulate` returned: a verdict and numbers (or null). */
export function checkSimulated(api: string, value: unknown): void {
  const ok = isObject(value) && typeof value.verdict === "string" && orNull(value.frequency) && orNull(value.amplitude) && orNull(value.thd) && orNull(value.startupTime);
  if (!ok) throw badArgument(`${api}: options.simulate must return { verdict, frequency, amplitude, thd, startupTime } (numbers or null), returned ${describe(value)}`);
}

import { badArgument, describe } from "../circuit/arguments.js";
import { QUANTITIES, type LteAbsoluteSetting, type NewtonAbsoluteSetting, type Quantity } from "./quantities.js";

/** Accuracy settings of the solvers. Defaults are documented in DEVELOPERS.md. */
export interface Tolerances extends Readonly<Record<NewtonAbsoluteSetting | LteAbsoluteSetting, number>> {
  /**
   * Relative tolerance of a time step's Newton update, against max(|x|, the unknown's running
   * peak): a tenth of the LTE tolerance, on the same scale. @defaultValue 1e-5
   */
  readonly newtonRelative: number;
  /** Relative tolerance of the bias point's last Newton update. @defaultValue 1e-9 */
  readonly biasRelative: number;
  /** Absolute tolerance of a Newton update on a voltage (V). @defaultValue 1e-9 */
  readonly newtonVoltage: number;
  /** Absolute tolerance of a Newton update on a current (A). @defaultValue 1e-12 */
  readonly newtonCurrent: number;
  /** Absolute tolerance of a Newton update on a temperature (K). @defaultValue 1e-7 */
  readonly newtonTemperature: number;
  /** Relative local-truncation-error tolerance, against each state's running peak. @defaultValue 1e-4 */
  readonly lteRelative: number;
  /** Absolute LTE tolerance on a voltage (V). @defaultValue 1e-6 */
  readonly lteVoltage: number;
  /** Absolute LTE tolerance on a current (A). @defaultValue 1e-9 */
  readonly lteCurrent: number;
  /** Absolute LTE tolerance on a temperature (K). @defaultValue 1e-4 */
  readonly lteTemperature: number;
  /** Newton iterations per transient step before the step is cut. @defaultValue 30 */
  readonly stepIterations: number;
  /** Newton iterations of one bias-point attempt. @defaultValue 150 */
  readonly biasIterations: number;
}

/** The solver settings an analysis uses unless `options.tolerances` changes some (DEVELOPERS.md, "Solver defaults"). */
export const DEFAULT_TOLERANCES: Tolerances = {
  newtonRelative: 1e-5,
  biasRelative: 1e-9,
  newtonVoltage: 1e-9,
  newtonCurrent: 1e-12,
  newtonTemperature: 1e-7,
  lteRelative: 1e-4,
  lteVoltage: 1e-6,
  lteCurrent: 1e-9,
  lteTemperature: 1e-4,
  stepIterations: 30,
  biasIterations: 150,
};

/** Each unknown's absolute floor of the Newton update or of the truncation error, by its quantity. */
export function absoluteTolerances(quantities: readonly { readonly quantity: Quantity }[], tolerances: Tolerances, test: "newton" | "lte"): Float64Array {
  return Float64Array.from(quantities, (u) => tolerances[QUANTITIES[u.quantity][test]]);
}

/** A time step's Newton update is held to this fraction of its truncation-error tolerance. */
const NEWTON_SHARE_RELATIVE = 0.1;
/** …and its absolute floor to this fraction of the LTE floor. */
const NEWTON_SHARE_ABSOLUTE = 1e-3;

/**
 * The defaults with the given settings on top. A truncation-error setting given without its
 * Newton counterpart carries the Newton setting along (a tenth of the relative, a thousandth of
 * the absolute), so that tightening the step control never leaves the iteration error above it.
 */
export function resolveTolerances(given: Partial<Tolerances> = {}): Tolerances {
  checkTolerances(given);
  const out: Record<string, number> = { ...DEFAULT_TOLERANCES, ...given };
  if (given.lteRelative !== undefined && given.newtonRelative === undefined) out.newtonRelative = NEWTON_SHARE_RELATIVE * given.lteRelative;
  for (const { newton, lte } of Object.values(QUANTITIES)) {
    const floor = given[lte];
    if (floor !== undefined && given[newton] === undefined) out[newton] = NEWTON_SHARE_ABSOLUTE * floor;
  }
  // One literal, so every run's tolerances share one shape (a spread's result took the given keys' order).
  return {
    newtonRelative: out.newtonRelative!,
    biasRelative: out.biasRelative!,
    newtonVoltage: out.newtonVoltage!,
    newtonCurrent: out.newtonCurrent!,
    newtonTemperature: out.newtonTemperature!,
    lteRelative: out.lteRelative!,
    lteVoltage: out.lteVoltage!,
    lteCurrent: out.lteCurrent!,
    lteTemperature: out.lteTemperature!,
    stepIterations: out.stepIterations!,
    biasIterations: out.biasIterations!,
  };
}

/** The same settings with every truncation-error and Newton tolerance (relative and absolute) `factor` times as loose. */
export function loosenedTolerances(tolerances: Tolerances, factor: number): Tolerances {
  const scaled: Record<string, number> = { newtonRelative: factor * tolerances.newtonRelative, lteRelative: factor * tolerances.lteRelative };
  for (const { newton, lte } of Object.values(QUANTITIES)) {
    scaled[newton] = factor * tolerances[newton];
    scaled[lte] = factor * tolerances[lte];
  }
  return resolveTolerances({ ...tolerances, ...scaled });
}

/**
 * The step-control settings of an analysis's `accuracy=` (relative) and `accuracy-floor=` (the
 * absolute floor of a voltage): every quantity's floor scales with the voltage's, keeping the
 * defaults' ratios (1 nA and 0.1 mK per µV). Unset values leave the defaults.
 */
export function accuracyTolerances(relative: number | undefined, voltageFloor: number | undefined): Partial<Tolerances> {
  const out: Record<string, number> = {};
  if (relative !== undefined) out.lteRelative = relative;
  if (voltageFloor !== undefined) {
    for (const { lte } of Object.values(QUANTITIES)) out[lte] = (voltageFloor * DEFAULT_TOLERANCES[lte]) / DEFAULT_TOLERANCES.lteVoltage;
  }
  return out as Partial<Tolerances>;
}

/**
 * A caller's tolerances (`options.tolerances` of every analysis) at the door: each given one a
 * finite number from 0 (0 asks for the exact answer, which fails with a placed error), the
 * iteration counts whole numbers above 0. A NaN there made every step's error test
 * fail silently (a steady analysis then reported that the shooting drove the period to zero).
 */
function checkTolerances(given: Partial<Tolerances>): void {
  if (typeof given !== "object" || given === null) throw badArgument(`options.tolerances must be an object such as { lteRelative: 1e-5 }, got ${describe(given)}`);
  for (const [key, value] of Object.entries(given)) {
    if (value === undefined) continue;
    if (!(key in DEFAULT_TOLERANCES)) throw badArgument(`options.tolerances.${key} is not a tolerance (${Object.keys(DEFAULT_TOLERANCES).join(", ")})`);
    const whole = key === "stepIterations" || key === "biasIterations";
    if (!(typeof value === "number" && Number.isFinite(value) && (whole ? Number.isInteger(value) && value > 0 : value >= 0))) {
      throw badArgument(`options.tolerances.${key} must be ${whole ? "a whole number above 0" : "a finite number from 0"}, got ${describe(value)}`);
    }
  }
}

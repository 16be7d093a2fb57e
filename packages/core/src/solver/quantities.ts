/**
 * The physical quantities an unknown of the MNA vector can be. Each row names its unit and the
 * tolerance settings that hold its absolute error floors, so adding a quantity (a control
 * state, a flux) is one row here and two settings in `Tolerances`, and no code chooses
 * tolerances by testing a kind.
 */
export const QUANTITIES = {
  voltage: { unit: "V", newton: "newtonVoltage", lte: "lteVoltage" },
  current: { unit: "A", newton: "newtonCurrent", lte: "lteCurrent" },
  temperature: { unit: "K", newton: "newtonTemperature", lte: "lteTemperature" },
} as const;

/** A physical quantity an unknown can be: `voltage`, `current` or `temperature`. */
export type Quantity = keyof typeof QUANTITIES;

/** The unit symbol a quantity is reported in (SI base units). */
export type QuantityUnit = (typeof QUANTITIES)[Quantity]["unit"];

/** The names of the absolute-tolerance settings, one Newton and one LTE setting per quantity. */
export type NewtonAbsoluteSetting = (typeof QUANTITIES)[Quantity]["newton"];
export type LteAbsoluteSetting = (typeof QUANTITIES)[Quantity]["lte"];

/** The SI unit symbol a quantity is reported in. */
export function unitOf(quantity: Quantity): QuantityUnit {
  return QUANTITIES[quantity].unit;
}

/** True when `word` names a quantity of {@link QUANTITIES}. */
export function isQuantity(word: string): word is Quantity {
  return Object.hasOwn(QUANTITIES, word);
}

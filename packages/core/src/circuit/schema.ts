import type { Quantity } from "../solver/quantities.js";

/**
 * What each part kind accepts, declared by the device file itself so that the language checker,
 * the formatter, the docs and the engine agree on names, units, defaults and ranges.
 */

/** Unit symbols as the language writes them; `1` is a plain ratio; `S` is siemens (A/V). */
export type UnitSymbol = "Ω" | "F" | "H" | "V" | "A" | "S" | "s" | "Hz" | "V/s" | "V/√Hz" | "rad" | "K" | "W/K" | "1/V" | "1";

interface OptionBase {
  /** One line for docs and hints. */
  readonly summary: string;
}

/** A numeric option with its unit, default and range, e.g. `gbw=1M`. */
export interface NumberOption extends OptionBase {
  readonly type: "number";
  readonly unit: UnitSymbol;
  /** Accepts a ratio in dB (20·log10), e.g. `gain=106dB`. */
  readonly decibel?: boolean;
  readonly default?: number;
  /** Inclusive lower bound unless `minExclusive`. */
  readonly min?: number;
  readonly minExclusive?: boolean;
  readonly max?: number;
  readonly integer?: boolean;
  /** `Infinity` is a meaningful setting (written `inf`), e.g. an unlimited slew rate. */
  readonly allowInfinite?: boolean;
}

/** An option that takes one of a few words, e.g. `taper=audio`. */
export interface WordOption extends OptionBase {
  readonly type: "word";
  readonly words: readonly string[];
  readonly default?: string;
}

/** Two numbers in parentheses, e.g. `rails=(-12, 12)`. */
export interface NumberPairOption extends OptionBase {
  readonly type: "number-pair";
  readonly unit: UnitSymbol;
}

/** Two node names in parentheses, e.g. `supply=(vee, vcc)`; resolved like pins. */
export interface NodePairOption extends OptionBase {
  readonly type: "node-pair";
  /**
   * What the nodes need when nothing else sets their voltage, for the hint of a floating node.
   * @defaultValue {@link SENSED_NODE_NEEDS}: the part senses these nodes and draws no current.
   */
  readonly needs?: string;
}

/** What a node only sensed by a part (a node option such as `supply=`) needs by default. */
export const SENSED_NODE_NEEDS = "a voltage source to gnd";

/** `[t0 v0, t1 v1, ...]`: pairs of numbers with the given units. */
export interface PointsOption extends OptionBase {
  readonly type: "points";
  readonly units: readonly [UnitSymbol, UnitSymbol];
}

/** A name defined elsewhere in the file, e.g. `preset=general`. */
export interface NameOption extends OptionBase {
  readonly type: "name";
}

/** Any option of a part kind, told apart by `type`. */
export type OptionSchema =
  | NumberOption
  | WordOption
  | NumberPairOption
  | NodePairOption
  | PointsOption
  | NameOption;

/** The positional value of a part (its resistance, capacitance, …): unit, whether required, lower bound. */
export interface ValueSchema {
  readonly unit: UnitSymbol;
  readonly required: boolean;
  readonly min?: number;
  readonly minExclusive?: boolean;
  readonly summary: string;
}

/** An internal state a part kind declares (probed as `PART.state`): its quantity and what it is. */
export interface StateSchema {
  readonly quantity: Quantity;
  readonly summary: string;
}

/** Everything the language knows about one part kind: pins, value, options (read by the checker, formatter and docs). */
export interface PartKindSchema {
  readonly kind: string;
  readonly summary: string;
  /** Pin names in the order they are written. */
  readonly pins: readonly string[];
  /**
   * What a node reached only through a pin needs so that its DC voltage is defined, by pin name,
   * where that is more than the usual DC path to gnd (for the hint of a floating node).
   */
  readonly pinNeeds?: Readonly<Record<string, string>>;
  /** The positional value after the pins, or `null` when the kind takes none. */
  readonly value: ValueSchema | null;
  readonly options: Readonly<Record<string, OptionSchema>>;
  /**
   * Option sets chosen by one word option (sources: `wave=sine|pulse|steps|noise`).
   * Options of the chosen variant are allowed in addition to `options`.
   */
  readonly variants?: {
    readonly key: string;
    readonly sets: Readonly<Record<string, Readonly<Record<string, OptionSchema>>>>;
  };
  /**
   * States inside the part that a probe may name as `PART.state` (`U1.pole`, `D1.junction`),
   * with the quantity each one is; branch currents are probed as `PART.i` and are not listed.
   */
  readonly states?: Readonly<Record<string, StateSchema>>;
}

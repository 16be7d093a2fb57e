import type { OptionValue } from "../circuit/circuit.js";

/**
 * A circuit file as data, for a caller that writes one (`onset design`): the language package
 * prints it (`printDesignedFile` in `@onset/netlist-parser`, through its formatter), so core
 * never writes language text. Numbers in SI base units.
 */
export interface DesignedFile {
  /** Comment lines at the head, without their `#` (an empty string is a bare `#`). */
  readonly header: readonly string[];
  readonly title: string;
  readonly parts: readonly DesignedPart[];
  readonly analyses: readonly DesignedAnalysis[];
  /** The criteria of the file's `spec` line (none: no spec line). */
  readonly spec: readonly DesignedCriterion[];
}

/** A part line: its value with a relative tolerance, its options, and a comment after it. */
export interface DesignedPart {
  readonly kind: string;
  readonly name: string;
  readonly nodes: readonly string[];
  readonly value?: number;
  /** Fraction of the value, written as a percentage (`±1%`). */
  readonly tolerance?: number;
  readonly options?: Readonly<Record<string, OptionValue>>;
  readonly comment?: string;
}

/** An analysis line: its keyword and its options in order (numbers, or words such as `auto`). */
export interface DesignedAnalysis {
  readonly keyword: string;
  readonly options?: readonly (readonly [string, number | string])[];
}

/**
 * A criterion of the spec: `metric<value`, `metric>value`, or `metric=value±tolerance`
 * (tolerance a fraction of the value); `percent` writes the value as a percentage (`thd<3%`).
 */
export interface DesignedCriterion {
  readonly metric: string;
  readonly test: "below" | "above" | "within";
  readonly value: number;
  readonly tolerance?: number;
  readonly percent?: boolean;
}

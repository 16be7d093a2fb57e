import type { Probe } from "./circuit.js";
import type { SourceSpan } from "./diagnostic.js";
import type { UnitSymbol } from "./schema.js";

/**
 * What each analysis statement accepts, declared by the analysis itself (`analyses/kinds/`) so
 * that the language's checker, elaboration and docs read one table.
 */

/** Range rules of a number option (inclusive bounds unless `minExclusive`). */
export interface AnalysisRange {
  readonly min?: number;
  readonly minExclusive?: boolean;
  readonly max?: number;
  readonly integer?: boolean;
}

interface AnalysisOptionBase {
  /** One line for docs and hints (`end time`, `largest time step`). */
  readonly summary: string;
  /** The statement is an error without it (`transient needs until=`). */
  readonly required?: boolean;
}

/** A number in a unit, optionally also one of a few words (`until=auto`). */
export interface AnalysisNumberOption extends AnalysisOptionBase, AnalysisRange {
  readonly type: "number";
  readonly unit: UnitSymbol;
  readonly words?: readonly string[];
}

/** One of a few words (`kick=thermal`). */
export interface AnalysisWordOption extends AnalysisOptionBase {
  readonly type: "word";
  readonly words: readonly string[];
}

/** A probe (`probe=o`), a list of probes (`probes=(o, U1.pole)`) or the name of an independent source (`from=Vin`). */
export interface AnalysisNameOption extends AnalysisOptionBase {
  readonly type: "probe" | "probes" | "source";
}

/** Any option of an analysis statement, told apart by `type`. */
export type AnalysisOption = AnalysisNumberOption | AnalysisWordOption | AnalysisNameOption;

/** The options of an analysis statement by key, in the order docs and hints list them. */
export type AnalysisOptions = Readonly<Record<string, AnalysisOption>>;

/**
 * The options of one analysis statement as the language read them, each checked against its
 * schema (unit, range, words) and in SI base units: a number option written as one of its
 * words is in `words`.
 */
export interface AnalysisOptionValues {
  readonly numbers: Readonly<Record<string, number>>;
  readonly words: Readonly<Record<string, string>>;
  readonly probes: Readonly<Record<string, Probe>>;
  readonly probeLists: Readonly<Record<string, readonly Probe[]>>;
  /** The keys written on the line (a value set from outside the file, `--set startup.accuracy=…`, is not). */
  readonly written: ReadonlySet<string>;
  /** The probe-able internal states the file's parts carry (`temperature` for lamps and thermistors). */
  readonly partStates?: ReadonlySet<string>;
  /** Where each written option's value is in the source, by key, for a spec that places later errors there. */
  readonly spans?: Readonly<Record<string, SourceSpan>>;
}

/** Where on an option a problem is shown: its key (`bandwidth=`) or its value. */
export type OptionPlace = "key" | "value";

/**
 * How an analysis reports a rule that spans options (`stop=` above `start=`): the language
 * turns it into a positioned diagnostic on the option named (on the keyword when the option
 * was not written on the line).
 */
export interface AnalysisChecks {
  /** Stops the statement with an error. */
  fail(option: string, place: OptionPlace, code: string, message: string, hint: string): never;
  /** Reports a warning and goes on. */
  warn(option: string, place: OptionPlace, code: string, message: string, hint: string): void;
}

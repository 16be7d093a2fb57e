import type { AnalysisKeyword } from "./keywords.js";
import type { Comment } from "./tokens.js";
import type { NumberLiteral } from "./units.js";

/** Offsets into the file's text (end exclusive); the file is the enclosing `Program`'s. */
export interface Span {
  readonly start: number;
  readonly end: number;
}

/** A name as written, with where. */
export interface Identifier {
  readonly name: string;
  readonly span: Span;
}

// ---------------------------------------------------------------- expressions (inside parentheses)

/** An expression inside parentheses: numbers, parameter names, operators and function calls. */
export type Expr =
  | { readonly kind: "number"; readonly literal: NumberLiteral; readonly span: Span }
  | { readonly kind: "name"; readonly name: string; readonly span: Span }
  | { readonly kind: "unary"; readonly op: "-"; readonly operand: Expr; readonly span: Span }
  | { readonly kind: "binary"; readonly op: "+" | "-" | "*" | "/" | "^"; readonly left: Expr; readonly right: Expr; readonly span: Span }
  | { readonly kind: "call"; readonly callee: Identifier; readonly args: readonly Expr[]; readonly span: Span }
  /** Parentheses inside an expression: one item groups, several make a list (`(o, ref)`). */
  | { readonly kind: "group"; readonly items: readonly Expr[]; readonly span: Span };

// ---------------------------------------------------------------- values (after `=` and in value positions)

/** `±1%`, `+-2mV`, `±(x)`: a tolerance attached to a value. */
export interface Tolerance {
  /** True when written with ASCII `+-`. */
  readonly ascii: boolean;
  readonly value: { readonly kind: "number"; readonly literal: NumberLiteral; readonly span: Span } | { readonly kind: "paren"; readonly items: readonly Expr[]; readonly span: Span };
  readonly span: Span;
}

/** What stands after `=` or in a value position: a number, an expression, a word, a list or points, with an optional tolerance. */
export type Value =
  /** A number outside parentheses, e.g. `10k`, `-12`, `22k±1%`. */
  | { readonly kind: "number"; readonly negative: boolean; readonly literal: NumberLiteral; readonly tolerance?: Tolerance; readonly span: Span }
  /** Parentheses: `(2*C)` (one item), `(-12, 12)` or `(a, (o, ref), R1.i)` (a list). */
  | { readonly kind: "paren"; readonly negative: boolean; readonly items: readonly Expr[]; readonly tolerance?: Tolerance; readonly span: Span }
  /** A bare word: `sine`, `general`, `inf`, a node `o`, a probe `R1.i`. */
  | { readonly kind: "word"; readonly name: string; readonly span: Span }
  /** `[t0 v0, t1 v1, ...]`: rows of whitespace-separated items. */
  | { readonly kind: "points"; readonly rows: readonly (readonly Expr[])[]; readonly span: Span };

/** `key=value` on a part, preset, `use` or analysis line. */
export interface OptionNode {
  readonly key: string;
  readonly keySpan: Span;
  readonly value: Value;
  readonly span: Span;
}

/** A block parameter: `R=11k` (with a default) or a bare `R` (given by every `use`). */
export interface BlockParamNode {
  readonly name: string;
  readonly nameSpan: Span;
  readonly value?: Value;
  readonly span: Span;
}

// ---------------------------------------------------------------- statements

/** `title "…"`. */
export interface TitleStatement {
  readonly kind: "title";
  readonly text: string;
  readonly textSpan: Span;
  readonly span: Span;
}

/** `param NAME = VALUE`. */
export interface ParamStatement {
  readonly kind: "param";
  readonly name: string;
  readonly nameSpan: Span;
  readonly value: Value;
  /** The word `each` after a toleranced value: every use of the parameter draws its own value. */
  readonly each: boolean;
  /** Where `each` is written. */
  readonly eachSpan?: Span;
  readonly span: Span;
}

/** `include "PATH"`, with the included program once the loader has read it. */
export interface IncludeStatement {
  readonly kind: "include";
  readonly path: string;
  readonly pathSpan: Span;
  readonly span: Span;
  /** Set by `loadProgram`: the included file, parsed (and its own includes followed). */
  readonly program?: Program;
  /** Set by `loadProgram` when the file was already included elsewhere (each file counts once). */
  readonly repeated?: boolean;
}

/** `preset NAME KIND options…`: named option values for a part kind. */
export interface PresetStatement {
  readonly kind: "preset";
  readonly name: string;
  readonly nameSpan: Span;
  readonly partKind: string;
  readonly partKindSpan: Span;
  readonly options: readonly OptionNode[];
  readonly span: Span;
}

/** A part line: `KIND NAME pins… [value] [options…]`. */
export interface PartStatement {
  readonly kind: "part";
  readonly partKind: string;
  readonly partKindSpan: Span;
  readonly name: string;
  readonly nameSpan: Span;
  readonly pins: readonly Identifier[];
  readonly value?: Value;
  readonly options: readonly OptionNode[];
  readonly span: Span;
}

/** `use NAME BLOCK nodes… [params…]`: an instance of a block. */
export interface UseStatement {
  readonly kind: "use";
  readonly name: string;
  readonly nameSpan: Span;
  readonly block: string;
  readonly blockSpan: Span;
  readonly nodes: readonly Identifier[];
  readonly params: readonly OptionNode[];
  readonly span: Span;
}

/** `block NAME (ports) [params]` … `end`: a reusable sub-circuit. */
export interface BlockStatement {
  readonly kind: "block";
  readonly name: string;
  readonly nameSpan: Span;
  readonly ports: readonly Identifier[];
  readonly params: readonly BlockParamNode[];
  readonly body: readonly Statement[];
  /** The header line (`block … params`). */
  readonly headerSpan: Span;
  /** The `end` word. */
  readonly endSpan: Span;
  readonly span: Span;
}

/** An argument of an analysis: `key=value`, or a bare flag such as `log`. */
export type AnalysisArg = ({ readonly kind: "option" } & OptionNode) | { readonly kind: "flag"; readonly name: string; readonly span: Span };

/** An analysis line: `transient until=1m`, `sweep R from=1k to=2k steps=5`, …. */
export interface AnalysisStatement {
  readonly kind: "analysis";
  readonly analysis: Exclude<AnalysisKeyword, "spec">;
  readonly keywordSpan: Span;
  /** The sweep target (`sweep R …`, `sweep P1.at …`). */
  readonly target?: Identifier;
  readonly args: readonly AnalysisArg[];
  readonly span: Span;
}

/** One criterion of a `spec` line: `frequency=1k±2%`, `thd<0.5%`, `amplitude=3..5`. */
export interface CriterionNode {
  readonly metric: string;
  readonly metricSpan: Span;
  readonly op: "=" | "<" | ">";
  readonly value: Value;
  /** The upper end of a range `low..high`. */
  readonly high?: Value;
  readonly span: Span;
}

/** `spec` with its criteria. */
export interface SpecStatement {
  readonly kind: "spec";
  readonly criteria: readonly CriterionNode[];
  readonly span: Span;
}

/** Any statement of a program, told apart by `kind`. */
export type Statement =
  | TitleStatement
  | ParamStatement
  | IncludeStatement
  | PresetStatement
  | PartStatement
  | UseStatement
  | BlockStatement
  | AnalysisStatement
  | SpecStatement;

/** One parsed file: its statements in order and its comments. */
export interface Program {
  readonly file: string;
  /** The file's text, for messages and the formatter. */
  readonly text: string;
  readonly statements: readonly Statement[];
  readonly comments: readonly Comment[];
}

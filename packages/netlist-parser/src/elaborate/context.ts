import { didYouMean, type Diagnostic, type PartSpec, type SourceSpan, type ToleranceSpec, type UnitSymbol } from "@onset/core";
import { AlreadyReported, raise, raisedDiagnostic } from "../errors.js";
import { evaluate, soleLiteral, soleName, type EvalContext } from "../evaluate.js";
import { formatQuantity } from "../format-number.js";
import { parseQuantityWith } from "../quantity.js";
import type { Tolerance, Value } from "../syntax.js";
import { unitMismatch, unitName, unitSuffix, type NumberLiteral, type UnitExpectation } from "../units.js";
import { spanIn, type Located, type ProgramIndex } from "./index-program.js";
import type { ParamEntry, Scope } from "./scope.js";

/** Longest chain of parameters reading parameters; bounds the evaluator's recursion. */
const MAX_PARAM_DEPTH = 256;

/** What a numeric context accepts. */
export interface NumberExpectation extends UnitExpectation {
  readonly allowInfinite?: boolean;
}

/** Range rules of a number (the schema's). */
export interface RangeRule {
  readonly min?: number;
  readonly minExclusive?: boolean;
  readonly max?: number;
  readonly integer?: boolean;
}

/** `--set` values by override name. */
export type Overrides = Readonly<Record<string, string | number>>;

interface OverrideSlot {
  readonly raw: string | number;
  used: boolean;
  parsed?: number;
  failed?: boolean;
}

/** A name that `--set` (and `sweep`) accepts, with the unit its values are in. */
export interface TargetInfo {
  readonly expect: NumberExpectation;
  readonly range?: RangeRule;
  /** What the value is, for hints (`wiper position …`). */
  readonly summary?: string;
}

/** The state of one elaboration: overrides, what has been found, and the problems so far. */
export class Elaboration {
  readonly diagnostics: Diagnostic[] = [];
  readonly parts: PartSpec[] = [];
  readonly partKindsByName = new Map<string, string>();
  /** Every node a part touches (recorded before its values are checked, so probes still resolve). */
  readonly nodes = new Set<string>();
  readonly tolerances: ToleranceSpec[] = [];
  readonly targets = new Map<string, TargetInfo>();
  private readonly overrides = new Map<string, OverrideSlot>();
  /** Parameters whose written value is being evaluated, innermost last. */
  private readonly evaluating: ParamEntry[] = [];

  constructor(
    readonly index: ProgramIndex,
    overrides: Overrides,
  ) {
    for (const [k, v] of Object.entries(overrides)) this.overrides.set(k, { raw: v, used: false });
  }

  /** Runs one statement's work; a raised problem is recorded and the statement skipped. */
  attempt<T>(work: () => T): T | undefined {
    try {
      return work();
    } catch (e) {
      const d = raisedDiagnostic(e);
      if (d) {
        this.diagnostics.push(d);
        return undefined;
      }
      if (e instanceof AlreadyReported) return undefined;
      throw e;
    }
  }

  registerTarget(name: string, info: TargetInfo): void {
    if (!this.targets.has(name)) this.targets.set(name, info);
  }

  /** The override given for `target`, parsed in the target's unit; undefined when none. */
  override(target: string, info: TargetInfo): number | undefined {
    const slot = this.overrides.get(target);
    if (!slot) return undefined;
    slot.used = true;
    if (slot.failed) throw new AlreadyReported();
    if (slot.parsed !== undefined) return slot.parsed;
    const parsed = typeof slot.raw === "number" ? slot.raw : parseQuantityWith(slot.raw, info.expect, `the value set for ${target}`);
    if (typeof parsed !== "number" || !Number.isFinite(parsed) && !(info.expect.allowInfinite && parsed === Infinity)) {
      slot.failed = true;
      this.diagnostics.push(
        typeof parsed === "number"
          ? { severity: "error", stage: "input", code: "bad-override", message: `the value set for ${target} is not a finite number`, hint: "give a number such as 10k" }
          : parsed,
      );
      throw new AlreadyReported();
    }
    slot.parsed = parsed;
    return parsed;
  }

  /** Overrides that named nothing, as diagnostics with the closest name suggested. */
  unusedOverrides(): Diagnostic[] {
    const out: Diagnostic[] = [];
    for (const [name, slot] of this.overrides) {
      if (slot.used) continue;
      const known = this.targets.get(name);
      if (known) {
        // A target that exists but whose statement failed earlier: still check the value.
        const parsed = typeof slot.raw === "number" ? slot.raw : parseQuantityWith(slot.raw, known.expect, `the value set for ${name}`);
        if (typeof parsed !== "number") out.push(parsed);
        continue;
      }
      out.push({
        severity: "error",
        stage: "input",
        code: "unknown-override",
        message: `cannot set '${name}': no parameter, part value or part option has that name${didYouMean(name, this.targets.keys())}`,
        hint: "set a parameter (R), a part's value (Ra, N1.Ra), a part option (P1.at) or an instance parameter (N1.R)",
      });
    }
    return out;
  }

  /** The evaluation context of expressions written in `where`, reading parameters of `scope`. */
  evalContext(scope: Scope, where: Located<unknown>): EvalContext {
    return { file: where.file, param: (name, span) => this.param(scope, name, span) };
  }

  param(scope: Scope, name: string, span: SourceSpan): number {
    let entry = scope.lookup(name);
    // A parameter's own expression does not see itself: in `block b (x) R=(R)` the default
    // reads the file's R.
    const current = this.evaluating[this.evaluating.length - 1];
    if (entry && entry === current && scope.params.get(name) === entry) entry = scope.parent?.lookup(name) ?? entry;
    if (!entry) {
      raise("unknown-param", `unknown parameter '${name}'${didYouMean(name, scope.visibleParams())}`, span, {
        hint: `define it with: param ${name} = …`,
      });
    }
    return this.paramValue(entry);
  }

  /** A parameter's value: its override, else its written value. */
  paramValue(entry: ParamEntry): number {
    const set = this.override(entry.target, { expect: { unit: entry.unit } });
    return set ?? this.writtenValue(entry);
  }

  /** A parameter's written value, evaluated once (other parameters' overrides apply inside it). */
  writtenValue(entry: ParamEntry): number {
    switch (entry.state) {
      case "done":
        return entry.result!;
      case "failed":
        throw new AlreadyReported();
      case "busy":
        raise("param-cycle", `parameter '${entry.name}' depends on itself`, entry.span, { hint: "a parameter's expression cannot use it, directly or through others" });
    }
    if (this.evaluating.length >= MAX_PARAM_DEPTH) {
      raise("too-deep", `parameters depend on each other more than ${MAX_PARAM_DEPTH} levels deep`, entry.span, { hint: "shorten the chain of parameters" });
    }
    entry.state = "busy";
    this.evaluating.push(entry);
    try {
      if (!entry.value) raise("missing-block-param", `parameter '${entry.name}' has no value`, entry.span);
      entry.result = this.number(entry.value, { unit: undefined }, entry.evalScope, entry.where, `parameter ${entry.name}`);
      entry.state = "done";
      return entry.result;
    } catch (e) {
      entry.state = "failed";
      const d = raisedDiagnostic(e);
      if (d) {
        this.diagnostics.push(d);
        throw new AlreadyReported();
      }
      throw e;
    } finally {
      this.evaluating.pop();
    }
  }

  /** Evaluates a value that must be one number, checking a written unit against `expect`. */
  number(value: Value, expect: NumberExpectation, scope: Scope, where: Located<unknown>, what: string): number {
    switch (value.kind) {
      case "number": {
        checkUnit(value.literal, expect, what, spanIn(where, value.span));
        return value.negative ? -value.literal.value : value.literal.value;
      }
      case "paren": {
        if (value.items.length !== 1) {
          raise("unexpected-list", `${what} takes one number, not a list of ${value.items.length}`, spanIn(where, value.span), {
            hint: "remove the commas, or write the list where a pair is expected",
          });
        }
        const item = value.items[0]!;
        const lit = soleLiteral(item);
        if (lit?.literal.symbol !== undefined) {
          checkUnit(lit.literal, expect, what, spanIn(where, lit.span));
          const v = lit.negative ? -lit.literal.value : lit.literal.value;
          return value.negative ? -v : v;
        }
        const name = soleName(item);
        if (name && expect.unit !== undefined) {
          const entry = scope.lookup(name.name);
          if (entry?.unit !== undefined && entry.unit !== expect.unit && !(expect.unit === "1" && entry.unit === "1")) {
            raise("unit-mismatch", `unit mismatch: parameter ${name.name} ${isIn(entry.unit)}, but ${what} ${isIn(expect.unit)}`, spanIn(where, name.span), {
              hint: `use a parameter in ${unitName(expect.unit)} here`,
            });
          }
        }
        const v = evaluate(item, this.evalContext(scope, where));
        return value.negative ? -v : v;
      }
      case "word":
        if (value.name === "inf") {
          if (expect.allowInfinite) return Infinity;
          raise("out-of-range", `${what} cannot be infinite`, spanIn(where, value.span), { hint: "write a finite number" });
        }
        return raise("expected-number", `${what} takes a number, not '${value.name}'`, spanIn(where, value.span), {
          hint: scope.lookup(value.name) ? `write (${value.name}) to use the parameter` : "write a number such as 10k, or an expression in ( )",
        });
      case "points":
        return raise("expected-number", `${what} takes a number, not a list of points`, spanIn(where, value.span), {
          hint: "write a number such as 10k, or an expression in ( )",
        });
    }
  }

  /** A value's tolerance: relative (written with `%`) or absolute (in the value's unit). */
  tolerance(tol: Tolerance, expect: NumberExpectation, scope: Scope, where: Located<unknown>, what: string): { relative: number } | { absolute: number } {
    const v = tol.value;
    let result: { relative: number } | { absolute: number };
    if (v.kind === "number" && v.literal.form === "percent") result = { relative: v.literal.value };
    else if (v.kind === "number") {
      checkUnit(v.literal, expect, `the tolerance of ${what}`, spanIn(where, v.span));
      result = { absolute: v.literal.value };
    } else result = { absolute: this.number({ kind: "paren", negative: false, items: v.items, span: v.span }, expect, scope, where, `the tolerance of ${what}`) };
    const size = "relative" in result ? result.relative : result.absolute;
    if (!(size >= 0) || !Number.isFinite(size)) {
      raise("out-of-range", `the tolerance of ${what} must not be negative`, spanIn(where, tol.span), { hint: "write a tolerance such as ±1% or ±2mV" });
    }
    return result;
  }

  /** Records a tolerance entry for Monte Carlo: the target, its written nominal and the band. */
  addTolerance(target: string, nominal: number, band: { relative: number } | { absolute: number }, span: SourceSpan): void {
    this.tolerances.push({ target, nominal, ...band, span });
  }
}

/** `is in ohms (Ω)`, or `is a plain ratio`. */
function isIn(unit: UnitSymbol): string {
  return unit === "1" ? "is a plain ratio" : `is in ${unitName(unit)}`;
}

function formName(literal: NumberLiteral): string {
  switch (literal.form) {
    case "percent":
      return "percent";
    case "decibel":
      return "decibels";
    case "degree":
      return "degrees";
    case "si":
      return unitName(literal.symbol!);
  }
}

/** Raises `unit-mismatch` when a literal's unit does not fit. */
export function checkUnit(literal: NumberLiteral, expect: NumberExpectation, what: string, span: SourceSpan | undefined): void {
  const reason = unitMismatch(literal, expect);
  if (reason === undefined) return;
  const plain = `${literal.mantissa}${literal.prefix ?? ""}`;
  const exp = expect.unit!;
  const suffix = unitSuffix(exp);
  const hint =
    exp === "1"
      ? `write a plain number such as ${plain}${expect.decibel ? ", a percentage or a gain in dB" : " or a percentage"}`
      : `write ${plain} or ${plain}${suffix}`;
  raise("unit-mismatch", `unit mismatch: '${literal.text}' is in ${formName(literal)}, but ${what} ${isIn(exp)}`, span, { hint });
}

/** Raises `out-of-range` or `not-integer` when `v` breaks the rule. */
export function checkRange(v: number, rule: RangeRule, unit: UnitSymbol | undefined, what: string, span: SourceSpan | undefined, hint?: string): void {
  const extra = hint === undefined ? {} : { hint };
  if (rule.integer && Number.isFinite(v) && !Number.isInteger(v)) {
    raise("not-integer", `${what} must be a whole number, got ${formatQuantity(v, unit)}`, span, extra);
  }
  const { min, max } = rule;
  const belowMin = min !== undefined && (rule.minExclusive ? !(v > min) : !(v >= min));
  const aboveMax = max !== undefined && !(v <= max);
  if (!belowMin && !aboveMax) return;
  let rangeText: string;
  if (min !== undefined && max !== undefined) rangeText = `between ${formatQuantity(min, unit)} and ${formatQuantity(max, unit)}`;
  else if (min !== undefined) rangeText = `${rule.minExclusive ? "greater than" : "at least"} ${formatQuantity(min, unit)}`;
  else rangeText = `at most ${formatQuantity(max!, unit)}`;
  raise("out-of-range", `${what} must be ${rangeText}, got ${formatQuantity(v, unit)}`, span, extra);
}

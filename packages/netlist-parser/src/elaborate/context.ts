import { didYouMean, type Diagnostic, type PartSpec, type SourceSpan, type ToleranceSpec, type UnitSymbol } from "@onset/core";
import { AlreadyReported, raise, raisedDiagnostic } from "../errors.js";
import { evaluate, scaledName, soleLiteral, soleName, type EvalContext } from "../evaluate.js";
import { parseQuantityWith } from "../quantity.js";
import type { Expr, Tolerance, Value } from "../syntax.js";
import { unitName } from "../units.js";
import { checkUnit, isIn, type NumberExpectation, type RangeRule } from "./value-checks.js";
import { spanIn, type Located, type ProgramIndex } from "./index-program.js";
import type { ParamEntry, Scope, ToleranceBand } from "./scope.js";
import { raiseHint, SOURCE_LIMITS } from "../source-limits.js";

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

/**
 * A place that reads parameters: a part's value or option (its override name, `R1`, `P1.at`, and
 * the part), or another parameter's value. Per-use draws of an `each` parameter are named after
 * it: `R@R1`, `R@P1.at`, `R@N1.R`.
 */
export interface UsePlace {
  readonly target: string;
  readonly part?: string;
  readonly param?: ParamEntry;
}

/** Joins a parameter's override name and the place reading it into the name of its per-use draw. */
export function perUseName(param: string, place: string): string {
  return `${param}@${place}`;
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
  /** The part value or option being evaluated, innermost last. */
  private readonly places: UsePlace[] = [];
  /** Every place that read each parameter directly, by the place's override name. */
  readonly paramUses = new Map<ParamEntry, Map<string, UsePlace>>();
  /** Units of the part values and options where a parameter stands alone (`(C)`), and where it is scaled by plain numbers (`(2*C)`). */
  private readonly paramUnits = new Map<ParamEntry, { alone: Set<UnitSymbol>; scaled: Set<UnitSymbol> }>();
  /** Tolerance entries a parameter made, by target: their unit is known once every use is seen. */
  private readonly paramTolerances = new Map<string, ParamEntry>();

  constructor(
    readonly index: ProgramIndex,
    overrides: Overrides,
    /** Longest chain of parameters reading parameters; bounds the evaluator's recursion. */
    private readonly maxParameterDepth: number = SOURCE_LIMITS.maxParameterDepth,
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
        message: `cannot set '${name}': no parameter, part value, part option or analysis option has that name${didYouMean(name, this.targets.keys())}`,
        hint: "set a parameter (R), a part's value (Ra, N1.Ra), a part option (P1.at), an instance parameter (N1.R) or an analysis option (startup.accuracy)",
      });
    }
    return out;
  }

  /** The evaluation context of expressions written in `where`, reading parameters of `scope`. */
  evalContext(scope: Scope, where: Located<unknown>): EvalContext {
    return { file: where.file, param: (name, span) => this.param(scope, name, span) };
  }

  /** Runs `work` with `place` as the reader of the parameters it evaluates. */
  atPlace<T>(place: UsePlace, work: () => T): T {
    this.places.push(place);
    try {
      return work();
    } finally {
      this.places.pop();
    }
  }

  /** Who is reading parameters now: the innermost parameter being evaluated, else the part value or option. */
  private currentPlace(): UsePlace | undefined {
    const param = this.evaluating[this.evaluating.length - 1];
    return param ? { target: param.target, param } : this.places[this.places.length - 1];
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
    const place = this.currentPlace();
    if (place) {
      const uses = this.paramUses.get(entry) ?? new Map<string, UsePlace>();
      uses.set(place.target, place);
      this.paramUses.set(entry, uses);
      // Analysis options read the nominal value: a draw belongs to a part, not to a run setting.
      if (entry.each) return this.perUseValue(entry, place);
    }
    return this.paramValue(entry);
  }

  /**
   * The value an `each` parameter has at one place: its own draw (`R@R1`) when the study sets
   * it, else the nominal (the parameter's override or written value). The first read at a place
   * records the per-use tolerance entry.
   */
  private perUseValue(entry: ParamEntry, place: UsePlace): number {
    const target = perUseName(entry.target, place.target);
    const info: TargetInfo = { expect: { unit: entry.unit }, summary: `value of parameter ${entry.target} drawn for ${place.target}` };
    const nominal = this.paramValue(entry);
    if (!this.targets.has(target)) {
      this.registerTarget(target, info);
      const band = this.eachBand(entry);
      if (band) {
        this.tolerances.push({ target, nominal, ...band, span: spanIn(entry.where, entry.value!.span) });
        this.paramTolerances.set(target, entry);
      }
    }
    return this.override(target, info) ?? nominal;
  }

  /** The tolerance band of an `each` parameter, evaluated once (a failure is reported once). */
  eachBand(entry: ParamEntry): ToleranceBand | undefined {
    if (entry.band !== undefined) return entry.band ?? undefined;
    const v = entry.value;
    const tol = v && (v.kind === "number" || v.kind === "paren") ? v.tolerance : undefined;
    entry.band = null;
    if (!tol) return undefined;
    const band = this.attempt(() => this.tolerance(tol, { unit: entry.unit }, entry.evalScope, entry.where, `parameter ${entry.target}`));
    entry.band = band ?? null;
    return band;
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
    if (this.evaluating.length >= this.maxParameterDepth) {
      raise("too-deep", `parameters depend on each other more than ${this.maxParameterDepth} levels deep, past the parameter-depth limit`, entry.span, {
        hint: `shorten the chain of parameters, or ${raiseHint("maxParameterDepth", String(2 * this.maxParameterDepth))}`,
      });
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
        if (expect.unit !== undefined && this.places.length > 0) this.noteUnit(scope, item, expect.unit);
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

  /** Records a tolerance entry for Monte Carlo: the target, its written nominal, the band and the unit of its values. */
  addTolerance(target: string, nominal: number, band: ToleranceBand, span: SourceSpan, unit: UnitSymbol | undefined): void {
    this.tolerances.push({ target, nominal, ...band, ...(unit === undefined ? {} : { unit }), span });
  }

  /** Records the one shared tolerance entry of a parameter (its unit is filled in from its uses). */
  addParamTolerance(entry: ParamEntry, band: ToleranceBand, span: SourceSpan): void {
    this.tolerances.push({ target: entry.target, nominal: entry.result!, ...band, span });
    this.paramTolerances.set(entry.target, entry);
  }

  /** The parameters that made one shared tolerance entry (not `each`), with the entry's span. */
  sharedParamTolerances(): Array<{ entry: ParamEntry; span: SourceSpan | undefined }> {
    return this.tolerances.flatMap((t) => {
      const entry = this.paramTolerances.get(t.target);
      return entry && !entry.each ? [{ entry, span: t.span }] : [];
    });
  }

  /** Notes the unit of a part value or option on the parameter its expression stands for (alone or scaled). */
  private noteUnit(scope: Scope, item: Expr, unit: UnitSymbol): void {
    const scaled = scaledName(item);
    const entry = scaled && scope.lookup(scaled.name);
    if (!entry) return;
    const units = this.paramUnits.get(entry) ?? { alone: new Set<UnitSymbol>(), scaled: new Set<UnitSymbol>() };
    (soleName(item) ? units.alone : units.scaled).add(unit);
    this.paramUnits.set(entry, units);
  }

  /**
   * The unit of a parameter: written on its value, else the one unit of every part value or
   * option it stands in alone, else of every one it is scaled into by plain numbers.
   */
  paramUnit(entry: ParamEntry): UnitSymbol | undefined {
    if (entry.unit !== undefined) return entry.unit;
    const units = this.paramUnits.get(entry);
    if (!units) return undefined;
    const set = units.alone.size > 0 ? units.alone : units.scaled;
    return set.size === 1 ? [...set][0] : undefined;
  }

  /** The tolerance entries, in the order they were found, with the units of parameters filled in. */
  toleranceSpecs(): ToleranceSpec[] {
    return this.tolerances.map((t) => {
      const entry = this.paramTolerances.get(t.target);
      const unit = entry ? this.paramUnit(entry) : undefined;
      return unit === undefined || t.unit !== undefined ? t : { ...t, unit };
    });
  }
}

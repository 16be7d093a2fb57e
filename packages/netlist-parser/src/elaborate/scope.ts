import type { SourceSpan, UnitSymbol } from "@onset/core";
import { GROUND } from "@onset/core";
import type { Located } from "./index-program.js";
import type { Value } from "../syntax.js";

/** One parameter: a file `param`, a block parameter of an instance, or a `param` inside a block. */
export interface ParamEntry {
  /** The name inside its scope (`R`). */
  readonly name: string;
  /** Its override name (`R`, `N1.R`). */
  readonly target: string;
  /** The written value (the `use` line's, else the block default); undefined when none was given. */
  readonly value: Value | undefined;
  /** Where the written value is, and the scope its expressions read. */
  readonly where: Located<unknown>;
  readonly evalScope: Scope;
  readonly span: SourceSpan;
  /** The unit written on a plain literal value, if any. */
  readonly unit: UnitSymbol | undefined;
  /** A `param` line (not a block parameter): it may be written with `each`. */
  readonly paramLine?: boolean;
  /** Where `each` is written: every use draws its own value under a tolerance study. */
  readonly each?: SourceSpan;
  state: "new" | "busy" | "done" | "failed";
  result?: number;
  /** The tolerance band of an `each` parameter, evaluated once; null when it failed or is missing. */
  band?: ToleranceBand | null;
}

/** A tolerance band: relative (a fraction) or absolute (in the value's unit). */
export type ToleranceBand = { relative: number } | { absolute: number };

/** What a name in a scope stands for (one namespace for parameters, parts and instances). */
export interface NameEntry {
  readonly what: string;
  readonly where: Located<unknown>;
  readonly span: { start: number; end: number };
}

/** The names visible at one level: the file's top level, or one block instance. */
export class Scope {
  readonly params = new Map<string, ParamEntry>();
  readonly names = new Map<string, NameEntry>();

  constructor(
    /** The file scope for an instance (blocks see file parameters), undefined at the top. */
    readonly parent: Scope | undefined,
    /** `""` at the top, `N1.` inside instance N1. */
    readonly prefix: string,
    /** Port name → outer node, for an instance. */
    readonly ports: ReadonlyMap<string, string> = new Map(),
  ) {}

  lookup(name: string): ParamEntry | undefined {
    return this.params.get(name) ?? this.parent?.lookup(name);
  }

  /** Every parameter name visible here, for suggestions. */
  visibleParams(): string[] {
    return [...this.params.keys(), ...(this.parent?.visibleParams() ?? [])];
  }

  /** The circuit node a node name written in this scope denotes. */
  node(name: string): string {
    if (name === GROUND) return GROUND;
    return this.ports.get(name) ?? this.prefix + name;
  }
}

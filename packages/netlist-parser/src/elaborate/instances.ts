import { didYouMean, type UnitSymbol } from "@onset/core";
import { problem, raise } from "../errors.js";
import { soleLiteral } from "../evaluate.js";
import { reservedNames } from "../keywords.js";
import type { BlockStatement, OptionNode, PartStatement, Statement, UseStatement, Value } from "../syntax.js";
import type { Elaboration } from "./context.js";
import { located, placeOf, spanIn, type Located } from "./index-program.js";
import { elaboratePart } from "./parts.js";
import { Scope, type ParamEntry } from "./scope.js";

/** The unit written on a value that is a plain literal (`33nF`, `(33nF)`), if any. */
export function writtenUnit(value: Value | undefined): UnitSymbol | undefined {
  if (!value) return undefined;
  if (value.kind === "number") return value.literal.symbol;
  if (value.kind === "paren" && value.items.length === 1) return soleLiteral(value.items[0]!)?.literal.symbol;
  return undefined;
}

/** Claims a name in a scope; a second claim is `duplicate-name` with a note at the first. */
function claim(ctx: Elaboration, scope: Scope, name: string, what: string, where: Located<unknown>, span: { start: number; end: number }): boolean {
  const first = scope.names.get(name);
  if (first) {
    ctx.diagnostics.push(
      problem("duplicate-name", `'${scope.prefix}${name}' is already defined, as ${first.what}`, spanIn(where, span), {
        hint: "parameters, parts and instances share one set of names: give each its own",
        notes: [`first defined at ${placeOf(first.where, first.span)}`],
      }),
    );
    return false;
  }
  scope.names.set(name, { what, where, span });
  return true;
}

function addParam(ctx: Elaboration, scope: Scope, entry: Omit<ParamEntry, "state">): void {
  const full: ParamEntry = { ...entry, state: "new" };
  scope.params.set(entry.name, full);
  ctx.registerTarget(entry.target, { expect: { unit: entry.unit } });
}

/** Registers the parameters and names of one scope's statements (before anything is evaluated). */
function declare(ctx: Elaboration, scope: Scope, statements: readonly Located<Statement>[]): void {
  for (const l of statements) {
    const node = l.node;
    if (node.kind === "param") {
      if (reservedNames.has(node.name)) {
        ctx.diagnostics.push(problem("reserved-name", `'${node.name}' is reserved and cannot name a parameter`, spanIn(l, node.nameSpan), { hint: "choose another name" }));
        continue;
      }
      if (!claim(ctx, scope, node.name, `parameter ${scope.prefix}${node.name}`, l, node.nameSpan)) continue;
      addParam(ctx, scope, {
        name: node.name,
        target: scope.prefix + node.name,
        value: node.value,
        where: l,
        evalScope: scope,
        span: spanIn(l, node.nameSpan),
        unit: writtenUnit(node.value),
        paramLine: true,
        ...(node.eachSpan ? { each: spanIn(l, node.eachSpan) } : {}),
      });
    } else if (node.kind === "part") {
      claim(ctx, scope, node.name, `${node.partKind} ${scope.prefix}${node.name}`, l, node.nameSpan);
    } else if (node.kind === "use") {
      claim(ctx, scope, node.name, `instance ${scope.prefix}${node.name} of block ${node.block}`, l, node.nameSpan);
    }
  }
}

/**
 * Evaluates every parameter of a scope (so errors in unused ones are reported) and records
 * tolerances: one shared entry per toleranced parameter, except for `each` parameters, whose
 * entries are made per use where they are read.
 */
function settle(ctx: Elaboration, scope: Scope): void {
  for (const entry of scope.params.values()) ctx.attempt(() => ctx.writtenValue(entry));
  for (const entry of scope.params.values()) {
    const v = entry.value;
    const tol = v && (v.kind === "number" || v.kind === "paren") ? v.tolerance : undefined;
    if (entry.each && !tol) {
      ctx.diagnostics.push(
        problem("each-without-tolerance", `parameter ${entry.target} is marked each but has no tolerance to draw`, entry.each, {
          hint: `write a tolerance on the value, e.g. param ${entry.name} = 10k±1% each, or remove each`,
        }),
      );
      continue;
    }
    if (!v || !tol || entry.state !== "done") continue;
    if (entry.each) {
      ctx.eachBand(entry);
      continue;
    }
    ctx.attempt(() => {
      const band = ctx.tolerance(tol, { unit: entry.unit }, entry.evalScope, entry.where, `parameter ${entry.target}`);
      ctx.addParamTolerance(entry, band, spanIn(entry.where, v.span));
    });
  }
}

/** Elaborates the statements of the file's top level (or of a block instance) into parts. */
export function elaborateScope(ctx: Elaboration, scope: Scope, globals: Scope, statements: readonly Located<Statement>[], failedPresets: ReadonlySet<string>, stack: readonly string[]): void {
  declare(ctx, scope, statements);
  settle(ctx, scope);
  for (const l of statements) {
    if (l.node.kind === "part") {
      const part = l as Located<PartStatement>;
      ctx.attempt(() => elaboratePart(ctx, part, scope, failedPresets));
    } else if (l.node.kind === "use") {
      const use = l as Located<UseStatement>;
      ctx.attempt(() => instantiate(ctx, use, scope, globals, failedPresets, stack));
    }
  }
}

/** Flattens one `use` line: ports bound to the outer nodes, parameters set, the body elaborated. */
function instantiate(ctx: Elaboration, l: Located<UseStatement>, outer: Scope, globals: Scope, failedPresets: ReadonlySet<string>, stack: readonly string[]): void {
  const use = l.node;
  const inst = outer.prefix + use.name;
  const def = ctx.index.blocks.get(use.block);
  if (!def) {
    raise("unknown-block", `unknown block '${use.block}'${didYouMean(use.block, ctx.index.blocks.keys())}`, spanIn(l, use.blockSpan), {
      hint: `define it with: block ${use.block} (ports) … end`,
    });
  }
  const block: BlockStatement = def.node;
  if (stack.includes(block.name)) {
    raise("block-cycle", `block '${block.name}' uses itself`, spanIn(l, use.blockSpan), {
      hint: "a block cannot contain an instance of itself, directly or through other blocks",
      notes: [`uses: ${[...stack, block.name].join(" → ")}`],
    });
  }
  const ports = block.ports.map((p) => p.name);
  if (use.nodes.length !== ports.length) {
    const where = use.nodes.length > 0 ? { start: use.nodes[0]!.span.start, end: use.nodes[use.nodes.length - 1]!.span.end } : use.blockSpan;
    raise("port-count", `block ${block.name} has ${ports.length} ${ports.length === 1 ? "port" : "ports"} (${ports.join(", ")}), but ${use.nodes.length} ${use.nodes.length === 1 ? "node is" : "nodes are"} written for ${inst}`, spanIn(l, where), {
      hint: `write one node per port after the block name: use ${use.name} ${block.name} ${ports.join(" ")}`,
    });
  }
  const portMap = new Map<string, string>();
  ports.forEach((p, i) => {
    const node = outer.node(use.nodes[i]!.name);
    portMap.set(p, node);
    ctx.nodes.add(node);
  });
  const inner = new Scope(globals, `${inst}.`, portMap);
  const body = block.body.map((s) => located(s, def.file, def.text));

  const given = new Map<string, OptionNode>();
  for (const p of use.params) {
    if (given.has(p.key)) raise("duplicate-option", `${p.key}= is given twice for ${inst}`, spanIn(l, p.keySpan), { hint: "keep one of them" });
    given.set(p.key, p);
  }
  const declared = new Set(block.params.map((p) => p.name));
  for (const p of use.params) {
    if (!declared.has(p.key)) {
      raise("unknown-block-param", `block ${block.name} has no parameter '${p.key}'${didYouMean(p.key, declared)}`, spanIn(l, p.keySpan), {
        hint: declared.size > 0 ? `parameters of ${block.name}: ${[...declared].join(", ")}` : `block ${block.name} takes no parameters`,
      });
    }
  }
  for (const p of block.params) {
    const g = given.get(p.name);
    const value = g?.value ?? p.value;
    if (!value) {
      raise("missing-block-param", `${inst} needs ${p.name}= (block ${block.name} gives it no default)`, spanIn(l, use.nameSpan), {
        hint: `write ${p.name}=… on the use line`,
      });
    }
    inner.names.set(p.name, { what: `parameter ${inst}.${p.name} of block ${block.name}`, where: def, span: p.nameSpan });
    addParam(ctx, inner, {
      name: p.name,
      target: `${inst}.${p.name}`,
      value,
      where: g ? l : def,
      evalScope: g ? outer : inner,
      span: g ? spanIn(l, g.keySpan) : spanIn(def, p.nameSpan),
      unit: writtenUnit(value),
    });
  }
  elaborateScope(ctx, inner, globals, body, failedPresets, [...stack, block.name]);
}

import { didYouMean, GROUND, type Probe, type SourceSpan } from "@onset/core";
import { raise } from "../errors.js";
import { soleLiteral, soleName } from "../evaluate.js";
import type { Expr, Value } from "../syntax.js";
import type { Elaboration } from "./context.js";
import { spanIn, type Located } from "./index-program.js";

/** A node or branch-current probe named by a word: `o`, `N1.m1`, `R1.i`. */
function probeOfName(ctx: Elaboration, name: string, at: SourceSpan): Probe {
  if (name.endsWith(".i")) {
    const part = name.slice(0, -2);
    if (ctx.partKindsByName.has(part)) return { kind: "current", part };
    if (!ctx.nodes.has(name)) {
      raise("unknown-part", `unknown part '${part}' in probe '${name}'${didYouMean(part, ctx.partKindsByName.keys())}`, at, {
        hint: "a current probe names a part: R1.i is the current through R1 from its first pin to its second",
      });
    }
  }
  return { kind: "node", node: checkNode(ctx, name, at) };
}

/** Raises `unknown-node` (closest node suggested) unless the circuit has the node. */
function checkNode(ctx: Elaboration, name: string, at: SourceSpan): string {
  if (name === GROUND || ctx.nodes.has(name)) return name;
  raise("unknown-node", `unknown node '${name}'${didYouMean(name, ctx.nodes)}`, at, {
    hint: "a probe names a node that a part touches (hierarchical inside instances: N1.m1), a difference (o, ref), or a current R1.i",
  });
}

function probeOfExpr(ctx: Elaboration, l: Located<unknown>, item: Expr, allowDifference: boolean): Probe {
  const at = spanIn(l, item.span);
  const lit = soleLiteral(item);
  if (lit && lit.literal.value === 0 && lit.literal.symbol === undefined) raise("node-zero", "node '0' is not ground in this language", at, { hint: "write gnd for the ground node" });
  const name = soleName(item);
  if (name) return probeOfName(ctx, name.name, at);
  if (allowDifference && item.kind === "group" && item.items.length === 2) {
    const [a, b] = item.items.map((x) => probeOfExpr(ctx, l, x, false));
    if (a!.kind !== "node" || b!.kind !== "node") raise("bad-probe", "a difference probe takes two nodes", at, { hint: "write (o, ref)" });
    return { kind: "difference", plus: a.node, minus: b.node };
  }
  return raise("bad-probe", `'${l.text.slice(item.span.start, item.span.end)}' is not a probe`, at, {
    hint: "a probe is a node (o), a difference (o, ref) or a current (R1.i)",
  });
}

/** One probe: `probe=o`, `probe=(o, ref)`, `probe=R1.i`. */
export function probeOf(ctx: Elaboration, l: Located<unknown>, value: Value): Probe {
  const at = spanIn(l, value.span);
  if (value.kind === "word") return probeOfName(ctx, value.name, at);
  if (value.kind === "number" && value.literal.value === 0) raise("node-zero", "node '0' is not ground in this language", at, { hint: "write gnd for the ground node" });
  if (value.kind === "paren" && !value.negative && !value.tolerance) {
    const group: Expr = { kind: "group", items: value.items, span: value.span };
    return probeOfExpr(ctx, l, value.items.length === 1 ? value.items[0]! : group, true);
  }
  return raise("bad-probe", `'${l.text.slice(value.span.start, value.span.end)}' is not a probe`, at, {
    hint: "a probe is a node (o), a difference (o, ref) or a current (R1.i)",
  });
}

/** A probe list: `probes=(a, (o, ref), R1.i)`, or one probe. */
export function probesOf(ctx: Elaboration, l: Located<unknown>, value: Value): Probe[] {
  if (value.kind === "paren" && !value.negative && !value.tolerance && value.items.length > 1) {
    return value.items.map((item) => probeOfExpr(ctx, l, item, true));
  }
  return [probeOf(ctx, l, value)];
}


import { didYouMean, GROUND, partKinds, type Probe, type SourceSpan } from "@onset/core";
import { raise } from "../errors.js";
import { soleLiteral, soleName } from "../evaluate.js";
import type { Expr, Value } from "../syntax.js";
import type { Elaboration } from "./context.js";
import { spanIn, type Located } from "./index-program.js";

/** A part's internal state, `U1.pole`, when `name` is one; undefined when the part has no such state. */
function stateProbe(ctx: Elaboration, name: string, at: SourceSpan): Probe | undefined {
  const dot = name.lastIndexOf(".");
  if (dot <= 0 || ctx.nodes.has(name)) return undefined;
  const part = name.slice(0, dot);
  const state = name.slice(dot + 1);
  const kind = ctx.partKindsByName.get(part);
  if (kind === undefined || state === "i") return undefined;
  const states = Object.keys(partKinds[kind]?.states ?? {});
  if (states.includes(state)) return { kind: "state", part, state };
  const known = [...states.map((s) => `${part}.${s}`), `${part}.i`];
  raise("unknown-state", `${kind} ${part} has no state '${state}'${didYouMean(name, known)}`, at, {
    hint: `${part} can be probed as ${known.join(", ")}`,
  });
}

/** A node, branch-current or state probe named by a word: `o`, `N1.m1`, `R1.i`, `U1.pole`. */
function probeOfName(ctx: Elaboration, name: string, at: SourceSpan): Probe {
  const state = stateProbe(ctx, name, at);
  if (state) return state;
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
    hint: "a probe names a node that a part touches (hierarchical inside instances: N1.m1), a difference (o, ref), a current R1.i or a part's state such as U1.pole",
  });
}

/** The name of a probe that is a voltage (a node, or a part's voltage state), for a difference. */
function voltageName(ctx: Elaboration, probe: Probe): string | undefined {
  if (probe.kind === "node") return probe.node;
  const kind = probe.kind === "state" ? ctx.partKindsByName.get(probe.part) : undefined;
  if (probe.kind === "state" && partKinds[kind ?? ""]?.states?.[probe.state]?.quantity === "voltage") return `${probe.part}.${probe.state}`;
  return undefined;
}

function probeOfExpr(ctx: Elaboration, l: Located<unknown>, item: Expr, allowDifference: boolean): Probe {
  const at = spanIn(l, item.span);
  const lit = soleLiteral(item);
  if (lit && lit.literal.value === 0 && lit.literal.symbol === undefined) raise("node-zero", "node '0' is not ground in this language", at, { hint: "write gnd for the ground node" });
  const name = soleName(item);
  if (name) return probeOfName(ctx, name.name, at);
  if (allowDifference && item.kind === "group" && item.items.length === 2) {
    const [a, b] = item.items.map((x) => probeOfExpr(ctx, l, x, false)).map((p) => voltageName(ctx, p!));
    if (a === undefined || b === undefined) raise("bad-probe", "a difference probe takes two node voltages", at, { hint: "write (o, ref), or (D1.junction, k) for a voltage inside a part" });
    return { kind: "difference", plus: a, minus: b };
  }
  return raise("bad-probe", `'${l.text.slice(item.span.start, item.span.end)}' is not a probe`, at, {
    hint: "a probe is a node (o), a difference (o, ref), a current (R1.i) or a part's state (U1.pole)",
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
    hint: "a probe is a node (o), a difference (o, ref), a current (R1.i) or a part's state (U1.pole)",
  });
}

/** A probe list: `probes=(a, (o, ref), R1.i)`, or one probe. */
export function probesOf(ctx: Elaboration, l: Located<unknown>, value: Value): Probe[] {
  if (value.kind === "paren" && !value.negative && !value.tolerance && value.items.length > 1) {
    return value.items.map((item) => probeOfExpr(ctx, l, item, true));
  }
  return [probeOf(ctx, l, value)];
}


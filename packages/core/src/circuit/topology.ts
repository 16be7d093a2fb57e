import { deviceModels } from "../devices/registry.js";
import type { Circuit, PartSpec } from "./circuit.js";
import { GROUND } from "./circuit.js";
import type { Diagnostic } from "./diagnostic.js";
import { SENSED_NODE_NEEDS } from "./schema.js";

class DisjointSets {
  private readonly parent = new Map<string, string>();
  find(a: string): string {
    let root = a;
    for (let p = this.parent.get(root); p !== undefined && p !== root; p = this.parent.get(root)) root = p;
    let cur = a;
    while (cur !== root) {
      const next = this.parent.get(cur) ?? root;
      this.parent.set(cur, root);
      cur = next;
    }
    if (!this.parent.has(root)) this.parent.set(root, root);
    return root;
  }
  union(a: string, b: string): boolean {
    const ra = this.find(a);
    const rb = this.find(b);
    if (ra === rb) return false;
    this.parent.set(ra, rb);
    return true;
  }
}

/** Nodes named by a part: its pins and any node-valued options (an op-amp's `supply=`). */
export function nodesOfPart(part: PartSpec): string[] {
  const nodes = [...part.nodes];
  const supply = part.options.supply;
  if (Array.isArray(supply)) for (const n of supply) if (typeof n === "string") nodes.push(n);
  return nodes;
}

/** A node a part names in a role that needs more than a DC path: a sensed supply, a pin with declared needs. */
interface NodeRole {
  readonly node: string;
  /** How the part uses the node: `read by supply= of opamp U1, which draws no current`. */
  readonly role: string;
  readonly needs: string;
}

/** The nodes a part names through node options (sensed, drawing no current) and pins with declared needs. */
function nodeRoles(part: PartSpec): NodeRole[] {
  const schema = deviceModels[part.kind]?.schema;
  if (!schema) return [];
  const roles: NodeRole[] = [];
  schema.pins.forEach((pin, i) => {
    const needs = schema.pinNeeds?.[pin];
    const node = part.nodes[i];
    if (needs !== undefined && node !== undefined) roles.push({ node, role: `pin ${pin} of ${part.kind} ${part.name}`, needs });
  });
  for (const [key, option] of Object.entries(schema.options)) {
    const value = part.options[key];
    if (option.type !== "node-pair" || !Array.isArray(value)) continue;
    for (const node of value) {
      if (typeof node === "string") roles.push({ node, role: `read by ${key}= of ${part.kind} ${part.name}, which draws no current`, needs: option.needs ?? SENSED_NODE_NEEDS });
    }
  }
  return roles;
}

/**
 * The hint of a group of nodes without a DC path: what each node needs, from the roles the parts
 * give it (a supply node wants a source, not the resistor to gnd that fits a coupling node).
 */
function floatingHint(nodes: readonly string[], parts: readonly PartSpec[]): string {
  const roles = parts.flatMap(nodeRoles).filter((r) => nodes.includes(r.node));
  const needy = [...new Set(roles.map((r) => r.node))];
  const rest = nodes.filter((n) => !needy.includes(n));
  const sentences: string[] = [];
  for (const needs of new Set(roles.map((r) => r.needs))) {
    const mine = roles.filter((r) => r.needs === needs);
    const named = [...new Set(mine.map((r) => r.node))];
    const example = named[named.length - 1]!;
    sentences.push(
      `nothing sets the voltage of ${listNames(named)} (${[...new Set(mine.map((r) => r.role))].join("; ")}): ` +
        `give ${named.length === 1 ? "it" : "each"} ${needs} (vsource V${example.replace(/\./g, "_")} ${example} gnd VOLTS)`,
    );
  }
  if (rest.length > 0) {
    const [which, reach, their] = needy.length === 0 ? ["", "these nodes", "their"] : rest.length === 1 ? [`${listNames(rest)}: `, "it", "its"] : [`${listNames(rest)}: `, "them", "their"];
    sentences.push(`${which}only capacitors or current sources reach ${reach}, so ${their} DC voltage is undefined: add a resistor to gnd (a large one is enough)`);
  }
  return sentences.join("; ");
}

function listNames(names: readonly string[], limit = 6): string {
  const shown = names.slice(0, limit).map((n) => `'${n}'`).join(", ");
  return names.length > limit ? `${shown} and ${names.length - limit} more` : shown;
}

/** Breadth-first path between two nodes over voltage-defined edges, as the parts on it. */
function voltagePath(edges: ReadonlyArray<{ a: string; b: string; part: PartSpec }>, from: string, to: string): PartSpec[] {
  const prev = new Map<string, { node: string; part: PartSpec }>();
  const queue = [from];
  const seen = new Set([from]);
  while (queue.length > 0) {
    const n = queue.shift()!;
    if (n === to) break;
    for (const e of edges) {
      const other = e.a === n ? e.b : e.b === n ? e.a : undefined;
      if (other === undefined || seen.has(other)) continue;
      seen.add(other);
      prev.set(other, { node: n, part: e.part });
      queue.push(other);
    }
  }
  const parts: PartSpec[] = [];
  for (let n = to; prev.has(n); n = prev.get(n)!.node) parts.push(prev.get(n)!.part);
  return parts;
}

/**
 * Problems a circuit's wiring shows before anything is solved: nodes without a DC path to
 * ground (a cut-set of capacitors and current sources), loops of ideal voltage constraints
 * (sources, VCVS outputs, inductors without winding resistance), and nodes only one pin touches.
 */
export function checkTopology(circuit: Circuit): Diagnostic[] {
  const problems: Diagnostic[] = [];
  const dc = new DisjointSets();
  const touches = new Map<string, PartSpec[]>();
  const voltageEdges: Array<{ a: string; b: string; part: PartSpec }> = [];
  const voltageSets = new DisjointSets();
  dc.find(GROUND);
  for (const part of circuit.parts) {
    const model = deviceModels[part.kind];
    for (const n of nodesOfPart(part)) {
      dc.find(n);
      const list = touches.get(n);
      if (list) list.push(part);
      else touches.set(n, [part]);
    }
    if (!model) continue;
    const topo = model.topology(part);
    for (const [a, b] of topo.conducting) dc.union(a, b);
    for (const [a, b] of topo.voltageDefined) {
      if (a === b) continue;
      if (!voltageSets.union(a, b)) {
        const loop = [part, ...voltagePath(voltageEdges, a, b)];
        problems.push({
          severity: "error",
          stage: "input",
          code: "voltage-loop",
          message: `parts ${listNames(loop.map((p) => p.name))} form a loop of voltage sources${loop.some((p) => p.kind === "inductor") ? " and inductors" : ""}`,
          span: part.span,
          hint: "a loop of ideal voltage constraints has no unique current: add a series resistance (inductor series=) or remove one source",
          notes: loop.map((p) => `${p.kind} ${p.name} between '${p.nodes[0]}' and '${p.nodes[1]}'`),
        });
      }
      voltageEdges.push({ a, b, part });
    }
  }
  const ground = dc.find(GROUND);
  const floating = new Map<string, string[]>();
  for (const node of touches.keys()) {
    if (node === GROUND) continue;
    const root = dc.find(node);
    if (root === ground) continue;
    const group = floating.get(root);
    if (group) group.push(node);
    else floating.set(root, [node]);
  }
  for (const nodes of floating.values()) {
    const parts = [...new Set(nodes.flatMap((n) => touches.get(n) ?? []))];
    problems.push({
      severity: "error",
      stage: "input",
      code: "no-dc-path",
      message: `${nodes.length === 1 ? "node" : "nodes"} ${listNames(nodes)} ${nodes.length === 1 ? "has" : "have"} no DC path to gnd`,
      span: parts[0]?.span,
      hint: floatingHint(nodes, parts),
      notes: parts.map((p) => `${p.kind} ${p.name} touches ${listNames(nodesOfPart(p).filter((n) => nodes.includes(n)))}`),
    });
  }
  for (const [node, parts] of touches) {
    if (node === GROUND || parts.length !== 1) continue;
    const part = parts[0]!;
    if (nodesOfPart(part).filter((n) => n === node).length > 1) continue;
    problems.push({
      severity: "warning",
      stage: "input",
      code: "dangling-node",
      message: `node '${node}' is touched by one pin only (${part.kind} ${part.name})`,
      span: part.span,
      hint: "check the node name for a typo, or connect the pin",
    });
  }
  return problems;
}

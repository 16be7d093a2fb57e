import type { Diagnostic } from "@onset/core";
import { problem } from "../errors.js";
import { raiseHint, type SourceLimits } from "../source-limits.js";
import type { BlockStatement, UseStatement } from "../syntax.js";
import { spanIn, type Located, type ProgramIndex } from "./index-program.js";

/** What one block holds: its own parts and instances, and the blocks its `use` lines name. */
interface BlockShape {
  readonly parts: number;
  readonly uses: readonly string[];
}

function shapeOf(block: BlockStatement): BlockShape {
  let parts = 0;
  const uses: string[] = [];
  for (const s of block.body) {
    if (s.kind === "part") parts++;
    else if (s.kind === "use") {
      parts++;
      uses.push(s.block);
    }
  }
  return { parts, uses };
}

/** A chain of block names as a note: the first and last few when it is long. */
function chainNote(chain: readonly string[]): string {
  const shown = chain.length <= 12 ? chain : [...chain.slice(0, 6), `… (${chain.length - 11} more)`, ...chain.slice(-5)];
  return `uses: ${shown.join(" → ")}`;
}

/** A frame of the walk: a block and how far through its `use` lines the walk is. */
interface Frame {
  readonly name: string;
  readonly shape: BlockShape;
  next: number;
  depth: number;
  parts: number;
}

/**
 * Checks, without recursion, that `use` lines nest at most `maxUseDepth` deep and that the
 * flattened circuit holds at most `maxParts` parts and instances (a block used twice in each of 40 levels
 * would make 2⁴⁰ copies). Returns the problem at the top-level `use` line that starts the
 * offending chain, or undefined. A cycle of blocks is left to the elaborator, which reports
 * it as `block-cycle` (its recursion then stays within this depth); unknown blocks likewise.
 */
export function useNestingProblem(index: ProgramIndex, limits: Required<SourceLimits>): Diagnostic | undefined {
  const shapes = new Map<string, BlockShape>();
  for (const [name, l] of index.blocks) shapes.set(name, shapeOf(l.node));
  // Per finished block: levels of nesting it holds (itself included) and parts, saturated past the limit.
  const depthOf = new Map<string, number>();
  const partsOf = new Map<string, number>();
  const onStack = new Set<string>();
  const cap = (n: number) => Math.min(n, limits.maxParts + 1);
  let total = 0;
  for (const l of index.statements) {
    if (l.node.kind === "part" || l.node.kind === "use") total = cap(total + 1);
    if (l.node.kind !== "use") continue;
    const use = l as Located<UseStatement>;
    const root = use.node.block;
    if (!shapes.has(root)) continue;
    const stack: Frame[] = [];
    const tooDeep = (chain: readonly string[]): Diagnostic =>
      problem("too-deep", `instance ${use.node.name} nests use lines more than ${limits.maxUseDepth} deep, past the use-depth limit`, spanIn(use, use.node.blockSpan), {
        hint: raiseHint("maxUseDepth", String(2 * limits.maxUseDepth)),
        notes: [chainNote(chain)],
      });
    const enter = (name: string): Diagnostic | undefined => {
      if (stack.length + 1 > limits.maxUseDepth) return tooDeep([...stack.map((f) => f.name), name]);
      onStack.add(name);
      stack.push({ name, shape: shapes.get(name)!, next: 0, depth: 1, parts: shapes.get(name)!.parts });
      return undefined;
    };
    if (!depthOf.has(root)) {
      const first = enter(root);
      if (first) return first;
      while (stack.length > 0) {
        const top = stack[stack.length - 1]!;
        if (top.next < top.shape.uses.length) {
          const child = top.shape.uses[top.next++]!;
          if (!shapes.has(child)) continue;
          if (onStack.has(child)) return undefined;
          const known = depthOf.get(child);
          if (known === undefined) {
            const problemHere = enter(child);
            if (problemHere) return problemHere;
            continue;
          }
          if (stack.length + known > limits.maxUseDepth) return tooDeep([...stack.map((f) => f.name), child, "…"]);
          top.depth = Math.max(top.depth, 1 + known);
          top.parts = cap(top.parts + partsOf.get(child)!);
          continue;
        }
        stack.pop();
        onStack.delete(top.name);
        depthOf.set(top.name, top.depth);
        partsOf.set(top.name, top.parts);
        const parent = stack[stack.length - 1];
        if (parent) {
          parent.depth = Math.max(parent.depth, 1 + top.depth);
          parent.parts = cap(parent.parts + top.parts);
        }
      }
    }
    total = cap(total + partsOf.get(root)!);
    if (total > limits.maxParts) {
      return problem("too-many-parts", `with instance ${use.node.name} the circuit holds more than ${limits.maxParts} parts and instances, past the parts limit`, spanIn(use, use.node.blockSpan), {
        hint: raiseHint("maxParts", String(10 * limits.maxParts)),
      });
    }
  }
  return undefined;
}

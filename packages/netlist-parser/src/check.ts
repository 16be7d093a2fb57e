import { checkTopology, GROUND, isOnsetError, type Diagnostic } from "@onset/core";
import { hasErrors, problem } from "./errors.js";
import { runElaboration } from "./elaborate/elaborate.js";
import type { Overrides } from "./elaborate/context.js";
import type { Program } from "./syntax.js";
import { capPerFile } from "./diagnostic-cap.js";
import { limitsOfProgram } from "./program-limits.js";
import type { SourceLimits } from "./source-limits.js";

/**
 * Everything `onset check` reports: elaboration errors, then (on a circuit that elaborates)
 * topology problems found before solving (no DC path to gnd, loops of voltage sources, nodes
 * touched by one pin) and warnings (a node spelled like gnd, yield without
 * a tolerance analysis).
 */
export function checkProgram(program: Program, options: { overrides?: Overrides; limits?: SourceLimits } = {}): Diagnostic[] {
  const { ctx, analyses } = runElaboration(program, options.overrides ?? {}, options.limits);
  const diagnostics = [...ctx.diagnostics];
  for (const node of ctx.nodes) {
    if (node !== GROUND && node.toLowerCase() === GROUND) {
      const part = ctx.parts.find((p) => p.nodes.includes(node));
      diagnostics.push(
        problem("ground-case", `node '${node}' is not ground: names are case-sensitive`, part?.span, {
          severity: "warning",
          hint: "write gnd for the ground node",
        }),
      );
    }
  }
  const hasTolerance = analyses.some((a) => a.kind === "tolerance");
  for (const a of analyses) {
    if (a.kind !== "spec" || hasTolerance) continue;
    for (const c of a.criteria) {
      if (c.metric === "yield") {
        diagnostics.push(
          problem("yield-without-tolerance", "yield is only measured under a tolerance analysis", c.span, {
            severity: "warning",
            hint: "add a line such as: tolerance runs=200",
          }),
        );
      }
    }
  }
  if (!hasErrors(ctx.diagnostics)) {
    try {
      diagnostics.push(...checkTopology({ parts: ctx.parts, analyses, tolerances: ctx.tolerances }));
    } catch (e) {
      if (!isOnsetError(e)) throw e;
      diagnostics.push(e.diagnostic);
    }
  }
  return capPerFile(diagnostics, limitsOfProgram(program, options.limits).maxDiagnostics);
}

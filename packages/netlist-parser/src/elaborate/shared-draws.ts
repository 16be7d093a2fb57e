import type { AnalysisSpec, Diagnostic } from "@onset/core";
import { problem } from "../errors.js";
import { printValue } from "../print.js";
import { EACH } from "../keywords.js";
import type { Elaboration } from "./context.js";
import type { ParamEntry } from "./scope.js";

/** The parts whose value or options read a parameter, directly or through other parameters. */
function partsReading(ctx: Elaboration, entry: ParamEntry): string[] {
  const parts = new Set<string>();
  const seen = new Set<ParamEntry>();
  const visit = (e: ParamEntry) => {
    if (seen.has(e)) return;
    seen.add(e);
    for (const place of ctx.paramUses.get(e)?.values() ?? []) {
      if (place.part !== undefined) parts.add(place.part);
      else if (place.param) visit(place.param);
    }
  };
  visit(entry);
  return [...parts];
}

function names(list: readonly string[], limit = 6): string {
  const shown = list.slice(0, limit).join(", ");
  return list.length > limit ? `${shown} and ${list.length - limit} more` : shown;
}

/**
 * `shared-tolerance` warnings: under a tolerance study, a toleranced parameter is one draw per
 * sample shared by every use, so parts that read it move together — right for matched parts, a
 * trap for separate components. Written `each`, every use draws its own value.
 */
export function sharedDrawWarnings(ctx: Elaboration, analyses: readonly AnalysisSpec[]): Diagnostic[] {
  if (!analyses.some((a) => a.kind === "tolerance")) return [];
  const swept = new Set(analyses.flatMap((a) => (a.kind === "sweep" ? [a.target] : [])));
  const out: Diagnostic[] = [];
  for (const { entry, span } of ctx.sharedParamTolerances()) {
    if (swept.has(entry.target)) continue;
    const parts = partsReading(ctx, entry);
    if (parts.length < 2) continue;
    const hint = entry.paramLine
      ? `one draw suits matched parts (a resistor network, a dual capacitor); for separate components write: param ${entry.name} = ${printValue(entry.value!)} ${EACH}`
      : "one draw per instance suits matched parts; for separate components put the tolerance on each part's value instead";
    out.push(
      problem("shared-tolerance", `parameter ${entry.target} is drawn once per sample and shared by ${parts.length} parts (${names(parts)})`, span, {
        severity: "warning",
        hint,
      }),
    );
  }
  return out;
}

import type { ImplausiblePart } from "@onset/core";
import type { Paint } from "../color.js";

/** Parts far outside any physical operating point, as report lines: each warning and its hint. */
export function partWarningLines(warnings: readonly ImplausiblePart[] | undefined, p: Paint): string[] {
  return (warnings ?? []).flatMap(({ diagnostic: d }) => [`  ${p.bold("warning")}: ${d.message}`, p.dim(`    hint: ${d.hint ?? ""}`)]);
}

/** The same for the JSON document: `{ warnings: [{ code, part, message }] }`, or nothing when there are none. */
export function partWarningsJson(warnings: readonly ImplausiblePart[] | undefined): { warnings?: { code: string; part: string; message: string }[] } {
  return warnings ? { warnings: warnings.map((w) => ({ code: w.diagnostic.code, part: w.part, message: w.diagnostic.message })) } : {};
}

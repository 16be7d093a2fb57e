import type { Diagnostic, ImplausiblePart } from "@onset/core";
import type { Paint } from "../color.js";

/** Parts far outside any physical operating point, as report lines: each warning and its hint. */
export function partWarningLines(warnings: readonly ImplausiblePart[] | undefined, p: Paint): string[] {
  return (warnings ?? []).flatMap(({ diagnostic: d }) => [`  ${p.bold("warning")}: ${d.message}`, p.dim(`    hint: ${d.hint ?? ""}`)]);
}

/** The same for the JSON document: `{ warnings: [{ code, part, message }] }`, or nothing when there are none. */
export function partWarningsJson(warnings: readonly ImplausiblePart[] | undefined): { warnings?: { code: string; part: string; message: string }[] } {
  return warnings ? { warnings: warnings.map((w) => ({ code: w.diagnostic.code, part: w.part, message: w.diagnostic.message })) } : {};
}

/** A run's warnings for the JSON document: code, the part when one is named, message and hint. */
export function warningsJson(warnings: readonly Diagnostic[]): { code: string; part?: string; message: string; hint: string | undefined }[] {
  return warnings.map((w) => ({ code: w.code, ...(w.part === undefined ? {} : { part: w.part }), message: w.message, hint: w.hint }));
}

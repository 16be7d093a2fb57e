import type { Diagnostic } from "@onset/core";
import { problem } from "./errors.js";
import { raiseHint } from "./source-limits.js";

/**
 * At most `max` problems per file, in the order given; the rest of each file become one more
 * ("and N more problems in 'f'"), placed at the first left out, an error when any of them is.
 * Problems without a file (a command line's) are kept.
 */
export function capPerFile(diagnostics: readonly Diagnostic[], max: number): Diagnostic[] {
  if (diagnostics.length <= max) return [...diagnostics];
  const kept: Diagnostic[] = [];
  const counts = new Map<string, number>();
  const dropped = new Map<string, { first: Diagnostic; count: number; error: boolean }>();
  for (const d of diagnostics) {
    const file = d.span?.file;
    if (file === undefined || d.code === "more-problems") {
      kept.push(d);
      continue;
    }
    const n = (counts.get(file) ?? 0) + 1;
    counts.set(file, n);
    if (n <= max) {
      kept.push(d);
      continue;
    }
    const seen = dropped.get(file);
    if (seen) {
      seen.count++;
      seen.error ||= d.severity === "error";
    } else dropped.set(file, { first: d, count: 1, error: d.severity === "error" });
  }
  for (const [file, { first, count, error }] of dropped) {
    kept.push(
      problem("more-problems", `and ${count} more ${count === 1 ? "problem" : "problems"} in '${file}' (the first ${max} are shown)`, first.span, {
        severity: error ? "error" : "warning",
        hint: `fix these and check again, or see more: ${raiseHint("maxDiagnostics", String(Math.min(max + count, 10 * max)))}`,
      }),
    );
  }
  return kept;
}

// Issue 18's accuracy at default settings, row by row of the validation table: frequency within
// 0.01 %, amplitude and r.m.s. within 0.1 %, THD within 1 % of itself (THD above 0.01 %), and a
// reported error bar (`numericalError`) that covers the difference from the reference. The
// references are scipy's (test/validation/references.json; references.md). The settled figures
// come from the periodic orbit next to the run (see packages/core/src/steady/refine.ts).
import { beforeAll, describe, expect, test } from "vitest";
import type { StartupResult } from "@onset/core";
import { caseCircuit, compareRows, LIMITS, METRICS, runCase, validationCases } from "./validation-cases.mjs";

for (const c of validationCases()) {
  describe(`${c.name} at default settings`, () => {
    let result: StartupResult;
    beforeAll(() => {
      result = runCase(caseCircuit(c.file)).result;
    });

    test("settles", () => {
      expect(result.verdict).toBe("settled");
    });

    for (const metric of METRICS) {
      test(`${metric} within ${LIMITS[metric] * 100} % of the reference (scipy Radau, references.json)`, () => {
        const row = compareRows(c.reference!, result).find((r) => r.metric === metric)!;
        if (!row.judged) return;
        expect(Math.abs(row.error!)).toBeLessThanOrEqual(LIMITS[metric]);
      });

      test(`${metric}: the reported numerical error covers the difference from the reference`, () => {
        const row = compareRows(c.reference!, result).find((r) => r.metric === metric)!;
        expect(row.bar, "the start-up result has no numericalError").not.toBeNull();
        expect(Math.abs(row.onset! - row.reference!)).toBeLessThanOrEqual(row.bar!);
      });

      test(`${metric}: the error bar is no wider than the accuracy promised (${LIMITS[metric] * 100} %), so it is worth printing`, () => {
        const row = compareRows(c.reference!, result).find((r) => r.metric === metric)!;
        if (!row.judged) return;
        expect(row.bar!).toBeLessThanOrEqual(LIMITS[metric] * Math.abs(row.reference!));
      });
    }
  });
}

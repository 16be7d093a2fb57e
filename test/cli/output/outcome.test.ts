import { describe, expect, test } from "vitest";
import { outcomeExit, type Outcome } from "../../../packages/cli/src/output/outcome.js";
import type { SpecChecks } from "../../../packages/cli/src/report/spec.js";
import type { StudySample } from "../../../packages/cli/src/study/study-sample.js";

const fresh = (pass: boolean): SpecChecks => ({ pass, on: "the first start-up", criteria: [{ text: "frequency=1k±5%", metric: "frequency", measured: 1e3, unit: "Hz", pass }] });
const study = (pass: boolean, judged = true): StudySample => ({
  sample: { index: 3, drawn: {}, pass, failures: pass ? [] : ["frequency=1k±5%"], metrics: null } as unknown as StudySample["sample"],
  setting: null,
  judged,
});
const plain = (spec: SpecChecks | null, sample?: StudySample): Outcome => ({ kind: "plain", runs: [], spec, ...(sample ? { sample: { index: 3, drawn: {}, study: sample } } : {}) });

describe("outcomeExit(outcome)", () => {
  test("a plain run exits 1 when its spec is not met, 0 when it is or there is none", () => {
    expect(outcomeExit(plain(fresh(true)))).toBe(0);
    expect(outcomeExit(plain(fresh(false)))).toBe(1);
    expect(outcomeExit(plain(null))).toBe(0);
  });

  test("--sample I under measure=steady exits as the study's verdict on the sample, whatever the fresh run's spec says", () => {
    expect(outcomeExit(plain(fresh(true), study(false)))).toBe(1);
    expect(outcomeExit(plain(fresh(false), study(true)))).toBe(0);
    expect(outcomeExit(plain(null, study(false)))).toBe(1);
  });

  test("a study without a spec judges nothing, so its sample exits 0 as the study does", () => {
    expect(outcomeExit(plain(null, study(false, false)))).toBe(0);
  });
});

import type { AnalysisResult, SpecCriterion, SpecReport } from "@onset/core";
import { describe, expect, test } from "vitest";
import { paint } from "../../../packages/cli/src/color.js";
import { judgedProbeUnit, specChecks, specReport } from "../../../packages/cli/src/report/spec.js";

const criterion = (metric: SpecCriterion["metric"], text: string): SpecCriterion => ({ metric, text, test: "within", low: 0, high: 1 }) as SpecCriterion;

const report: SpecReport = {
  pass: true,
  criteria: [
    { criterion: criterion("frequency", "frequency=1k±5%"), measured: 1002, pass: true },
    { criterion: criterion("thd", "thd<1%"), measured: 0.002, pass: true },
    { criterion: criterion("amplitude", "amplitude=5m..20m"), measured: 0.0113, pass: true },
    { criterion: criterion("rms", "rms=5m..9m"), measured: 0.008, pass: true },
    { criterion: criterion("startup", "startup<10m"), measured: 0.004, pass: true },
  ],
};

describe("specChecks(report, on, probeUnit)", () => {
  test("gives each criterion the unit of its measured value: the swing's figures in the probe's unit, the others in their own", () => {
    const checks = specChecks(report, "the first start-up", "A");
    expect(checks.criteria.map((c) => [c.metric, c.unit])).toEqual([
      ["frequency", "Hz"],
      ["thd", "1"],
      ["amplitude", "A"],
      ["rms", "A"],
      ["startup", "s"],
    ]);
  });

  test("the report prints the swing's figures in the probe's unit, never in volts for a current or a temperature", () => {
    const text = specReport(specChecks(report, "the first start-up", "A"), paint(false)).join("\n");
    expect(text).toMatch(/amplitude=5m\.\.20m +11\.3 mA +pass/);
    expect(text).toMatch(/rms=5m\.\.9m +8 mA +pass/);
    expect(text).toMatch(/frequency=1k±5% +1\.002 kHz/);
    expect(text).not.toMatch(/mV/);
    const kelvin = specReport(specChecks(report, "the steady state", "K"), paint(false)).join("\n");
    expect(kelvin).toMatch(/amplitude=5m\.\.20m +11\.3 mK/);
  });
});

describe("judgedProbeUnit(results)", () => {
  const startup = { analysis: "startup", unit: "A" } as unknown as AnalysisResult;
  const steady = { analysis: "steady", unit: "K" } as unknown as AnalysisResult;
  const poles = { analysis: "poles" } as unknown as AnalysisResult;
  test("is the first start-up's probe unit (the spec is checked on it), else the steady state's, else volts", () => {
    expect(judgedProbeUnit([poles, steady, startup])).toBe("A");
    expect(judgedProbeUnit([poles, steady])).toBe("K");
    expect(judgedProbeUnit([poles])).toBe("V");
  });
});

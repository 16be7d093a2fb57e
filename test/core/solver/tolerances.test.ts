// options.tolerances at the door of every analysis: a NaN there made each step's error test fail
// without a word (a steady analysis then said its shooting "drove the period to zero").
import { describe, expect, test } from "vitest";
import { OnsetError, runTransient } from "@onset/core";
import { circuit, part } from "../../support/circuits.js";
import { thrownBy } from "../../support/thrown.js";

const rc = circuit([part("vsource", "V1", ["a", "gnd"], 1), part("resistor", "R1", ["a", "v"], 1e3), part("capacitor", "C1", ["v", "gnd"], 1e-6)]);
const transient = { kind: "transient", until: 1e-3, start: "rest", probes: [{ kind: "node", node: "v" }] } as const;

describe("resolveTolerances (through runTransient's options.tolerances)", () => {
  test.each([
    [{ lteRelative: NaN }, "options.tolerances.lteRelative must be a finite number from 0, got NaN"],
    [{ lteVoltage: -1e-6 }, "options.tolerances.lteVoltage must be a finite number from 0, got -0.000001"],
    [{ newtonCurrent: Infinity }, "options.tolerances.newtonCurrent must be a finite number from 0, got Infinity"],
    [{ stepIterations: 2.5 }, "options.tolerances.stepIterations must be a whole number above 0, got 2.5"],
    [{ biasIterations: 0 }, "options.tolerances.biasIterations must be a whole number above 0, got 0"],
    [{ lteRelativ: 1e-5 }, /^options\.tolerances\.lteRelativ is not a tolerance \(newtonRelative, /],
  ])("%o is a bad argument", (tolerances, message) => {
    const error = thrownBy(OnsetError, () => runTransient(rc, transient, { tolerances: tolerances as never }));
    expect(error.diagnostic.code).toBe("bad-argument");
    if (typeof message === "string") expect(error.message).toBe(message);
    else expect(error.message).toMatch(message);
  });

  test("a zero tolerance is taken (it asks for the exact answer; the failure is the step's own, placed)", () => {
    const error = thrownBy(OnsetError, () => runTransient(rc, transient, { tolerances: { lteRelative: 0, lteVoltage: 0, lteCurrent: 0 } }));
    expect(error.diagnostic.code).not.toBe("bad-argument");
  });
});

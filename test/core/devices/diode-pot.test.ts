import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { runBias, taperFraction } from "@onset/core";
import { junctionCharge, limitJunctionVoltage } from "../../../packages/core/src/devices/diode.js";
import { circuit, part } from "../../support/circuits.js";

describe("diode", () => {
  test("the depletion charge's derivative is the junction capacitance on both sides of the knee (mathematics)", () => {
    fc.assert(
      fc.property(fc.double({ min: -10, max: 0.9, noNaN: true }), (v) => {
        const a = { current: 0, conductance: 0 };
        const b = { current: 0, conductance: 0 };
        const mid = { current: 0, conductance: 0 };
        const dv = 1e-6;
        junctionCharge(v - dv, 1e-12, a);
        junctionCharge(v + dv, 1e-12, b);
        junctionCharge(v, 1e-12, mid);
        expect((b.current - a.current) / (2 * dv)).toBeCloseTo(mid.conductance, 18);
      }),
    );
  });

  test("junction-voltage limiting replaces a large forward step by a logarithmic one (docs/references.md §7)", () => {
    const nvt = 25.8649e-3;
    const vcrit = nvt * Math.log(nvt / (Math.SQRT2 * 1e-14));
    expect(vcrit).toBeCloseTo(0.73029, 5); // docs/references.md §7: v_crit = 0.730290 V
    expect(limitJunctionVoltage(0.6, 5, nvt, vcrit)).toBeCloseTo(0.6 + nvt * Math.log(1 + 4.4 / nvt), 12);
    expect(limitJunctionVoltage(0.6, 0.61, nvt, vcrit)).toBe(0.61);
  });

  test("series resistance adds I·R to the forward drop", () => {
    const drop = (series: number) => {
      const b = runBias(
        circuit([part("isource", "I1", ["gnd", "a"], 1e-3), part("diode", "D1", ["a", "gnd"], undefined, { saturation: 1e-14, emission: 1, series })]),
        { kind: "bias" },
      );
      return b.nodes.find((n) => n.node === "a")!.voltage;
    };
    expect(drop(10) - drop(0)).toBeCloseTo(10e-3, 9);
  });
});

describe("potentiometer", () => {
  test("audio taper r = (81^at − 1)/80 passes 0, 0.1 at mid-rotation and 1 (the 10 %-at-half law is common practice)", () => {
    expect(taperFraction(0, "audio")).toBe(0);
    expect(taperFraction(0.5, "audio")).toBeCloseTo(0.1, 15);
    expect(taperFraction(1, "audio")).toBeCloseTo(1, 15);
    expect(taperFraction(0.3, "linear")).toBe(0.3);
  });

  test.each([
    [0.25, "linear", 0.75],
    [0.5, "audio", 0.9],
  ])("a divider with the wiper at %d (%s) gives %d of the input", (at, taper, fraction) => {
    const b = runBias(circuit([part("vsource", "V1", ["top", "gnd"], 10), part("pot", "P1", ["top", "w", "gnd"], 10e3, { at, taper })]), { kind: "bias" });
    expect(b.nodes.find((n) => n.node === "w")!.voltage).toBeCloseTo(10 * fraction, 6);
  });
});

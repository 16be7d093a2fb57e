import { describe, expect, test } from "vitest";
import { opampPresets, runStartup, type PartSpec } from "@onset/core";
import { circuit, crLadder, part, wienNetwork } from "../../support/circuits.js";

const R = 1e3;
const C = 100e-9;
/** Near ideal (docs/references.md §2.4 uses a memoryless amplifier): no headroom, 1 GHz GBW, a 0.1 mV knee. */
const nearIdeal = (rails: [number, number]) => ({ ...opampPresets.ideal, knee: 1e-4, rails });
const node = (n: string) => ({ kind: "node", node: n }) as const;
const startup = (parts: PartSpec[], probe = "o", until: number | "auto" = "auto") =>
  runStartup(circuit(parts), { kind: "startup", probe: node(probe), until, kick: "noise" });

/** Equal-RC Wien bridge; the op-amp's gain is set by Rf/Rg to A, clipping at ±10 V. */
function wien(A: number): PartSpec[] {
  return [
    ...wienNetwork({ R1: R, R2: R, C1: C, C2: C }),
    part("resistor", "Rf", ["o", "n"], (A - 1) * R),
    part("resistor", "Rg", ["n", "gnd"], R),
    part("opamp", "U1", ["p", "n", "o"], undefined, nearIdeal([-10, 10])),
  ];
}

/** Three-section C–R ladder into an inverting stage: the third R is the input resistor to the virtual ground (docs/references.md §2.2). */
function phaseShift(A: number): PartSpec[] {
  return [
    ...crLadder(R, C),
    part("resistor", "R3", ["c", "n"], R),
    part("resistor", "Rf", ["n", "o"], A * R),
    part("opamp", "U1", ["gnd", "n", "o"], undefined, nearIdeal([-10, 10])),
  ];
}

describe("Barkhausen thresholds (docs/references.md §2.1–2.2)", () => {
  test.each([
    [2.8, false],
    [3.3, true],
  ])("Wien bridge at gain %d starts: %s (threshold A = 3)", (A, starts) => {
    const r = startup(wien(A));
    expect(r.verdict).toBe(starts ? "settled" : "silent");
  });

  test.each([
    [25, false],
    [35, true],
  ])("C–R ladder with inverting gain %d starts: %s (threshold 29)", (A, starts) => {
    const r = startup(phaseShift(A));
    if (starts) expect(r.verdict).toBe("settled");
    else expect(["silent", "decaying"]).toContain(r.verdict);
  });
});

describe("early envelope growth equals the linear pole (docs/references.md §2.1: σ = (A − 3)/(2RC))", () => {
  test.each([3.1, 3.3])("Wien at A = %d grows at σ within 2 %", (A) => {
    const r = startup(wien(A));
    const sigma = (A - 3) / (2 * R * C);
    expect(Math.abs(r.growthRate! / sigma - 1)).toBeLessThan(0.02);
    // the linear prediction at the bias point is the pole itself
    expect(r.run.predicted.growthRate!).toBeCloseTo(sigma, -1);
  });
});

describe("hard-limited Wien oscillator (docs/references.md §2.4: ideal clip(A·v₊, ±10 V), DOP853/Radau at rtol 1e-10)", () => {
  test.each([
    [3.1, 1580.7013, 10.73461, 0.051234],
    [3.3, 1541.4769, 11.3473, 0.115782],
  ])("A = %d: f = %d Hz within 0.5 %, output fundamental %d V within 1 %, THD %d within 10 % relative", (A, f, fundamental, thd) => {
    const r = startup(wien(A));
    expect(r.verdict).toBe("settled");
    expect(Math.abs(r.frequency! / f - 1)).toBeLessThan(0.005);
    expect(Math.abs(r.harmonics[0]!.amplitude / fundamental - 1)).toBeLessThan(0.01);
    expect(Math.abs(r.thd! / thd - 1)).toBeLessThan(0.1);
  });
});

describe("twin-T notch in the inverting loop (common practice, no single source)", () => {
  /** Twin-T from the output to the inverting input; the other input at gnd or on a divider from the output. */
  const twinT = (k: number, divider?: number): PartSpec[] => [
    part("resistor", "Ra", ["o", "m1"], 11e3),
    part("resistor", "Rb", ["m1", "n"], 11e3),
    part("capacitor", "Cs", ["m1", "gnd"], 66e-9),
    part("capacitor", "Ca", ["o", "m2"], 33e-9),
    part("capacitor", "Cb", ["m2", "n"], 33e-9),
    part("resistor", "Rs", ["m2", "gnd"], k * 11e3),
    ...(divider === undefined
      ? [part("opamp", "U1", ["gnd", "n", "o"], undefined, { rails: [-12, 12] })]
      : [
          part("resistor", "Rp1", ["o", "p"], (1 / divider - 1) * 1e3),
          part("resistor", "Rp2", ["p", "gnd"], 1e3),
          part("opamp", "U1", ["p", "n", "o"], undefined, { rails: [-12, 12] }),
        ]),
  ];

  test("with the other input at gnd it starts a little below k = ½ and decays a little above", () => {
    expect(startup(twinT(0.47), "n").verdict).toBe("settled");
    expect(["silent", "decaying"]).toContain(startup(twinT(0.53), "n").verdict);
  });

  test("positive feedback from a 2 % divider moves the boundary: k = 0.53 then starts", () => {
    // At k = 0.53 the network is real and positive (≈ +0.0074) near f0; a divider of 0.02 exceeds it.
    expect(startup(twinT(0.53, 0.02), "n").verdict).toBe("settled");
    expect(["silent", "decaying"]).toContain(startup(twinT(0.6, 0.02), "n").verdict);
  });
});

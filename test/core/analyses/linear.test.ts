import { describe, expect, test } from "vitest";
import { runPoles, runResponse, type PartSpec } from "@onset/core";
import { circuit, crLadder, part, wienNetwork } from "../../support/circuits.js";

const R = 1e3;
const C = 100e-9;

/** Equal-RC Wien bridge around an ideal amplifier of gain A (a VCVS), docs/references.md §2.1. */
function wien(A: number): PartSpec[] {
  return [...wienNetwork({ R1: R, R2: R, C1: C, C2: C }), part("vcvs", "E1", ["o", "gnd", "p", "gnd"], A)];
}

describe("poles (generalized eigenvalues of G + sC)", () => {
  test("series RLC: −α ± jω_d to 1e-9 relative (docs/references.md §3: α = 5000 s⁻¹, ω_d = 31224.98999 rad/s)", () => {
    const r = runPoles(
      circuit([
        part("vsource", "V1", ["in", "gnd"], 0),
        part("resistor", "R1", ["in", "a"], 10),
        part("inductor", "L1", ["a", "b"], 1e-3),
        part("capacitor", "C1", ["b", "gnd"], 1e-6),
      ]),
      { kind: "poles" },
    );
    const alpha = 10 / (2 * 1e-3);
    const wd = Math.sqrt(1 / (1e-3 * 1e-6) - alpha * alpha);
    expect(r.poles).toHaveLength(2);
    expect(Math.abs(r.dominant!.real / -alpha - 1)).toBeLessThan(1e-9);
    expect(Math.abs(r.dominant!.imag / wd - 1)).toBeLessThan(1e-9);
    expect(wd).toBeCloseTo(31224.98999, 4);
    expect(r.starts).toBe(false);
  });

  test.each([
    [3, 0, 1591.5494],
    [3.1, 500, 1589.5587],
    [3.3, 1500, 1573.5426],
  ])("Wien bridge with an ideal gain of %d: σ = (A − 3)/(2RC) = %d s⁻¹, f = %d Hz (docs/references.md §2.1)", (A, sigma, f) => {
    const r = runPoles(circuit(wien(A)), { kind: "poles" });
    expect(r.growthRate!).toBeCloseTo(sigma, 6);
    expect(r.frequency!).toBeCloseTo(f, 3);
    expect(r.starts).toBe(A > 3);
  });

  test("three-section C–R ladder with an inverting gain of 30: x = 0.002591 + 0.402882j, σ = 25.913 s⁻¹, f = 641.2059 Hz (docs/references.md §2.2)", () => {
    const r = runPoles(
      circuit([
        ...crLadder(R, C),
        part("resistor", "R3", ["c", "gnd"], R),
        part("vcvs", "E1", ["o", "gnd", "c", "gnd"], -30),
      ]),
      { kind: "poles" },
    );
    expect(r.growthRate!).toBeCloseTo(25.913, 2);
    expect(r.frequency!).toBeCloseTo(641.2059, 3);
    expect(r.dominant!.real * R * C).toBeCloseTo(0.002591, 6);
    expect(r.dominant!.imag * R * C).toBeCloseTo(0.402882, 6);
  });

  test("an op-amp is linearised as its single pole: open loop the pole is at −2π·gbw/gain", () => {
    const r = runPoles(circuit([part("vsource", "V1", ["p", "gnd"], 0), part("opamp", "U1", ["p", "gnd", "o"], undefined, { gain: 1e5, gbw: 1e6, rin: Infinity })]), {
      kind: "poles",
    });
    expect(r.poles).toHaveLength(1);
    expect(r.poles[0]!.real).toBeCloseTo((-2 * Math.PI * 1e6) / 1e5, 9);
  });
});

describe("response (small-signal frequency response)", () => {
  /** Twin-T: R, R with shunt 2C; C, C with shunt kR, driven by an ideal source, unloaded (docs/references.md §2.3). */
  const twinT = (k: number) =>
    circuit([
      part("vsource", "Vin", ["in", "gnd"], 0),
      part("resistor", "Ra", ["in", "m1"], 11e3),
      part("resistor", "Rb", ["m1", "out"], 11e3),
      part("capacitor", "Cs", ["m1", "gnd"], 66e-9),
      part("capacitor", "Ca", ["in", "m2"], 33e-9),
      part("capacitor", "Cb", ["m2", "out"], 33e-9),
      part("resistor", "Rs", ["m2", "gnd"], k * 11e3),
    ]);

  test.each([
    [0.49, 440.6745, -0.0025061],
    [0.47, 445.3816, -0.0075531],
    [0.45, 450.4417, -0.0126409],
  ])("twin-T with k = %d: −180° at %d Hz where H = %d (docs/references.md §2.3)", (k, f, h) => {
    const r = runResponse(twinT(k), { kind: "response", from: "Vin", to: { kind: "node", node: "out" }, start: 100, stop: 2000, perDecade: 100 });
    const c = r.phaseCrossings.find((x) => x.phase === -180)!;
    expect(c.frequency).toBeCloseTo(f, 3);
    expect(c.value).toBeCloseTo(h, 6);
  });

  test("twin-T with k = ½ has a deep notch at f0 = 1/(2πRC) = 438.4434 Hz (docs/references.md §2.3)", () => {
    const r = runResponse(twinT(0.5), { kind: "response", from: "Vin", to: { kind: "node", node: "out" }, start: 100, stop: 2000, perDecade: 100 });
    expect(r.notch!.frequency).toBeCloseTo(438.4434, 2);
    expect(r.notch!.depthDb).toBeGreaterThan(80);
  });

  test("an RC low-pass has its −3 dB point at 1/(2πRC) and −45° there (mathematics)", () => {
    const r = runResponse(
      circuit([part("vsource", "Vin", ["in", "gnd"], 0), part("resistor", "R1", ["in", "o"], 1e3), part("capacitor", "C1", ["o", "gnd"], 100e-9)]),
      // from 10 mHz, so the sweep's maximum is the DC gain of 1 to 4e-11
      { kind: "response", from: "Vin", to: { kind: "node", node: "o" }, start: 0.01, stop: 1e5 },
    );
    expect(r.cutoffs).toHaveLength(1);
    expect(r.cutoffs[0]!).toBeCloseTo(1 / (2 * Math.PI * 1e3 * 100e-9), 6);
    const near = r.points.reduce((best, p) => (Math.abs(p.frequency - 1591.5) < Math.abs(best.frequency - 1591.5) ? p : best));
    expect(near.phase).toBeCloseTo(-45, 0);
  });
});

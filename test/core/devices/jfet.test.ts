import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { runBias, runTransient, type OptionValue } from "@onset/core";
import { CHANNEL_LEAK, GATE_SATURATION } from "@onset/core/engine";
import { circuit, part } from "../../support/circuits.js";

const IDSS = 8e-3;
const VP = -2.5;

/** The drain current (into the drain) at DC terminal voltages, from the bias point. */
function drainCurrent(vd: number, vg: number, vs: number, options: Record<string, OptionValue> = {}): number {
  const bias = runBias(
    circuit([
      part("vsource", "VD", ["d", "gnd"], vd),
      part("vsource", "VG", ["g", "gnd"], vg),
      part("vsource", "VS", ["s", "gnd"], vs),
      part("jfet", "J1", ["d", "g", "s"], undefined, { idss: IDSS, pinchoff: VP, ...options }),
    ]),
    { kind: "bias" },
  );
  return -bias.sources.find((s) => s.part === "VD")!.current;
}

/**
 * Shichman & Hodges (1968), IEEE JSSC 3(3) 285–289, in the JFET form with β = IDSS/VP²
 * (e.g. Sedra & Smith, Microelectronic Circuits, the JFET square law): n-channel, vds ≥ 0.
 */
function squareLaw(vgs: number, vds: number, lambda = 0): number {
  const vov = vgs - VP;
  const beta = IDSS / (VP * VP);
  if (vov <= 0) return 0;
  if (vds < vov) return beta * (2 * vov * vds - vds * vds) * (1 + lambda * vds);
  return beta * vov * vov * (1 + lambda * vds);
}

const VT = (1.380649e-23 * 300.15) / 1.602176634e-19;
/** A gate junction's current gate → channel end (Shockley, Is = 1e-14 A, n = 1, with the 1 pS junction leak). */
const junction = (v: number) => GATE_SATURATION * Math.expm1(v / VT) + 1e-12 * v;
/** What the drain carries besides the channel: the drain–source leak less the gate–drain junction. */
const besides = (vd: number, vg: number, vs: number) => CHANNEL_LEAK * (vd - vs) - junction(vg - vd);

describe("jfet", () => {
  test("saturation: at v(g,s) = 0 the drain current is IDSS, at v(g,s) = VP/2 it is IDSS/4 (square law)", () => {
    expect((drainCurrent(10, 0, 0) - besides(10, 0, 0)) / IDSS).toBeCloseTo(1, 9);
    expect((drainCurrent(10, VP / 2, 0) - besides(10, VP / 2, 0)) / (IDSS / 4)).toBeCloseTo(1, 9);
  });

  test("cut off below the pinch-off voltage: only the leaks flow", () => {
    expect(Math.abs(drainCurrent(10, VP - 0.5, 0))).toBeLessThan(1e-10);
  });

  test("every region, both channel polarities, against the Shichman–Hodges equations (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: -4, max: 0.2, noNaN: true }), fc.double({ min: -6, max: 6, noNaN: true }), fc.double({ min: 0, max: 0.05, noNaN: true }), (vgs, vds, lambda) => {
        // The gate forward-biased at most 0.6 V (beyond 40 Vt the model continues the
        // exponential as its tangent, as the diode does).
        fc.pre(vgs - vds <= 0.6);
        const got = drainCurrent(vds, vgs, 0, { lambda });
        // With v(d,s) < 0 drain and source swap roles: i = −law(v(g,d), v(s,d)).
        const expected = vds >= 0 ? squareLaw(vgs, vds, lambda) : -squareLaw(vgs - vds, -vds, lambda);
        expect(Math.abs(got - expected - besides(vds, vgs, 0))).toBeLessThan(1e-9 * (Math.abs(expected) + IDSS + Math.abs(junction(vgs - vds))));
      }),
      { numRuns: 60 },
    );
  });

  test("symmetric: exchanging drain and source voltages reverses the current", () => {
    for (const [vd, vg, vs] of [[1, -1, 0], [3, -0.5, 0.2], [0.05, -1.2, -0.05]] as const) {
      expect(drainCurrent(vs, vg, vd) / drainCurrent(vd, vg, vs)).toBeCloseTo(-1, 7);
    }
  });

  test("on-resistance at small v(d,s) is 1/(2·IDSS/VP²·(VGS − VP)) (square law, linear region)", () => {
    for (const vgs of [0, -0.5, -1.5, -2.2]) {
      const vds = 1e-4;
      const r = (2 * vds) / (drainCurrent(vds, vgs, 0) - drainCurrent(-vds, vgs, 0));
      const expected = 1 / ((2 * IDSS) / (VP * VP) * (vgs - VP));
      expect(r / expected).toBeCloseTo(1, 6);
    }
  });

  test("type=p mirrors type=n: every voltage and the current change sign", () => {
    for (const [vd, vg, vs] of [[5, -1, 0], [0.5, -0.5, 0], [-2, -1, 0]] as const) {
      expect(drainCurrent(-vd, -vg, -vs, { type: "p", pinchoff: -VP }) / drainCurrent(vd, vg, vs)).toBeCloseTo(-1, 9);
    }
  });

  test("the gate junction conducts as a diode when forward biased", () => {
    const bias = runBias(
      circuit([part("isource", "IG", ["gnd", "g"], 1e-3), part("jfet", "J1", ["gnd", "g", "gnd"], undefined, { idss: IDSS, pinchoff: VP })]),
      { kind: "bias" },
    );
    // Two junctions in parallel share 1 mA: v = Vt·ln(0.5 mA / 1e-14 A) (Shockley, n = 1, 300.15 K)
    const vt = (1.380649e-23 * 300.15) / 1.602176634e-19;
    expect(bias.nodes.find((n) => n.node === "g")!.voltage).toBeCloseTo(vt * Math.log(0.5e-3 / 1e-14 + 1), 4);
  });

  test("as a voltage-controlled resistor in a divider driven by a sine, the transient runs both ways through zero", () => {
    const r = runTransient(
      circuit([
        part("vsource", "V1", ["i", "gnd"], undefined, { wave: "sine", amp: 0.2, freq: 1e3 }),
        part("resistor", "R1", ["i", "d"], 1e3),
        part("vsource", "VG", ["g", "gnd"], -1),
        part("jfet", "J1", ["d", "g", "gnd"], undefined, { idss: IDSS, pinchoff: VP }),
      ]),
      { kind: "transient", until: 2e-3, start: "bias", probes: [{ kind: "node", node: "d" }] },
    );
    const v = r.signals[0]!.values;
    const ron = 1 / ((2 * IDSS) / (VP * VP) * (-1 - VP));
    // small-signal divider ratio ron/(ron + 1k); the square law bends it by a few per cent at ±0.06 V
    const peak = Math.max(...v);
    const trough = Math.min(...v);
    expect(peak / (0.2 * ron / (ron + 1e3))).toBeGreaterThan(0.9);
    expect(peak / (0.2 * ron / (ron + 1e3))).toBeLessThan(1.1);
    expect(trough).toBeLessThan(-0.5 * peak);
  });

  test("a pinch-off voltage of the wrong sign for the type is a positioned error with a hint", () => {
    const p = { ...part("jfet", "J1", ["d", "g", "gnd"], undefined, { idss: IDSS, pinchoff: 2 }), span: { file: "t.onset", start: 0, end: 4 } };
    try {
      runBias(circuit([part("vsource", "VD", ["d", "gnd"], 1), part("vsource", "VG", ["g", "gnd"], 0), p]), { kind: "bias" });
      expect.unreachable();
    } catch (e) {
      const d = (e as { diagnostic: { message: string; hint: string; span: unknown } }).diagnostic;
      expect(d.message).toBe("jfet J1: the pinch-off voltage of a type=n jfet must be negative, got 2 V");
      expect(d.hint).toBe("an n-channel part pinches off with its gate below its source: write e.g. pinchoff=-2 (or type=p)");
      expect(d.span).toEqual({ file: "t.onset", start: 0, end: 4 });
    }
  });
});

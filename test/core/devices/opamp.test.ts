import { describe, expect, test } from "vitest";
import { opampConstants, opampPresets, runBias, runTransient, type PartSpec } from "@onset/core";
import { buildSystem, TransientStepper } from "@onset/core/engine";
import { circuit, part, sampleAt } from "../../support/circuits.js";

const node = (n: string) => ({ kind: "node", node: n }) as const;

function run(parts: PartSpec[], until: number, maxStep: number, probes = [node("o")], tolerances = {}) {
  return runTransient(circuit(parts), { kind: "transient", until, maxStep, start: "bias", probes }, { tolerances });
}

describe("op-amp macromodel", () => {
  test("open loop it is the single pole gain/(1 + s·gain/(2π·gbw)): step response A·vd·(1 − e^(−t/τ)) (mathematics)", () => {
    const vd = 1e-6;
    const k = opampConstants(part("opamp", "U1", ["p", "gnd", "o"]));
    const tau = k.gain / (2 * Math.PI * k.gbw);
    const r = run(
      [part("vsource", "V1", ["p", "gnd"], undefined, { wave: "pulse", low: 0, high: vd }), part("opamp", "U1", ["p", "gnd", "o"], undefined, { rin: Infinity })],
      5e-3,
      1e-6,
      [node("o")],
      { lteRelative: 1e-8, lteVoltage: 1e-12 },
    );
    // The pole node is integrated by backward Euler (see opamp.ts), whose relative error on this
    // slow open-loop pole is about h/(2τ) = 1.6e-5 at h = 1 µs.
    for (const t of [1e-3, 3e-3, 5e-3]) {
      const exact = k.gain * vd * (1 - Math.exp(-t / tau));
      expect(Math.abs(sampleAt(r.time, r.signals[0]!.values, t) / exact - 1)).toBeLessThan(3e-5);
    }
  });

  test("a comparator saturates at each rail minus the headroom, within a few knee widths", () => {
    const parts = (level: number) => [
      part("vsource", "V1", ["p", "gnd"], level),
      part("opamp", "U1", ["p", "gnd", "o"], undefined, { rails: [-12, 12], headroom: 1.5, knee: 10e-3 }),
      part("resistor", "RL", ["o", "gnd"], 10e3),
    ];
    const up = runBias(circuit(parts(0.5)), { kind: "bias" }).nodes.find((n) => n.node === "o")!.voltage;
    const down = runBias(circuit(parts(-0.5)), { kind: "bias" }).nodes.find((n) => n.node === "o")!.voltage;
    // 75 Ω output resistance into 10 kΩ drops 0.75 %; fully overdriven, the clamp balances
    // about half a knee width past the limit (see opamp.ts), and the knee rounds it below.
    expect(up).toBeLessThan(10.5 * (10e3 / 10075) + 10e-3);
    expect(up).toBeGreaterThan(10.5 * (10e3 / 10075) - 0.1);
    expect(down).toBeCloseTo(-up, 9);
  });

  test("the output follows two supply nodes when supply= is given", () => {
    const bias = runBias(
      circuit([
        part("vsource", "Vcc", ["vcc", "gnd"], 9),
        part("vsource", "Vee", ["vee", "gnd"], -5),
        part("vsource", "V1", ["p", "gnd"], 1),
        part("opamp", "U1", ["p", "gnd", "o"], undefined, { supply: ["vee", "vcc"], headroom: 1, knee: 1e-3, rout: 1e-3 }),
      ]),
      { kind: "bias" },
    );
    expect(bias.nodes.find((n) => n.node === "o")!.voltage).toBeCloseTo(8, 1);
  });

  test("slew-rate limit: a follower given a 10 V step rises at the slew rate", () => {
    const slew = 0.5e6;
    const r = run(
      [
        part("vsource", "V1", ["p", "gnd"], undefined, { wave: "pulse", low: -5, high: 5, delay: 10e-6 }),
        part("opamp", "U1", ["p", "o", "o"], undefined, { slew }),
      ],
      60e-6,
      0.2e-6,
    );
    const v = r.signals[0]!.values;
    // the mid-swing slope, from the times the output passes −2.5 V and +2.5 V
    const cross = (level: number) => {
      for (let k = 1; k < v.length; k++) if (v[k - 1]! < level && v[k]! >= level) return r.time[k - 1]! + ((level - v[k - 1]!) / (v[k]! - v[k - 1]!)) * (r.time[k]! - r.time[k - 1]!);
      return NaN;
    };
    const slope = 5 / (cross(2.5) - cross(-2.5));
    expect(slope / slew).toBeGreaterThan(0.97);
    expect(slope / slew).toBeLessThan(1.01);
  });

  test("no integrator wind-up: after a long saturation the output leaves the rail as soon as the input turns", () => {
    const slew = 0.5e6;
    const r = run(
      [
        // +1 V for 1 ms (deep saturation), then −1 V
        part("vsource", "V1", ["p", "gnd"], undefined, { wave: "pulse", low: 1, high: -1, delay: 1e-3 }),
        part("opamp", "U1", ["p", "gnd", "o"], undefined, { slew, rails: [-15, 15], headroom: 1.5 }),
      ],
      1.2e-3,
      1e-6,
    );
    const v = r.signals[0]!.values;
    expect(sampleAt(r.time, v, 0.99e-3)).toBeGreaterThan(13.3);
    let leaves = NaN;
    let zero = NaN;
    for (let k = 0; k < v.length; k++) {
      if (r.time[k]! > 1e-3 && Number.isNaN(leaves) && v[k]! < 13.3) leaves = r.time[k]!;
      if (r.time[k]! > 1e-3 && v[k]! < 0) {
        zero = r.time[k]!;
        break;
      }
    }
    // It starts down within 2 µs and crosses 0 V after 13.5 V / slew = 27 µs (no unwinding delay).
    expect(leaves - 1e-3).toBeLessThan(2e-6);
    expect((zero - 1e-3) / (13.5 / slew)).toBeGreaterThan(0.95);
    expect((zero - 1e-3) / (13.5 / slew)).toBeLessThan(1.1);
  });

  test("the smooth limit approaches an ideal clip(2·vin, ±10 V) as the knee width goes to zero", () => {
    const deviation = (knee: number) => {
      const r = run(
        [
          part("vsource", "V1", ["i", "gnd"], undefined, { wave: "sine", amp: 10, freq: 1e3 }),
          part("resistor", "Rf", ["o", "n"], 10e3),
          part("resistor", "Rg", ["n", "gnd"], 10e3),
          part("opamp", "U1", ["i", "n", "o"], undefined, { ...opampPresets.ideal, rails: [-10, 10], headroom: 0, knee }),
        ],
        2e-3,
        2e-6,
        [node("o"), node("i")],
      );
      let worst = 0;
      r.time.forEach((_, k) => {
        const ideal = Math.max(-10, Math.min(10, 2 * r.signals[1]!.values[k]!));
        worst = Math.max(worst, Math.abs(r.signals[0]!.values[k]! - ideal));
      });
      return { worst, failures: r.stats.newtonFailures };
    };
    const wide = deviation(0.1);
    const mid = deviation(0.01);
    const narrow = deviation(0.001);
    expect(mid.worst).toBeLessThan(wide.worst);
    expect(narrow.worst).toBeLessThan(mid.worst);
    // The rounding scales with the knee width: about ten widths below the limit (see opamp.ts).
    expect(narrow.worst).toBeLessThan(0.02);
  });

  test("input offset: a follower's output sits at vos", () => {
    const bias = runBias(circuit([part("opamp", "U1", ["gnd", "o", "o"], undefined, { vos: 2e-3, slew: Infinity }), part("resistor", "RL", ["o", "gnd"], 1e3)]), { kind: "bias" });
    expect(bias.nodes.find((n) => n.node === "o")!.voltage).toBeCloseTo(2e-3 * (1 - 1 / 200e3), 7);
  });
});

describe("clip corners: every accepted step is a solution, not a guess", () => {
  test("hard-clipped Wien around a slew-limited 1 GHz op-amp never passes the limit by more than the clamp allows", () => {
    // The issue-12 case: gain 1M, gbw 1G, rails ±10 V, rout 1 mΩ, no headroom. The input stage is
    // linear only within ±slew/(2π·gbw) = ±80 µV, so at every clip corner its tangent promises
    // far more current than the tanh gives. Fully overdriven, the clamp balances the stage's
    // largest current I_max about half a knee width past the limit (see opamp.ts); beyond a few
    // widths dx/dt < 0 in the model and in its backward-Euler steps, so no accepted point lies there.
    const knee = 10e-3;
    const parts = [
      part("resistor", "R1", ["o", "s"], 1e3),
      part("capacitor", "C1", ["s", "p"], 100e-9),
      part("resistor", "R2", ["p", "gnd"], 1e3),
      part("capacitor", "C2", ["p", "gnd"], 100e-9, { initial: 0.1 }),
      part("resistor", "Rf", ["o", "n"], 2.3e3),
      part("resistor", "Rg", ["n", "gnd"], 1e3),
      part("opamp", "U1", ["p", "n", "o"], undefined, { gain: 1e6, gbw: 1e9, rails: [-10, 10], rout: 1e-3, headroom: 0, knee }),
    ];
    const system = buildSystem(circuit(parts));
    const stepper = new TransientStepper(system, { start: "rest", maxStep: 1 / 1540 / 100 });
    const pole = system.unknowns.findIndex((u) => u.label === "U1.pole");
    const o = system.nodeIndex.get("o")!;
    let worst = 0;
    let corners = 0;
    let clipped = false;
    stepper.observe((_t, x) => {
      worst = Math.max(worst, Math.abs(x[pole]!), Math.abs(x[o]!));
      if (Math.abs(x[o]!) > 9.99 !== clipped) corners++;
      clipped = Math.abs(x[o]!) > 9.99;
    });
    stepper.advance(40e-3);
    expect(corners).toBeGreaterThan(40);
    expect(worst - 10).toBeLessThan(2 * knee);
  });
});

describe("ideal limits of the options (issue 12: each accepted and simulated as its closed form)", () => {
  const vOut = (parts: PartSpec[], node = "o") => runBias(circuit(parts), { kind: "bias" }).nodes.find((n) => n.node === node)!.voltage;

  test("rout=0: an ideal voltage output, so a 10 Ω load does not move it: v = vin·A/(1 + A·β) (feedback formula, mathematics)", () => {
    const A = 200e3;
    const beta = 1e3 / 11e3;
    const parts = (rout: number) => [
      part("vsource", "V1", ["i", "gnd"], 0.2),
      part("opamp", "U1", ["i", "n", "o"], undefined, { gain: A, rout, rin: Infinity }),
      part("resistor", "Rf", ["o", "n"], 10e3),
      part("resistor", "Rg", ["n", "gnd"], 1e3),
      part("resistor", "RL", ["o", "gnd"], 10),
    ];
    expect(Math.abs(vOut(parts(0)) / ((0.2 * A) / (1 + A * beta)) - 1)).toBeLessThan(1e-12);
    // 75 Ω into 10 Ω inside the loop: the loop gain drops by (10 + 75)/10 and the output with it
    expect(Math.abs(vOut(parts(75)) / ((0.2 * A) / (1 + A * beta)) - 1)).toBeGreaterThan(1e-6);
    const r = runTransient(circuit(parts(0)), { kind: "transient", until: 1e-3, start: "bias", probes: [{ kind: "current", part: "U1" }] });
    // the current the output drives: into RL and the feedback divider
    const v = (0.2 * A) / (1 + A * beta);
    expect(r.signals[0]!.values[r.time.length - 1]).toBeCloseTo(v / 10 + v / 11e3, 9);
  });

  test("gbw=inf with slew=inf: no pole, the follower tracks a 1 kHz sine at every step with the static gain A/(1 + A)", () => {
    const A = 1e5;
    const r = run(
      [
        part("vsource", "V1", ["i", "gnd"], undefined, { wave: "sine", amp: 1, freq: 1e3 }),
        part("opamp", "U1", ["i", "o", "o"], undefined, { gain: A, gbw: Infinity, slew: Infinity, rin: Infinity, rout: 0 }),
      ],
      2e-3,
      10e-6,
      [node("o"), node("i")],
    );
    r.time.forEach((_, k) => expect(r.signals[0]!.values[k]).toBeCloseTo((A / (1 + A)) * r.signals[1]!.values[k]!, 12));
  });

  test("gain=inf: an integrator with DC feedback holds the inverting amplifier at exactly −Rf/Rin (mathematics)", () => {
    const v = vOut([
      part("vsource", "V1", ["i", "gnd"], 0.1),
      part("resistor", "Rin", ["i", "n"], 2e3),
      part("resistor", "Rf", ["n", "o"], 20e3),
      part("opamp", "U1", ["gnd", "n", "o"], undefined, { gain: Infinity, rin: Infinity }),
    ]);
    expect(v).toBeCloseTo(-1, 10);
  });

  test("gain=inf, gbw=inf, slew=inf, rout=0, headroom=0: a nullor that amplifies by exactly 1 + Rf/Rg and clips at the rails themselves", () => {
    const parts = (vin: number) => [
      part("vsource", "V1", ["i", "gnd"], vin),
      part("opamp", "U1", ["i", "n", "o"], undefined, { gain: Infinity, gbw: Infinity, slew: Infinity, rout: 0, rin: Infinity, headroom: 0, knee: 1e-4, rails: [-5, 5] }),
      part("resistor", "Rf", ["o", "n"], 2e3),
      part("resistor", "Rg", ["n", "gnd"], 1e3),
    ];
    expect(vOut(parts(0.5))).toBeCloseTo(1.5, 10);
    // overdriven: the clamp balances within a knee width or two of the rail
    expect(Math.abs(vOut(parts(3)) - 5)).toBeLessThan(3e-4);
    expect(Math.abs(vOut(parts(-3)) + 5)).toBeLessThan(3e-4);
  });

  test("gbw=inf with a finite slew limit is refused with a hint", () => {
    expect(() => vOut([part("vsource", "V1", ["i", "gnd"], 0.1), part("opamp", "U1", ["i", "o", "o"], undefined, { gbw: Infinity })])).toThrow(/gbw=inf leaves the slew limit nothing to act on/);
  });
});

// The steady analysis at its edges: option values far outside what a designer writes end in a
// result or a placed error, and never in an orbit (or a missing one) that the circuit does not have.
import { describe, expect, test } from "vitest";
import { opampPresets, OnsetError, RunLimitError, runSteady, type PartSpec, type SteadyAnalysis } from "@onset/core";
import { circuit, part } from "../../support/circuits.js";
import { clippedTank } from "../../support/clipped-tank.js";
import { thrownBy } from "../../support/thrown.js";

const probe = { kind: "node", node: "v" } as const;
const steady = (extra: Partial<SteadyAnalysis> = {}): SteadyAnalysis => ({ kind: "steady", probe, ...extra });

/** The clipped tank at 15.92 kHz (test/support/clipped-tank.ts). */
const tank: PartSpec[] = clippedTank();

describe("runSteady with option values at the edges", () => {
  test("bandwidth=1e300 counts harmonics 2 … 1000, as harmonics=1000 does (it asked for a spectrum of 1e296 orders)", () => {
    const wide = runSteady(circuit(tank), steady({ bandwidth: 1e300 }));
    const most = runSteady(circuit(tank), steady({ harmonics: 1000 }));
    expect(wide.thdOrders).toEqual([2, 1000]);
    expect(wide.thd).toBe(most.thd);
  });

  test("max-step=1e-15 is refused before any work: one period needs 6.3e10 steps, past the step limit", () => {
    const error = thrownBy(RunLimitError, () => runSteady(circuit(tank), steady({ maxStep: 1e-15 })));
    expect(error.diagnostic.code).toBe("step-limit");
    expect(error.limit).toBe("maxSteps");
    expect(error.reached).toBeGreaterThan(6e10);
    expect(error.message).toMatch(/^the steady state's recorded period of about .* with max-step=1e-15 s needs at least .* steps, more than the step limit of 10 000 000; it was not started$/);
  });

  test("the step limit holds the recorded period too: max-step=1 µs over a 63 µs period with limits.maxSteps = 50", () => {
    const error = thrownBy(RunLimitError, () => runSteady(circuit(tank), steady({ maxStep: 1e-6 }), { limits: { maxSteps: 50 } }));
    expect(error.diagnostic.code).toBe("step-limit");
    expect(error.reached).toBe(63);
    expect(error.message).toBe("the steady state's recorded period of about 0.00006283 s with max-step=0.000001 s needs at least 63 steps, more than the step limit of 50; it was not started");
  });

  test("max-step=1e30 finds the orbit of the default steps (it 'died out within 2 periods': the stepper ended each stretch before its first step)", () => {
    const long = runSteady(circuit(tank), steady({ maxStep: 1e30 }));
    const usual = runSteady(circuit(tank), steady());
    expect(long.found).toBe(true);
    expect(Math.abs(long.frequency! / usual.frequency! - 1)).toBeLessThan(1e-4);
    expect(Math.abs(long.amplitude! / usual.amplitude! - 1)).toBeLessThan(1e-3);
  });
});

describe("runSteady on a driven orbit whose swing is far below the accuracy floor", () => {
  // 1 V at 1 kHz into R = 1 kΩ and C = 1 F (τ = 1000 s, a million periods): closed form
  // |v| = 1/√(1 + (ωRC)²) = 159.155 nV, some 0.16 of the 1 µV floor.
  test("its orbit is found with the closed form's amplitude (it was 'converged to the rest point')", () => {
    const rc = circuit([
      part("vsource", "V1", ["a", "gnd"], undefined, { wave: "sine", amp: 1, freq: 1e3 }),
      part("resistor", "R1", ["a", "v"], 1e3),
      part("capacitor", "C1", ["v", "gnd"], 1),
    ]);
    const r = runSteady(rc, steady());
    const wrc = 2 * Math.PI * 1e3 * 1e3 * 1;
    expect(r.found).toBe(true);
    expect(r.kind).toBe("driven");
    expect(Math.abs(r.amplitude! * Math.sqrt(1 + wrc * wrc) - 1)).toBeLessThan(1e-4);
    // 318 nV peak-to-peak, under the 1 µV floor: said beside the figures.
    expect(r.warnings.map((w) => w.code)).toEqual(["probe-below-floor"]);
    expect(r.warnings[0]!.message).toBe("the probe v swings by 318.3 nV over the orbit, less than the accuracy floor of 1 µV: the orbit is the circuit's, but the steps hold this probe's figures only to that floor");
  });
});

describe("runSteady probed where the oscillation does not reach", () => {
  test("a divider across a DC supply beside the tank: the tank's orbit, 0 V on the probe, and the probe-below-floor warning", () => {
    const beside = circuit([...tank, part("vsource", "Vs", ["s5", "gnd"], 5), part("resistor", "Ra", ["s5", "m"], 1e3), part("resistor", "Rb", ["m", "gnd"], 1e3)]);
    const r = runSteady(beside, { kind: "steady", probe: { kind: "node", node: "m" } });
    const onTank = runSteady(circuit(tank), steady());
    expect(r.found).toBe(true);
    expect(r.frequency).toBe(onTank.frequency);
    expect(r.peakToPeak).toBe(0);
    expect(r.warnings.map((w) => w.code)).toEqual(["probe-below-floor"]);
    expect(onTank.warnings).toEqual([]);
  });
});

describe("runSteady where the bias point grows along a real pole and its dominant pair decays", () => {
  // A double-scroll circuit (two capacitors, an inductor and a negative resistance of two
  // op-amp converters): the bias point is a saddle-focus, a real pole at +25.9 k/s and a pair
  // at 3.256 kHz decaying at 5630 /s.
  const doubleScroll = circuit([
    part("capacitor", "C1", ["v", "gnd"], 10e-9),
    part("resistor", "R", ["v", "w"], 1.85e3),
    part("capacitor", "C2", ["w", "gnd"], 100e-9),
    part("inductor", "L", ["w", "gnd"], 18e-3, { series: 10 }),
    part("opamp", "U1", ["v", "n1", "o1"], undefined, { ...opampPresets.general, rails: [-8.3, 8.3] }),
    part("resistor", "R1", ["o1", "n1"], 220),
    part("resistor", "R2", ["n1", "gnd"], 220),
    part("resistor", "R3", ["o1", "v"], 2.2e3),
    part("opamp", "U2", ["v", "n2", "o2"], undefined, { ...opampPresets.general, rails: [-8.3, 8.3] }),
    part("resistor", "R4", ["o2", "n2"], 22e3),
    part("resistor", "R5", ["n2", "gnd"], 22e3),
    part("resistor", "R6", ["o2", "v"], 3.3e3),
  ]);

  test("no orbit, and the answer says the search started in a mode that does not grow (not an amplitude loop's overshoot)", () => {
    const r = runSteady(doubleScroll, steady());
    expect(r.found).toBe(false);
    expect(r.predicted.starts).toBe(false);
    expect(r.predicted.realGrowth).toBe(true);
    expect(r.explanation).toMatch(/^no periodic orbit: the bias point grows along a real pole \(25\.9\d* k\/s\) while its dominant pair at 3\.256 kHz decays; started in that pair's mode, the search found no orbit within \d+ periods of transient\. Such a circuit may latch, relax or never repeat \(chaos\): run startup or transient to see what it does$/);
  });
});

describe("runSteady on an orbit that exists only at the rails", () => {
  // A Wien bridge (10 kΩ, 10 nF) of gain 1 + 40k/10k = 5 without a limiter: its swing is held
  // only by the amplifier's ±12 V rails. From the poles' period the shooting converged on four
  // turns of the orbit (their grids 2e-3 of the swing apart) and reported 301.7 Hz.
  const railWien = circuit([
    part("resistor", "R1", ["o", "s"], 10e3),
    part("capacitor", "C1", ["s", "p"], 10e-9),
    part("resistor", "R2", ["p", "gnd"], 10e3),
    part("capacitor", "C2", ["p", "gnd"], 10e-9),
    part("resistor", "Rg", ["n", "gnd"], 10e3),
    part("resistor", "Rf", ["n", "o"], 40e3),
    part("opamp", "U1", ["p", "n", "o"], undefined, { ...opampPresets.general, rails: [-12, 12] }),
  ]);
  const o = { kind: "node", node: "o" } as const;

  test("from=poles finds the orbit from=startup finds (1.207 kHz), not k turns of it", () => {
    const a = runSteady(railWien, { kind: "steady", probe: o });
    const b = runSteady(railWien, { kind: "steady", probe: o, from: "poles" });
    expect(a.found && b.found).toBe(true);
    expect(Math.abs(b.frequency! / a.frequency! - 1)).toBeLessThan(1e-4);
    expect(Math.abs(b.amplitude! / a.amplitude! - 1)).toBeLessThan(1e-3);
    expect(b.thd).not.toBeNull();
  });
});

describe("runSteady's door", () => {
  test("options.kick outside 1e-6 … 100 is a bad argument (1e300 and 1e-300 found 'no orbit' for a circuit that has one)", () => {
    for (const kick of [1e300, 1e-300, 0, -1, NaN, Infinity]) {
      const error = thrownBy(OnsetError, () => runSteady(circuit(tank), steady(), { kick }));
      expect(error.diagnostic.code).toBe("bad-argument");
      expect(error.message).toBe(`runSteady: options.kick must be a number from 1e-6 to 100, got ${String(kick)}`);
    }
    expect(runSteady(circuit(tank), steady(), { kick: 100 }).found).toBe(true);
  });
});

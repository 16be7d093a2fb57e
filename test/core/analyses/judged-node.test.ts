// A start-up's outcome must not depend on where the probe is: it is judged at the node the growing
// mode swings most, and the probe's own figures are reported beside it.
import { describe, expect, test } from "vitest";
import { analysisOf, runStartup, runSteady, type Circuit, type StartupAnalysis, type StartupResult, type SteadyAnalysis } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { LAMP_WIEN } from "../../e2e/support/steady-circuits.js";
import { circuit, part, wienNetwork } from "../../support/circuits.js";

const build = (text: string): Circuit => buildCircuit(loadSource("t.onset", text)).circuit;
const startup = (text: string, limits?: { maxStoredPoints: number }): StartupResult => {
  const c = build(text);
  return runStartup(c, analysisOf(c, "startup") as StartupAnalysis, limits ? { limits } : {});
};

/**
 * examples/jfet-loop-source.onset: a 2 kHz Wien bridge whose gain a JFET sets from a diode peak
 * detector (c, into Cfil) through the divider Ra/Rc to the gate (g).
 */
const JFET_WIEN = `param R = 7.87k
param C = 10n
resistor  R1  o   s    (R)
capacitor C1  s   p    (C)
resistor  R2  p   gnd  (R)
capacitor C2  p   gnd  (C)
resistor  Rf  o   n    10k
resistor  Rs  n   d    4.3k
jfet      J1  d   g    gnd  idss=8m pinchoff=-2.5
resistor  Ra  d   g    470k
resistor  Rc  c   g    470k
diode     D1  c   o
capacitor Cfil c  gnd  1u
resistor  Rb  c   gnd  1M
opamp     U1  p   n    o    preset=general rails=(-15, 15)
`;

/** The outcome's figures, which must not depend on the probe. */
const outcome = (r: StartupResult) => [r.verdict, r.startupTime, r.settlingTime, r.growthRate, r.cycles, r.run.until, r.envelope.bounceFrequency, r.envelope.dampingRatio];
/** The probe's figures. */
const figures = (r: StartupResult) => ({ frequency: r.frequency, amplitude: r.amplitude, peakToPeak: r.peakToPeak, rms: r.rms, offset: r.offset, thd: r.thd, thdPlusNoise: r.thdPlusNoise, harmonics: r.harmonics, numericalError: r.numericalError, envelope: r.envelope.value });

describe("the JFET-held Wien bridge has one outcome on the output, the detector and the gate", () => {
  // Before: the detector c was judged silent, the gate g decaying, the output o settled.
  const [o, c, g] = ["o", "c", "g"].map((p) => startup(`${JFET_WIEN}startup probe=${p} until=auto\n`));

  test("settled on all three, with the same start-up and settling times, judged at the output", () => {
    expect(o!.verdict).toBe("settled");
    expect(o!.run.judgedAt).toBeUndefined();
    for (const r of [c!, g!]) {
      expect(r.run.judgedAt).toBe("o");
      // One run, whatever is probed (the noise is keyed by part, the steps by every unknown): the same judged record.
      expect(outcome(r)).toEqual(outcome(o!));
    }
  });

  test("each probe reports its own figures: the detector's charge sits at a negative DC level, rippling a little", () => {
    expect(c!.unit).toBe("V");
    expect(c!.offset!).toBeLessThan(-2);
    expect(c!.amplitude!).toBeLessThan(0.01 * o!.amplitude!);
    expect(g!.offset!).toBeLessThan(-1);
    expect(c!.frequency).toBe(o!.frequency);
    // Settled, the explanation names the probe's swing, and where the outcome was judged.
    expect(c!.explanation).toMatch(/^settled at 1\.\d+ mV peak and 2\.004 kHz, 90 % reached at 7\.41 ms; .+ \(judged at node o, where the oscillation swings most\)$/);
  });
});

describe("the lamp-stabilised Wien bridge probed at the filament's temperature", () => {
  // Before: L1.temperature was judged latched (here) or silent / bouncing (a 1 kHz Wien), while the output settled.
  const o = startup(`${LAMP_WIEN}startup probe=o until=auto\n`);
  const temperature = startup(`${LAMP_WIEN}startup probe=L1.temperature until=auto\n`);

  test("settles as the output does, with the same settling time (one judged record: equal to rounding)", () => {
    expect([o.verdict, temperature.verdict]).toEqual(["settled", "settled"]);
    expect(temperature.run.judgedAt).toBe("o");
    expect(Math.abs(temperature.settlingTime! / o.settlingTime! - 1)).toBeLessThan(1e-12);
    expect(outcome(temperature)).toEqual(outcome(o));
  });

  test("its mean is the lamp's steady temperature: the steady analysis' orbit (an independent shooting from the growing mode) and the lamp law", () => {
    const c = build(`${LAMP_WIEN}steady probe=L1.temperature\n`);
    const steady = runSteady(c, analysisOf(c, "steady") as SteadyAnalysis);
    expect(steady.found).toBe(true);
    expect(temperature.unit).toBe("K");
    // The two orbits agree to 2e-8 relative here.
    expect(Math.abs(temperature.offset! / steady.offset! - 1)).toBeLessThan(1e-6);
    // Closed form: gain 3 needs R_lamp = Rf/2 = 235 Ω; R = cold·(θ/θ_amb)^1.2 (docs/language.md, lamp) gives θ.
    const theta = 300.15 * (235 / 120) ** (1 / 1.2);
    expect(Math.abs(temperature.offset! / theta - 1)).toBeLessThan(1e-3);
  });

  test("the filament swings at twice the frequency, and the explanation says so", () => {
    const [first, second] = temperature.harmonics;
    expect(second!.amplitude).toBeGreaterThan(1000 * first!.amplitude);
    expect(Math.abs(temperature.amplitude! / second!.amplitude - 1)).toBeLessThan(0.01);
    expect(temperature.explanation).toMatch(/^settled at 1\d\d\.\d mK peak and 2\.80\d kHz, .+ \(judged at node o, where the oscillation swings most\); the probe swings mostly at 2·f \(.+ at 5\.60\d kHz\) about 525\.\d K, and its THD is over its .+ at f$/);
  });
});

describe("a probe that reads the judged node's values through the second record", () => {
  test("gives the same figures as the probe on that node: settled (orbit figures) and unsettled (the run's window)", () => {
    for (const until of ["auto", "0.01"]) {
      const own = startup(`${LAMP_WIEN}startup probe=o until=${until}\n`);
      const through = startup(`${LAMP_WIEN}startup probe=(o, gnd) until=${until}\n`);
      expect(through.run.judgedAt).toBe("o");
      expect(outcome(through)).toEqual(outcome(own));
      expect(figures(through)).toEqual(figures(own));
    }
  });

  test("the two records share the stored points: each keeps at most a quarter of stored-points time points", () => {
    const bounded = startup(`${JFET_WIEN}startup probe=c until=0.05 max-step=2u\n`, { maxStoredPoints: 40_000 });
    expect(bounded.run.judgedAt).toBe("o");
    expect(bounded.run.solver.accepted).toBeGreaterThan(20_000);
    expect(bounded.waveform.time.length).toBeLessThanOrEqual(10_001);
  });
});

describe("a probe on a second oscillator is judged itself", () => {
  // A 1.6 kHz diode-limited Wien bridge at o, and beside it a 16 kHz one at o2 that grows faster:
  // the dominant pair's mode swings most at o2 and not at all at o.
  const parts = [
    ...wienNetwork({ R1: 10e3, R2: 10e3, C1: 10e-9, C2: 10e-9 }),
    part("resistor", "Rg", ["n", "gnd"], 10e3),
    part("resistor", "Rf1", ["n", "f"], 15e3),
    part("resistor", "Rf2", ["f", "o"], 6.8e3),
    part("diode", "D1", ["f", "o"]),
    part("diode", "D2", ["o", "f"]),
    part("opamp", "U1", ["p", "n", "o"], undefined, { rails: [-12, 12] }),
    part("resistor", "S1", ["o2", "s2"], 10e3),
    part("capacitor", "K1", ["s2", "p2"], 1e-9),
    part("resistor", "S2", ["p2", "gnd"], 10e3),
    part("capacitor", "K2", ["p2", "gnd"], 1e-9),
    part("resistor", "Sg", ["n2", "gnd"], 10e3),
    part("resistor", "Sf", ["n2", "o2"], 25e3),
    part("opamp", "U2", ["p2", "n2", "o2"], undefined, { rails: [-12, 12], gbw: 100e6, slew: 100e6 }),
  ];
  const run = (node: string) => runStartup(circuit(parts), { kind: "startup", probe: { kind: "node", node }, until: "auto" });

  test("its steady oscillation at another frequency is its own outcome, and the explanation names the other one", () => {
    const slow = run("o");
    expect(slow.run.judgedAt).toBeUndefined();
    expect(slow.verdict).toBe("parasitic");
    expect(slow.frequency!).toBeLessThan(2e3);
    expect(slow.explanation).toMatch(/; judged at the probe: its oscillation is not the one at node o2 \(1\d\.\d+ kHz\), where the bias point's growing mode swings most$/);
  });

  test("a probe inside the faster one is judged at its output", () => {
    const fast = run("p2");
    expect(fast.run.judgedAt).toBe("o2");
    expect(fast.frequency!).toBeGreaterThan(10e3);
  });
});

// Issue 15 on slow amplitude loops of the test's own (not the examples): lamp, thermistor and
// JFET loops with other filter time constants and gains. The steady analysis must find the orbit
// the start-up run settles on by itself (the file's startup statement integrated to settled):
// frequency within 0.05 %, amplitude within 0.5 %, THD within 2 % relative.
import { describe, expect, test } from "vitest";
import { runSteady } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";
import { JFET_FAST_DETECTOR, lampAmplitude } from "../../e2e/support/steady-circuits.js";
import { expectSteadyAgreesWithSettled } from "./steady-agreement.js";

const wien = (R: string, C: string) => `resistor R1 o s ${R}
capacitor C1 s p ${C}
resistor R2 p gnd ${R}
capacitor C2 p gnd ${C}
opamp U1 p n o preset=general rails=(-15, 15)
`;

/** A Wien bridge (C = 10 nF) whose gain 1 + Rf/(Rs + r_on) a JFET's channel sets from a diode peak detector (Cf, bled by Rb). */
const jfetLoop = (R: string, Rf: string, Rs: string, Cf: string, Rb: string, until: number) => `${wien(R, "10n")}resistor Rf o n ${Rf}
resistor Rs n d ${Rs}
jfet J1 d g gnd idss=8m pinchoff=-2.5
resistor Ra d g 470k
resistor Rc c g 470k
diode D1 c o
capacitor Cfil c gnd ${Cf}
resistor Rb c gnd ${Rb}
startup probe=o until=${until}
`;

const loops: Record<string, string> = {
  // 2 kHz, a 50 ms filament (a hundred periods), cold gain 1 + 330/100 = 4.3.
  "lamp, 2 kHz, 50 ms filament": `${wien("7.87k", "10n")}resistor Rf o n 330
lamp L1 n gnd 100 hot=1k rated=12 tau=50m
startup probe=o until=1.5
`,
  // 500 Hz, a 200 ms filament (a hundred periods), cold gain 3.4, barely above 3.
  "lamp, 500 Hz, 200 ms filament, low cold gain": `${wien("31.6k", "10n")}resistor Rf o n 240
lamp L1 n gnd 100 hot=1k rated=12 tau=200m
startup probe=o until=6
`,
  // 200 Hz, a 1 s bead (two hundred periods).
  "thermistor, 200 Hz, 1 s bead": `${wien("7.87k", "100n")}thermistor TH1 o n 10k beta=3500 dissipation=40uW/K tau=1
resistor Rg n gnd 3.9k
startup probe=o until=15
`,
  // 1 kHz, a half-second bead (five hundred periods).
  "thermistor, 1 kHz, 0.5 s bead": `${wien("1.58k", "100n")}thermistor TH1 o n 10k beta=3500 dissipation=40uW/K tau=0.5
resistor Rg n gnd 3.3k
startup probe=o until=8
`,
  // 10 kHz, a 1 µF peak detector bled by 1 MΩ: the envelope bounces for over a thousand periods,
  // longer than the batches of transient, and dips far below its peak in between.
  "JFET, 10 kHz, 1 µF peak detector": jfetLoop("1.58k", "10k", "4.3k", "1u", "1M", 0.4),
  // 1 kHz, a 470 nF peak detector bled by 2.2 MΩ: kicked small, the swing overshoots and dips to a
  // hundredth of its peak for some hundred periods before it grows again (not died out).
  "JFET, 1 kHz, 470 nF peak detector": jfetLoop("15.8k", "12k", "4.7k", "470n", "2.2M", 0.8),
};

describe("steady against the settled start-up run on slow amplitude loops of the test's own", () => {
  test.each(Object.keys(loops))("%s", (name) => {
    const circuit = elaborate(loadProgram(`${name}.onset`, loops[name]!).program, {}).circuit!;
    // Source: the start-up run, integrated from its excitation until settled (its own step control).
    expectSteadyAgreesWithSettled(circuit);
  });
});

describe("a JFET loop whose 4.7 µF detector over-corrects for longer than the default wait", () => {
  // 4.9 kHz: kicked, the swing overshoots to the rails and the detector charges far past its
  // orbit; the oscillation stays silent for thousands of periods while it bleeds back (time
  // constant about 1 s). The default wait (34 × cycles= periods) was too short and the answer was
  // "raise cycles="; re-seeded each time its swing dies (as noise restarts it), the default finds it.
  const source = JFET_FAST_DETECTOR.replace("Cfil c gnd 47n", "Cfil c gnd 4.7u");
  const circuit = elaborate(loadProgram("slow-detector.onset", source).program, {}).circuit!;
  const probe = { kind: "node", node: "o" } as const;
  test("at the defaults: the orbit the start-up run settles on (4922.80 Hz, 4.14592 V, its settled figures at until=3 s)", () => {
    const r = runSteady(circuit, { kind: "steady", probe });
    expect(r.found).toBe(true);
    // Source: the start-up run of the same circuit integrated to 3 s (kick=thermal), settled.
    expect(Math.abs(r.frequency! / 4922.8 - 1)).toBeLessThan(5e-4);
    expect(Math.abs(r.amplitude! / 4.14592 - 1)).toBeLessThan(5e-3);
  });
  test("with cycles=1000: the orbit the start-up run settles on (4922.80 Hz, 4.14592 V, its settled figures at until=3 s)", () => {
    const r = runSteady(circuit, { kind: "steady", probe, cycles: 1000 });
    expect(r.found).toBe(true);
    // Source: the start-up run of the same circuit integrated to 3 s (kick=thermal), settled.
    expect(Math.abs(r.frequency! / 4922.8 - 1)).toBeLessThan(5e-4);
    expect(Math.abs(r.amplitude! / 4.14592 - 1)).toBeLessThan(5e-3);
  });
});

describe("a lamp loop of 10 s (ten thousand periods): the swing sits clipped at the rails while the filament warms", () => {
  // 1 kHz Wien, Rf = 294 Ω against a 100 Ω (cold) lamp: gain 3.94 cold, so the output clips and
  // its swing is level for thousands of periods while the filament warms; a shooting from there
  // does not converge. The wait beyond the batches shoots again each time it has run twice as long.
  const source = `resistor R1 o s 15.8k
capacitor C1 s p 10n
resistor R2 p gnd 15.8k
capacitor C2 p gnd 10n
resistor Rf o n 294
lamp L1 n gnd 100 hot=1k rated=12 tau=10
opamp U1 p n o preset=general rails=(-15, 15)
`;
  const circuit = elaborate(loadProgram("slow-lamp.onset", source).program, {}).circuit!;
  const probe = { kind: "node", node: "o" } as const;
  test("at the defaults: no orbit, and the wait its time constant wants", () => {
    const r = runSteady(circuit, { kind: "steady", probe });
    expect(r.found).toBe(false);
    expect(r.explanation).toMatch(/would have an amplitude loop's envelope settle over some \d+ periods, beyond the 34 × cycles= periods allowed: raise cycles= to wait longer \(cycles=\d+ waits that long\)$/);
  });
  test("with the cycles= the answer names: the orbit at the lamp's thermal balance", () => {
    const hint = runSteady(circuit, { kind: "steady", probe }).explanation.match(/cycles=(\d+) waits that long/);
    // measured: cycles=780
    const r = runSteady(circuit, { kind: "steady", probe, cycles: Number(hint![1]) });
    // measured: 4.981117 V, 1001.98 Hz, largest multiplier 0.99996 (before: no orbit with cycles=1000 either — the one wait beyond the batches ended at the first level swing, clipped)
    expect(r.found).toBe(true);
    expect(r.stability!.verdict).toBe("stable");
    // Source: closed form from the lamp law (lampAmplitude: gain 3 at R_lamp = Rf/2, the filament's thermal balance) = 4.98146 V
    expect(Math.abs(r.amplitude! / lampAmplitude(294, 100, 1000, 12) - 1)).toBeLessThan(1e-3);
  });
});

// Amplitude-controlled oscillators whose first overshoot over-charges the gain loop: the
// oscillation dies for a while and grows again once the loop's slow state has bled back. The
// poles at the bias point grow (the circuit starts by itself), so until=auto must watch for the
// restart (three of the bias point's slowest decaying time constants past the peak, within its
// bound) before it calls the record decaying — and when its bound cuts that watch, say so
// instead of "no oscillation" (and not count bursts of the noise a near-threshold circuit amplifies
// as restarts). Checked against a long fixed run's own last cycles, the steady
// analysis' orbit and its multipliers, and the odex reference of test/support/agc-wien.ts.
import { describe, expect, test } from "vitest";
import { runStartup, runSteady } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { agcWienParts, agcWienReference } from "../../support/agc-wien.js";
import { detectorWienSource } from "../../support/jfet-detector-wien.js";
import { circuit } from "../../support/circuits.js";

const node = (n: string) => ({ kind: "node", node: n }) as const;

// A JFET-held Wien bridge (4.7 kΩ, 2.2 nF, about 14 kHz; gain 1 + Rf/(Rs + r_on)) whose peak
// detector is slow (4.7 µF bled by 220 kΩ, time constant about 0.83 s): the first overshoot
// charges it past the point where the gain falls below 3 and the oscillation dies into the noise
// for some 60 ms, until the detector has bled back.
const jfetSource = `param R = 4.7k
param C = 2.2n
resistor  R1 o s   (R)
capacitor C1 s p   (C)
resistor  R2 p gnd (R)
capacitor C2 p gnd (C)
resistor  Rf o n   10k
resistor  Rs n d   4.3k
jfet      J1 d g gnd idss=8m pinchoff=-2.5
resistor  Ra d g   470k
resistor  Rc c g   470k
diode     D1 c o
capacitor Cf c gnd 4.7u
resistor  Rb c gnd 220k
opamp     U1 p n o preset=general rails=(-15, 15)
`;
const jfetWien = buildCircuit(loadSource("overshoot-jfet-wien.onset", jfetSource)).circuit;

describe("an oscillation killed by its first overshoot, which comes back", () => {
  test("JFET Wien: the steady analysis, which runs without noise, re-seeds the swing that died after its overshoot, as the circuit's noise restarts it, and finds the orbit the start-up run settles on", () => {
    const r = runSteady(jfetWien, { kind: "steady", probe: node("o") });
    // (Before the re-seeding: no orbit, "the oscillation grew, then died out", pointing to startup.)
    expect(r.found).toBe(true);
    expect(r.stability?.verdict).toBe("stable");
    // Source: the start-up run with until=auto below, which restarts from the circuit's thermal noise (measured: 4.428834 V, 14203.770 Hz)
    expect(Math.abs(r.amplitude! / 4.428834 - 1)).toBeLessThan(1e-4);
    expect(Math.abs(r.frequency! / 14203.77 - 1)).toBeLessThan(1e-4);
  });

  test("JFET Wien: until=auto waits for the restart and ends settled, with the figures of a long fixed run", () => {
    const auto = runStartup(jfetWien, { kind: "startup", probe: node("o"), until: "auto" });
    // measured: settled at 0.151 s, 4.428834 V, 14203.770 Hz (the rule before: decaying at 16.9 ms, "no oscillation")
    expect(auto.verdict).toBe("settled");
    expect(auto.warnings.some((w) => w.code === "not-settled-within")).toBe(false);
    // the record died away after its first overshoot (the envelope fell below a hundredth of its peak) and came back
    const e = auto.envelope.value;
    const peakAt = e.indexOf(Math.max(...e));
    expect(Math.min(...e.subarray(peakAt))).toBeLessThan(0.01 * e[peakAt]!);
    // Source: the same circuit run to a fixed 0.3 s, twice as long, its own last cycles (measured: 4.42880 V, 14197.51 Hz)
    const long = runStartup(jfetWien, { kind: "startup", probe: node("o"), until: 0.3 }, { settledFromOrbit: false });
    expect(long.verdict).toBe("settled");
    expect(Math.abs(auto.amplitude! / long.amplitude! - 1)).toBeLessThan(1e-3);
    expect(Math.abs(auto.frequency! / long.frequency! - 1)).toBeLessThan(1e-3);
  });

  test("JFET Wien: a settle-within= that cuts the watch short gives unsettled and says to raise it, never 'no oscillation'", () => {
    const span = { file: "overshoot-jfet-wien.onset", start: 10, end: 28 };
    const r = runStartup(jfetWien, { kind: "startup", probe: node("o"), until: "auto", settleWithin: 0.03, settleWithinSpan: span });
    // measured: stopped at 30 ms, the oscillation dead since its overshoot to 5.684 V at 1.68 ms (before: decaying, "no oscillation: the envelope dies away")
    expect(r.run.until).toBeCloseTo(0.03, 9);
    expect(r.verdict).toBe("unsettled");
    expect(r.explanation).not.toMatch(/no oscillation/);
    expect(r.explanation).toMatch(/^the oscillation grew to .+ peak at .+s and died away after it, but it may come back .*slowest time constant is 830 ms\): it is watched until 2\.\d+ s, the run stopped at 30 ms; raise settle-within= to wait longer$/);
    const warning = r.warnings.find((w) => w.code === "not-settled-within")!;
    expect(warning.span).toEqual(span);
    // the died-away swing is not the amplitude waited for: no "waiting longer does not help" for the excitation's noise
    expect(warning.hint).toMatch(/^a slow amplitude loop can need longer: raise settle-within= \(now 30 ms/);
  });

  // The same loop with its bleed resistor gone (10 GΩ): the detector bleeds only through the gate
  // divider (time constant about 4.2 s) and the oscillation comes back at about 0.3 s, just past
  // the default bound of 4000 predicted periods (282 ms).
  const unbled = buildCircuit(loadSource("overshoot-jfet-wien-unbled.onset", jfetSource.replace("Rb c gnd 220k", "Rb c gnd 10G"))).circuit;
  test("JFET Wien, detector bled for seconds: at the default bound unsettled with the hint to raise settle-within=, not bouncing on the noise nor decaying", () => {
    const r = runStartup(unbled, { kind: "startup", probe: node("o"), until: "auto" });
    // measured: unsettled at 281.9 ms (before the restart watch: decaying at 16.9 ms; with the watch alone, noise bursts after the stop were counted as restarts: bouncing)
    expect(r.verdict).toBe("unsettled");
    expect(r.explanation).not.toMatch(/no oscillation/);
    const warning = r.warnings.find((w) => w.code === "not-settled-within")!;
    expect(warning.hint).toMatch(/^a slow amplitude loop can need longer: raise settle-within=/);
  });
  test("JFET Wien, detector bled for seconds: with settle-within= raised as the hint says, settled", () => {
    const r = runStartup(unbled, { kind: "startup", probe: node("o"), until: "auto", settleWithin: 0.6 });
    // measured: settled at 574.5 ms, 4.350986 V, 14215.0 Hz; a fixed 3 s run's orbit (Source: the same circuit run ten times as long): 4.350989 V, 14215.0 Hz
    expect(r.verdict).toBe("settled");
    expect(r.amplitude!).toBeGreaterThan(4.3);
  });

  test("slow-loop Wien (4.7 µF filter): bouncing, as its unstable orbit and the odex reference's repeated collapses say, not decaying", () => {
    const c = circuit(agcWienParts(4.7e-6));
    const auto = runStartup(c, { kind: "startup", probe: node("o"), until: "auto" });
    // measured: bouncing at 1.99 s, collapsed and restarted 5 times (the rule before: decaying at 0.50 s, −24.2 %/cycle)
    expect(auto.verdict).toBe("bouncing");
    expect(auto.explanation).toMatch(/^the amplitude loop is unstable: the envelope collapsed and restarted \d+ times/);
    // the steady analysis: an orbit that does not attract (measured: 995.1 Hz, 812.7 mV, largest multiplier 1.0022 ± 0.0463j)
    const steady = runSteady(c, { kind: "steady", probe: node("o") });
    expect(steady.found).toBe(true);
    expect(steady.stability!.verdict).toBe("unstable");
    // Source: odex ODE integrator on the circuit's state equations, from 1 mV, noiseless: the envelope falls
    // below 1e-6 of its overshoot and grows back past half the orbit's amplitude (measured: 3.6 µV at 0.16 s, 0.79 V at 0.88 s)
    const reference = agcWienReference(4.7e-6, 1);
    const v = reference.value;
    const peakAt = v.indexOf(Math.max(...v));
    let lowAt = peakAt;
    for (let k = peakAt; k < v.length; k++) if (v[k]! < v[lowAt]!) lowAt = k;
    expect(v[lowAt]!).toBeLessThan(1e-6 * v[peakAt]!);
    expect(Math.max(...v.slice(lowAt))).toBeGreaterThan(0.5 * steady.amplitude!);
  });
});

// A JFET Wien of our own (10 kΩ, 10 nF, about 1.6 kHz) whose peak detector charges through 1 kΩ
// into a large filter, 4.7 µF bled by 1 MΩ (the bias point's slowest time constant 2.22 s): the
// first overshoot, on the rails, charges the gate past the point where the gain falls below 3, the
// oscillation dies into the noise within some 40 ms and grows again at about 0.2 s, once the
// filter has bled back, then settles.
const slowDetector = buildCircuit(
  loadSource("slow-detector-wien.onset", detectorWienSource({ R: "10k", C: "10n", Rf: "10k", Rs: "3.9k", idss: "8m", pinchoff: "-2.5", Rgate: "470k", Rk: "1k", Cf: "4.7u", Rb: "1M", rail: "15" })),
).circuit;

describe("a fixed until= that ends while an overshoot-killed oscillation may still come back", () => {
  test("JFET Wien, slow detector: until=100m is unsettled and says to raise until=, never 'no oscillation'", () => {
    const r = runStartup(slowDetector, { kind: "startup", probe: node("o"), until: 0.1 });
    // measured: unsettled, the overshoot to 13.12 V at 11.1 ms watched until 6.67 s (before: decaying, "no oscillation: the envelope dies away, −50.7 %/cycle")
    expect(r.verdict).toBe("unsettled");
    expect(r.explanation).not.toMatch(/no oscillation/);
    expect(r.explanation).toMatch(/^the oscillation grew to .+ V peak at .+s and died away after it, but it may come back .*slowest time constant is 2\.22 s\): it is watched until 6\.\d+ s, the run stopped at 100 ms; raise until= to wait longer$/);
    // the record did die after its overshoot: the envelope fell below a hundredth of its peak
    const e = r.envelope.value;
    const peakAt = e.indexOf(Math.max(...e));
    expect(Math.min(...e.subarray(peakAt))).toBeLessThan(0.01 * e[peakAt]!);
  });

  test("JFET Wien, slow detector: with until= raised as the hint says it grew again and settled, as until=auto finds", () => {
    // Source: the same circuit run twenty times as long, its own last cycles (measured: settled, 4.947 V, 1.58 kHz)
    const long = runStartup(slowDetector, { kind: "startup", probe: node("o"), until: 2 }, { settledFromOrbit: false });
    expect(long.verdict).toBe("settled");
    expect(long.amplitude!).toBeGreaterThan(4);
    const auto = runStartup(slowDetector, { kind: "startup", probe: node("o"), until: "auto" }, { settledFromOrbit: false });
    expect(auto.verdict).toBe("settled");
    expect(Math.abs(auto.amplitude! / long.amplitude! - 1)).toBeLessThan(1e-3);
    expect(Math.abs(auto.frequency! / long.frequency! - 1)).toBeLessThan(1e-3);
  });
});

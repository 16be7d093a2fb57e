import { describe, expect, test } from "vitest";
import { analysisOf, RunLimitError, runStartup, type Circuit, type StartupAnalysis } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { thrownBy } from "../../support/thrown.js";
import { DIODE_WIEN_SOURCE } from "../../support/circuits.js";

/** The diode-limited Wien bridge (f₀ ≈ 1.59 kHz) run 80 ms at steps of at most 1 µs: about 80 000 steps. */
const TEXT = `${DIODE_WIEN_SOURCE}startup probe=o until=80m max-step=1u kick=noise seed=2\n`;
const build = (text: string): Circuit => buildCircuit(loadSource("t.onset", text)).circuit;
const startupOf = (c: Circuit) => analysisOf(c, "startup") as StartupAnalysis;

describe("the start-up run's memory is set by the stored-points limit, not by the run's length", () => {
  const circuit = build(TEXT);
  const whole = runStartup(circuit, startupOf(circuit));
  const bounded = runStartup(circuit, startupOf(circuit), { limits: { maxStoredPoints: 40_000 } });

  test("the stored waveform keeps at most stored-points / 2 time points (and the last step) of a longer run", () => {
    expect(whole.run.solver.accepted).toBeGreaterThan(80_000);
    expect(whole.waveform.time.length).toBe(whole.run.solver.accepted + 1);
    expect(bounded.waveform.time.length).toBeLessThanOrEqual(20_001);
    expect(bounded.waveform.values.length).toBe(bounded.waveform.time.length);
    expect(bounded.waveform.time[bounded.waveform.time.length - 1]).toBe(whole.waveform.time[whole.waveform.time.length - 1]);
  });

  test("the figures measured from the bounded record are the whole record's (its last cycles are kept at every step)", () => {
    expect(bounded.verdict).toBe("settled");
    expect([bounded.verdict, bounded.cycles, bounded.settled.from]).toEqual([whole.verdict, whole.cycles, whole.settled.from]);
    // The settled figures come from the same final state (the orbit search starts from the
    // measured period, equal to rounding); the run's own (start-up, settling) from a thinned start.
    expect(Math.abs(bounded.frequency! / whole.frequency! - 1)).toBeLessThan(1e-10);
    expect(Math.abs(bounded.thd! / whole.thd! - 1)).toBeLessThan(1e-8);
    expect(bounded.thdPlusNoise!).toBeCloseTo(whole.thdPlusNoise!, 6);
    expect(Math.abs(bounded.startupTime! - whole.startupTime!)).toBeLessThan(1e-6);
    expect(Math.abs(bounded.settlingTime! - whole.settlingTime!)).toBeLessThan(1e-5);
  });

  test("a fixed-length run its stored points could not resolve is refused before it starts, naming stored-points", () => {
    // 1 s is about 1560 predicted periods; 10 000 time points resolve 10 000 · 3/8 / 32 ≈ 117 of them.
    const long = build(TEXT.replace("until=80m", "until=1"));
    const e = thrownBy(RunLimitError, () => runStartup(long, startupOf(long), { limits: { maxStoredPoints: 20_000 } }));
    expect([e.diagnostic.code, e.limit, e.value]).toEqual(["stored-points-limit", "maxStoredPoints", 20_000]);
    expect(e.reached).toBeGreaterThan(20_000);
    expect(e.message).toMatch(/^the start-up run until=1 s was not started: within the stored-points limit of 20000 values its waveform of about 15\d\d periods would keep fewer than 32 points per period, too few to measure its cycles \(it needs stored-points=\d+\)$/);
    expect(e.diagnostic.hint).toBe("raise the limit with --limit stored-points=N (API: limits.maxStoredPoints)");
    expect(e.diagnostic.span?.start).toBe(TEXT.indexOf("startup"));
  });

  test("an until=auto run stops as soon as thinning would leave fewer than 32 points per period", () => {
    const auto = build(TEXT.replace("until=80m", "until=auto"));
    const e = thrownBy(RunLimitError, () => runStartup(auto, startupOf(auto), { limits: { maxStoredPoints: 2_000 } }));
    expect(e.diagnostic.code).toBe("stored-points-limit");
    expect(e.message).toMatch(/^the start-up run stopped at t = [\d.e-]+ s: within the stored-points limit of 2000 values/);
  });
});

describe("the settled orbit's grid is bounded by stored-points too", () => {
  const circuit = build(TEXT.replace("until=80m", "until=50m"));
  const whole = runStartup(circuit, startupOf(circuit));
  const bounded = runStartup(circuit, startupOf(circuit), { limits: { maxStoredPoints: 16_000 } });

  test("a run with more steps a period than the bound allows has them merged, says so naming the limit, and keeps its figures within their error bars", () => {
    expect(whole.settled.from).toBe("orbit");
    expect(whole.settled.note).toBeNull();
    expect(bounded.settled.from).toBe("orbit");
    expect(bounded.settled.points![0]).toBeLessThanOrEqual(256);
    expect(bounded.settled.points![0]).toBeLessThan(whole.settled.points![0] / 1.5);
    expect(bounded.settled.note).toMatch(/merges every \d+ of the run's steps.*stored-points/);
    expect(Math.abs(bounded.frequency! - whole.frequency!)).toBeLessThan(bounded.numericalError!.frequency + whole.numericalError!.frequency);
    expect(Math.abs(bounded.amplitude! - whole.amplitude!)).toBeLessThan(bounded.numericalError!.amplitude + whole.numericalError!.amplitude);
    expect(Math.abs(bounded.thd! - whole.thd!)).toBeLessThan(bounded.numericalError!.thd + whole.numericalError!.thd);
  });
});

// A JFET-held Wien bridge (7.87 kΩ, 10 nF, about 2 kHz) whose gain is set high (Rs 3.3 kΩ) and
// whose detector charges through 1 kΩ into 470 nF, bled by 220 kΩ: each overshoot over-charges the
// detector and kills the oscillation, which restarts from the noise — dozens of times, at
// wandering heights and spacings, until one restart lands on the orbit. Such collapses are no
// repeating envelope cycle: until=auto must run on, not stop at the first two as bouncing. A
// loop that squegs (a rail-clipped swing, its detector fed through 22 kΩ) repeats its collapses
// alike and is still called bouncing early (the circuit of startup-state-drift.test.ts).
import { readFileSync } from "node:fs";
import { describe, expect, test } from "vitest";
import { runStartup, runSteady } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { detectorWienSource } from "../../support/jfet-detector-wien.js";

const node = (n: string) => ({ kind: "node", node: n }) as const;
const wien = (v: { R?: string; Rs: string; Rk: string; Cf: string; Rb: string }) =>
  buildCircuit(loadSource("jfet-wien.onset", detectorWienSource({ R: "7.87k", C: "10n", Rf: "10k", idss: "8m", pinchoff: "-2.5", Rgate: "470k", rail: "15", ...v }))).circuit;

describe("irregular collapses are no bouncing verdict yet", () => {
  const thrown = wien({ Rs: "3.3k", Rk: "1k", Cf: "470n", Rb: "220k" });

  test("until=auto runs on until the loop lands on its orbit: settled, on the output and on the detector alike, with a long fixed run's figures", () => {
    const auto = runStartup(thrown, { kind: "startup", probe: node("o"), until: "auto" });
    // measured: settled at 0.134 s, 5.3978 V, 2.007 kHz, settling time 0.112 s (the rule before: bouncing at 67 ms after 5 collapses of peaks 13.1, 7.74, 7.62, 6.51, 7.30 V)
    expect(auto.verdict).toBe("settled");
    const detector = runStartup(thrown, { kind: "startup", probe: node("c"), until: "auto" });
    expect(detector.verdict).toBe("settled");
    expect(detector.run.until).toBe(auto.run.until);
    // Source: the same circuit run to a fixed 1.5 s, its own last cycles without the orbit's refinement (the steady
    // analysis, noiseless, finds no orbit here: its oscillation dies after the first overshoot and never restarts).
    const long = runStartup(thrown, { kind: "startup", probe: node("o"), until: 1.5 }, { settledFromOrbit: false });
    expect(long.verdict).toBe("settled");
    expect(Math.abs(auto.amplitude! / long.amplitude! - 1)).toBeLessThan(1e-3);
    expect(Math.abs(auto.frequency! / long.frequency! - 1)).toBeLessThan(1e-3);
    // The chaotic collapses land where the waveform says, not where until=auto looked: the long run landed at the same moment (before: 0.978 s under until=auto, 0.112 s in the fixed run).
    expect(Math.abs(auto.settlingTime! - long.settlingTime!)).toBeLessThan(1e-3);
  });

  test("where until=auto looks does not change the waveform: its run is a single fixed run's, step for step", () => {
    const auto = runStartup(thrown, { kind: "startup", probe: node("o"), until: "auto" });
    // The fixed run integrates in one go to a moment past auto's end; auto stopped to judge after 60 predicted cycles and every 20 or more after.
    const fixed = runStartup(thrown, { kind: "startup", probe: node("o"), until: auto.run.until * 1.01 });
    const a = auto.waveform;
    const f = fixed.waveform;
    let same = 0;
    while (same < a.time.length && a.time[same] === f.time[same] && a.values[same] === f.values[same]) same++;
    // measured: all 24242 points alike (before: they parted at 33.5 ms, where auto's first look shortened a step)
    expect(same).toBe(a.time.length);
  });

  test("a fixed run that ends among them: bouncing, saying the collapses neither die away nor yet repeat, with their peaks", () => {
    const short = runStartup(thrown, { kind: "startup", probe: node("o"), until: 0.067 });
    expect(short.verdict).toBe("bouncing");
    expect(short.explanation).toMatch(/^the amplitude loop has not settled: the envelope collapsed and restarted \d+ times \(peaks [^)]+\), neither dying away nor yet repeating a cycle/);
  });

  test("a loop that never lands: until=auto's verdict at its bound is a single fixed run's to that moment, word for word", () => {
    const chaotic = wien({ Rs: "3.0k", Rk: "1k", Cf: "470n", Rb: "220k" });
    const auto = runStartup(chaotic, { kind: "startup", probe: node("o"), until: "auto" });
    // measured: bouncing without a repeating cycle at the 2.458 s bound (4000 predicted cycles), 136 collapses
    expect(auto.verdict).toBe("bouncing");
    expect(auto.explanation).toMatch(/neither dying away nor yet repeating a cycle/);
    expect(auto.warnings.map((w) => w.code)).toContain("not-settled-within");
    const fixed = runStartup(chaotic, { kind: "startup", probe: node("o"), until: auto.run.until });
    // The same steps (auto looked 60 predicted cycles in, then every 20 or more; the fixed run went in one go): the same record, verdict and figures.
    expect(fixed.waveform.values).toEqual(auto.waveform.values);
    expect(fixed.explanation).toBe(auto.explanation);
    expect(fixed.amplitude).toBe(auto.amplitude);
  });

  test("a squegging loop repeats its collapses alike: bouncing, called unstable, long before until=auto's bound", () => {
    const squegging = wien({ R: "10k", Rs: "3.9k", Rk: "22k", Cf: "5.5u", Rb: "1M" });
    const r = runStartup(squegging, { kind: "startup", probe: node("o"), until: "auto" });
    // measured: bouncing at 0.71 s after 6 collapses from 13.4 V to 0.12 V, 93.7 ms apart (the bound: 2 s)
    expect(r.verdict).toBe("bouncing");
    expect(r.explanation).toMatch(/^the amplitude loop is unstable: the envelope collapsed and restarted \d+ times/);
    expect(r.run.until).toBeLessThan(1);
  });
});

describe("examples/jfet-loop-source.onset with its detector capacitor at 2.2 µF", () => {
  const source = readFileSync(new URL("../../../examples/jfet-loop-source.onset", import.meta.url), "utf8").replace("param Cf = 1uF", "param Cf = 2.2uF");
  const circuit = buildCircuit(loadSource("jfet-loop-source.onset", source)).circuit;

  test("collapses twice after its first overshoots, then settles under until=auto, on the output and the detector, on the steady orbit", () => {
    const auto = runStartup(circuit, { kind: "startup", probe: node("o"), until: "auto" });
    // measured: settled at 0.435 s, 4.414380 V, 2003.92 Hz (envelope maxima 4.683, 4.675 V, minima 19 mV, 39 mV, then 4.585, 4.536, 4.501 V …)
    expect(auto.verdict).toBe("settled");
    expect(runStartup(circuit, { kind: "startup", probe: node("c"), until: "auto" }).verdict).toBe("settled");
    // Source: the periodic steady state by shooting, an independent route from the noiseless bias point (measured: stable, |μ| 0.974; its closed-form checks: test/e2e/steady-acceptance.test.ts)
    const steady = runSteady(circuit, { kind: "steady", probe: node("o") });
    expect(steady.stability!.verdict).toBe("stable");
    expect(Math.abs(auto.amplitude! / steady.amplitude! - 1)).toBeLessThan(1e-4);
    expect(Math.abs(auto.frequency! / steady.frequency! - 1)).toBeLessThan(1e-4);
  });
});

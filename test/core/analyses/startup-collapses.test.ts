// A stable amplitude loop whose first overshoots are large enough to collapse the oscillation:
// a JFET-held Wien bridge (6.8 kΩ, 6.8 nF, about 3.4 kHz) with a slow peak detector (2.2 kΩ into
// 470 nF, bled by 470 kΩ). Its envelope collapses and restarts several times, each collapse
// shallower, before it settles. until=auto must run on to the settled orbit, not stop there as
// bouncing; checked against the periodic steady state found by shooting (its Floquet multipliers
// inside the unit circle: every disturbance dies out, so must the collapses) and against a long
// fixed run's own last cycles.
import { describe, expect, test } from "vitest";
import { runStartup, runSteady } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { detectorWienSource } from "../../support/jfet-detector-wien.js";

const node = (n: string) => ({ kind: "node", node: n }) as const;

const jfetWien = buildCircuit(
  loadSource("jfet-wien.onset", detectorWienSource({ R: "6.8k", C: "6.8n", Rf: "27k", Rs: "12k", idss: "6m", pinchoff: "-1.5", Rgate: "1M", Rk: "2.2k", Cf: "470n", Rb: "470k", rail: "12" })),
).circuit;

describe("a stable loop whose envelope collapses a few times before it settles", () => {
  test("until=auto ends settled on the steady orbit (stable multipliers), with the figures of a long fixed run", () => {
    const steady = runSteady(jfetWien, { kind: "steady", probe: node("o") });
    expect(steady.found).toBe(true);
    // measured: |μ| 0.974 (0.859 ± 0.459j), 3.42555 V, 3389.49 Hz
    expect(steady.stability!.verdict).toBe("stable");
    expect(Math.hypot(steady.multipliers[0]!.re, steady.multipliers[0]!.im)).toBeLessThan(1);

    const auto = runStartup(jfetWien, { kind: "startup", probe: node("o"), until: "auto" });
    // measured: settled at 197.5 ms (it collapsed and restarted 4 times, the last dip at 0.62 V; the rule before called it bouncing at 98.7 ms)
    expect(auto.verdict).toBe("settled");
    expect(auto.warnings.some((w) => w.code === "not-settled-within")).toBe(false);
    expect(Math.abs(auto.amplitude! / steady.amplitude! - 1)).toBeLessThan(1e-4);
    expect(Math.abs(auto.frequency! / steady.frequency! - 1)).toBeLessThan(1e-4);

    // the run's own last cycles, twice as long, without the orbit's refinement (measured: 3.42556 V, 3388.30 Hz)
    const long = runStartup(jfetWien, { kind: "startup", probe: node("o"), until: 0.4 }, { settledFromOrbit: false });
    expect(long.verdict).toBe("settled");
    expect(Math.abs(long.amplitude! / steady.amplitude! - 1)).toBeLessThan(1e-3);
    expect(Math.abs(long.frequency! / steady.frequency! - 1)).toBeLessThan(1e-3);
  });
});

// Property-based regression of the example oscillators through the npm API: parse a file once,
// elaborate it with overrides per case, run its startup analysis, read typed metrics.
import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { readFileSync } from "node:fs";
import { oscillates, runPoles, runStartup, startupAnalysisOf, type StartupResult } from "@onset/core";
import { elaborate, loadProgram, type Overrides } from "@onset/netlist-parser";

function example(name: string) {
  const file = `examples/${name}`;
  const { program, diagnostics } = loadProgram(file, readFileSync(file, "utf8"));
  expect(diagnostics).toEqual([]);
  const build = (overrides: Overrides) => {
    const r = elaborate(program, { overrides });
    if (!r.circuit) throw new Error(r.diagnostics.map((d) => d.message).join("; "));
    return r.circuit;
  };
  const cache = new Map<string, StartupResult>();
  const startup = (overrides: Overrides): StartupResult => {
    const key = JSON.stringify(overrides);
    if (!cache.has(key)) {
      const c = build(overrides);
      cache.set(key, runStartup(c, startupAnalysisOf(c)!));
    }
    return cache.get(key)!;
  };
  /** The linear start threshold of a setting, by bisection on the sign of the poles' growth. */
  const linearThreshold = (name: string, lo: number, hi: number, startsAbove: boolean) => {
    for (let k = 0; k < 30; k++) {
      const mid = (lo + hi) / 2;
      const grows = runPoles(build({ [name]: mid }), { kind: "poles" }).starts;
      if (grows === startsAbove) hi = mid;
      else lo = mid;
    }
    return (lo + hi) / 2;
  };
  return { startup, linearThreshold };
}

// Numerical slack of a settled measurement: amplitude to 0.1 %, THD to 0.02 percentage points.
const AMPLITUDE_SLACK = 1e-3;
const THD_SLACK = 2e-4;

describe("bridge-excitation source (Wien, diode limiting): gain trimmer P1.at", () => {
  const bridge = example("bridge-excitation.onset");
  const threshold = bridge.linearThreshold("P1.at", 0, 1, true);
  const setting = (lo: number, hi: number) => fc.integer({ min: Math.ceil(lo * 1000), max: Math.floor(hi * 1000) }).map((k) => k / 1000);

  test("the linear start threshold lies inside the trimmer's travel", () => {
    expect(threshold).toBeGreaterThan(0.1);
    expect(threshold).toBeLessThan(0.5);
  });

  test("above the threshold the settled amplitude does not decrease as the gain rises", () => {
    fc.assert(
      fc.property(setting(threshold + 0.03, 1), setting(threshold + 0.03, 1), (a, b) => {
        const [low, high] = a < b ? [a, b] : [b, a];
        const rl = bridge.startup({ "P1.at": low });
        const rh = bridge.startup({ "P1.at": high });
        expect(rl.verdict).toBe("settled");
        expect(rh.verdict).toBe("settled");
        expect(rh.amplitude!).toBeGreaterThanOrEqual(rl.amplitude! * (1 - AMPLITUDE_SLACK));
      }),
      { numRuns: 6, seed: 20261201 },
    );
  });

  test("over the working travel (threshold … 0.75) THD does not fall as the gain rises", () => {
    // Past at ≈ 0.8 the THD of this limiter turns down again (3.0 % → 2.6 % at full travel, measured):
    // the diodes then carry most of the swing. The property is stated for the working range.
    fc.assert(
      fc.property(setting(threshold + 0.03, 0.75), setting(threshold + 0.03, 0.75), (a, b) => {
        const [low, high] = a < b ? [a, b] : [b, a];
        expect(bridge.startup({ "P1.at": high }).thd!).toBeGreaterThanOrEqual(bridge.startup({ "P1.at": low }).thd! - THD_SLACK);
      }),
      { numRuns: 6, seed: 20261202 },
    );
  });

  test("below the threshold the verdict is silent or decaying", () => {
    fc.assert(
      fc.property(setting(0, threshold - 0.03), (at) => {
        expect(["silent", "decaying"]).toContain(bridge.startup({ "P1.at": at }).verdict);
      }),
      { numRuns: 5, seed: 20261203 },
    );
  });

  test("shrinking a failing 'never starts' property lands on the start threshold", () => {
    const result = fc.check(
      fc.property(setting(0, 1), (at) => !oscillates(bridge.startup({ "P1.at": at }).verdict)),
      { numRuns: 20, seed: 7 },
    );
    expect(result.failed).toBe(true);
    const found = (result.counterexample as [number])[0];
    expect(Math.abs(found - threshold)).toBeLessThan(0.02);
  });
});

describe("tuning reference (twin-T): start-margin divider Rp1 (a smaller Rp1 is more gain)", () => {
  const reference = example("tuning-reference.onset");
  const threshold = reference.linearThreshold("Rp1", 40e3, 150e3, false);
  const rp1 = (lo: number, hi: number) => fc.integer({ min: Math.ceil(lo / 100), max: Math.floor(hi / 100) }).map((k) => k * 100);

  test("above the threshold amplitude and THD do not fall as the gain rises", () => {
    fc.assert(
      fc.property(rp1(56e3, threshold * 0.9), rp1(56e3, threshold * 0.9), (a, b) => {
        const [moreGain, lessGain] = a < b ? [a, b] : [b, a];
        const rm = reference.startup({ Rp1: moreGain });
        const rl = reference.startup({ Rp1: lessGain });
        expect(rm.verdict).toBe("settled");
        expect(rm.amplitude!).toBeGreaterThanOrEqual(rl.amplitude! * (1 - AMPLITUDE_SLACK));
        expect(rm.thd!).toBeGreaterThanOrEqual(rl.thd! - THD_SLACK);
      }),
      { numRuns: 4, seed: 20261204 },
    );
  });

  test("below the threshold (Rp1 above it) the verdict is silent or decaying", () => {
    fc.assert(
      fc.property(rp1(threshold * 1.05, 150e3), (r) => {
        expect(["silent", "decaying"]).toContain(reference.startup({ Rp1: r }).verdict);
      }),
      { numRuns: 4, seed: 20261205 },
    );
  });
});

// The halved grid's multipliers by projection (`projectedMultipliers`), which the Floquet
// multipliers' error bars (`multiplierError`) are taken against: checked against the halved grid's
// own monodromy matrix at the same period (the full n + 1 sensitivity columns the projection
// replaces), and the bars against an independent reference: scipy 1.17's monodromy matrix
// (test/validation/reference/floquet.py: solve_ivp Radau, rtol 1e-11, on the variational
// equation over one period of the settled orbit; the trivial multiplier left out).
import { afterEach, describe, expect, test, vi } from "vitest";
import { readFileSync } from "node:fs";
import { runSteady, startupAnalysisOf, type Circuit } from "@onset/core";
import { eigenvalues, PeriodicMap, type PeriodStart } from "@onset/core/engine";
import { buildCircuit, elaborate, loadProgram, loadSource } from "@onset/netlist-parser";
import { TangentPeriod } from "../../../packages/core/src/steady/tangent-period.js";

type Probe = NonNullable<ReturnType<typeof startupAnalysisOf>>["probe"];

const validation = (name: string): Circuit => buildCircuit(loadSource(`${name}.onset`, readFileSync(`test/validation/circuits/${name}.onset`, "utf8").replace(/^startup .*$/m, ""))).circuit!;

function example(name: string): { circuit: Circuit; probe: Probe } {
  const file = `examples/${name}.onset`;
  const circuit = elaborate(loadProgram(file, readFileSync(file, "utf8")).program, {}).circuit!;
  return { circuit, probe: startupAnalysisOf(circuit)!.probe };
}

/** A steady run, with the halved grid's last shooting period (the one the projection's tangent passes follow) and the number of directions passed. */
function steadyWithLastPeriod(circuit: Circuit, probe: Probe, accuracy?: number) {
  const run = PeriodicMap.prototype.run;
  const periods: { map: PeriodicMap; start: PeriodStart; fractions: Float64Array; states: Float64Array[] }[] = [];
  vi.spyOn(PeriodicMap.prototype, "run").mockImplementation(function (this: PeriodicMap, start, fractions, predictor, sensitivity) {
    const end = run.call(this, start, fractions, predictor, sensitivity);
    periods.push({ map: this, start: { ...start, x: Float64Array.from(start.x) }, fractions, states: this.states.map((x) => Float64Array.from(x)) });
    return end;
  });
  const passes = vi.spyOn(TangentPeriod.prototype, "applyEach");
  const result = runSteady(circuit, { kind: "steady", probe, ...(accuracy === undefined ? {} : { accuracy }) });
  vi.restoreAllMocks();
  const finest = Math.max(...periods.map((p) => p.fractions.length));
  const last = periods.filter((p) => p.fractions.length === finest).pop()!;
  return { result, last, directions: passes.mock.calls.map(([vs]) => vs.length) };
}

/** The halved grid's multipliers at that period, from its full monodromy matrix. */
function fullMultipliers(last: ReturnType<typeof steadyWithLastPeriod>["last"]): { re: number; im: number }[] {
  const s = last.map.run(last.start, last.fractions, last.states, true).sensitivity!;
  const n = last.map.n;
  const monodromy = Float64Array.from({ length: n * n }, (_, k) => s.x[Math.floor(k / n) * s.columns + (k % n)]!);
  const { re, im } = eigenvalues(monodromy, n);
  return Array.from(re, (v, k) => ({ re: v, im: im[k]! }));
}

const nearest = (m: { re: number; im: number }, all: readonly { re: number; im: number }[]) => Math.min(...all.map((f) => Math.hypot(f.re - m.re, f.im - m.im)));

describe("the projected halved-grid multipliers against the halved grid's full monodromy matrix", () => {
  afterEach(() => vi.restoreAllMocks());

  // wien-rail-hard: the trivial multiplier's grid error (1.4e-2 at accuracy=1e-3) is 10⁵ times the
  // listed one's; a first-order estimate along the listed mode alone missed by 2e-6.
  const cases = [
    { what: "a slowly attracting twin-T", circuit: () => ({ circuit: validation("twin-t"), probe: { kind: "node", node: "o" } as const }) },
    { what: "a Wien clipping hard at the rails", circuit: () => ({ circuit: validation("wien-rail-hard"), probe: { kind: "node", node: "o" } as const }) },
    { what: "the JFET-loop Wien (a complex pair)", circuit: () => example("jfet-loop-source") },
  ];
  for (const c of cases) {
    test(`${c.what}, accuracy=1e-3: each bar is twice the distance to the full matrix's nearest multiplier, within 1 %`, () => {
      const { circuit, probe } = c.circuit();
      const { result, last, directions } = steadyWithLastPeriod(circuit, probe, 1e-3);
      // One sweep of tangent passes, one direction per lasting mode (two per complex pair), no fallback.
      expect(directions.length).toBe(1);
      const full = fullMultipliers(last);
      expect(result.multipliers.length).toBeGreaterThan(0);
      for (const [k, m] of result.multipliers.entries()) {
        const bar = 2 * nearest(m, full);
        expect(bar).toBeGreaterThan(0);
        expect(Math.abs(result.multiplierError![k]! / bar - 1), `multiplier ${k}`).toBeLessThan(1e-2);
      }
    });
  }

  test("the JFET-loop Wien's listed multipliers are a complex pair (the projection's complex path is exercised)", () => {
    const { circuit, probe } = example("jfet-loop-source");
    const { result, directions } = steadyWithLastPeriod(circuit, probe);
    expect(result.multipliers.some((m) => m.im !== 0)).toBe(true);
    // Trivial + the pair's real and imaginary parts.
    expect(directions).toEqual([3]);
  });
});

describe("the projected bars against scipy's multipliers (floquet.py)", () => {
  afterEach(() => vi.restoreAllMocks());

  const cases = [
    // scipy (floquet.py phase-shift-ladder): 0.885646478499442, 0.04400368595149976.
    { name: "phase-shift-ladder", multipliers: [0.885646478499442, 0.04400368595149976] },
    // scipy (floquet.py wien-rail-hard): 1.1519274122566508e-06.
    { name: "wien-rail-hard", multipliers: [1.1519274122566508e-6] },
  ];
  for (const c of cases) {
    for (const accuracy of [1e-3, 3e-4, 3e-5]) {
      test(`${c.name}, accuracy=${accuracy}: the bar from the projection holds scipy's multiplier`, () => {
        const { result, directions } = steadyWithLastPeriod(validation(c.name), { kind: "node", node: "o" }, accuracy);
        expect(directions.length).toBe(1);
        for (const [k, reference] of c.multipliers.entries()) {
          const m = result.multipliers[k]!;
          expect(Math.hypot(m.re - reference, m.im), `multiplier ${k}`).toBeLessThanOrEqual(result.multiplierError![k]!);
        }
      });
    }
  }
});

import { afterEach, describe, expect, test, vi } from "vitest";
import { PeriodicMap, refineOrbit, shootOrbit } from "@onset/core/engine";
import { TangentPeriod } from "../../../packages/core/src/steady/tangent-period.js";
import { clippedWien, settledPeriod } from "./support.js";

const halved = (fractions: Float64Array) => Float64Array.from({ length: 2 * fractions.length }, (_, k) => 0.5 * fractions[k >> 1]!);

describe("the halved grid's shooting on the run's grid's Newton matrix", () => {
  afterEach(() => vi.restoreAllMocks());

  test("refineOrbit's halved grid integrates only its shooting's periods, none with sensitivities: its multipliers come from tangent passes over the last one, one per lasting mode", () => {
    const { system, guess, fractions, trajectory, read } = settledPeriod(clippedWien(3.1), "p", 1 / 1580.7, 0.04);
    const run = vi.spyOn(PeriodicMap.prototype, "run");
    const passes = vi.spyOn(TangentPeriod.prototype, "applyEach");
    const refined = refineOrbit(system, guess, fractions, trajectory, read, 20, { multipliers: true });
    const fine = run.mock.calls.filter(([, grid]) => grid.length === 2 * fractions.length);
    expect(fine.length).toBe(refined.iterations[1]);
    expect(fine.every(([, , , sensitivity]) => !sensitivity)).toBe(true);
    // The lasting modes: the multipliers above 1e-10 (the trivial one included), all real here.
    const lasting = refined.orbit.multipliers.filter((m) => Math.hypot(m.re, m.im) >= 1e-10);
    expect(lasting.length).toBeGreaterThan(1);
    expect(passes).toHaveBeenCalledTimes(1);
    expect(passes.mock.calls[0]![0].length).toBe(lasting.length);
    expect(refined.finerMultipliers.length).toBe(lasting.length);
  });

  test("without multipliers asked for, no period of the halved grid carries sensitivities", () => {
    const { system, guess, fractions, trajectory, read } = settledPeriod(clippedWien(3.1), "p", 1 / 1580.7, 0.04);
    const run = vi.spyOn(PeriodicMap.prototype, "run");
    const refined = refineOrbit(system, guess, fractions, trajectory, read, 20);
    const fine = run.mock.calls.filter(([, grid]) => grid.length === 2 * fractions.length);
    expect(fine.length).toBe(refined.iterations[1]);
    expect(fine.every(([, , , sensitivity]) => !sensitivity)).toBe(true);
    expect(refined.finerMultipliers).toEqual([]);
  });

  test("sensitivities \"given\" finds the same orbit as fresh sensitivities, within the shooting's tolerance", () => {
    const { system, guess, fractions, trajectory } = settledPeriod(clippedWien(3.1), "p", 1 / 1580.7, 0.04);
    const relative = 1e-8;
    const coarse = shootOrbit(system, guess, fractions, trajectory, { autonomous: true, relative });
    const fine = halved(fractions);
    const start = (sensitivities: "given" | "when-needed") => shootOrbit(system, coarse.start, fine, undefined, { autonomous: true, relative, jacobian: coarse.jacobian, sensitivities });
    const given = start("given");
    const exact = start("when-needed");
    expect(Math.abs(given.start.period / exact.start.period - 1)).toBeLessThan(2 * relative);
    for (let i = 0; i < system.n; i++) expect(Math.abs(given.start.x[i]! - exact.start.x[i]!)).toBeLessThan(1e-6);
  });
});

describe("sensitivities \"given\" with a matrix that does not contract", () => {
  afterEach(() => vi.restoreAllMocks());

  test("the shooting puts it back once, then takes the map's sensitivities, and converges to the same orbit", () => {
    const { system, guess, fractions, trajectory } = settledPeriod(clippedWien(3.1), "p", 1 / 1580.7, 0.04);
    const relative = 1e-8;
    const coarse = shootOrbit(system, guess, fractions, trajectory, { autonomous: true, relative });
    // The coarse matrix's periodicity rows times 3: a step from it goes a third of the way, leaving two thirds of the distance.
    const u = system.n + 1;
    const matrix = Float64Array.from(coarse.jacobian.matrix, (v, k) => (Math.floor(k / u) < system.n ? 3 * v : v));
    const run = vi.spyOn(PeriodicMap.prototype, "run");
    const orbit = shootOrbit(system, coarse.start, halved(fractions), undefined, { autonomous: true, relative, jacobian: { matrix, phase: coarse.jacobian.phase }, sensitivities: "given" });
    expect(run.mock.calls.some(([, , , sensitivity]) => sensitivity)).toBe(true);
    const exact = shootOrbit(system, coarse.start, halved(fractions), undefined, { autonomous: true, relative, jacobian: coarse.jacobian });
    expect(Math.abs(orbit.start.period / exact.start.period - 1)).toBeLessThan(2 * relative);
  });
});

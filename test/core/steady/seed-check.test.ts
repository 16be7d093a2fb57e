// An orbit seed is plain data (posted between threads, or built by a caller): runSteady checks its
// shape at the door, so a malformed one is a bad-argument error naming the field, never a TypeError
// from inside the shooting.
import { describe, expect, test } from "vitest";
import { OnsetError, runSteady, steadySeed, type OrbitSeed } from "@onset/core";
import { circuit } from "../../support/circuits.js";
import { clippedTank } from "../../support/clipped-tank.js";
import { thrownBy } from "../../support/thrown.js";

const tank = circuit(clippedTank());
const analysis = { kind: "steady", probe: { kind: "node", node: "v" } } as const;
const seed = steadySeed(tank, analysis)!;
const plain = runSteady(tank, analysis);

function refused(bad: unknown): string {
  const error = thrownBy(OnsetError, () => runSteady(tank, analysis, { seed: bad as OrbitSeed }));
  expect(error.diagnostic.code).toBe("bad-argument");
  return error.message;
}

describe("runSteady(circuit, analysis, { seed }) checks the seed's shape", () => {
  test("a seed from steadySeed is taken, and the orbit shot from it is the circuit's own", () => {
    const r = runSteady(tank, analysis, { seed });
    expect(r.found).toBe(true);
    expect(Math.abs(r.frequency! - plain.frequency!)).toBeLessThan(plain.numericalError!.frequency + r.numericalError!.frequency);
  });

  test.each([
    ["not an object", 5, /^runSteady: options\.seed must be an orbit seed \(see steadySeed\), got 5$/],
    ["empty", {}, /^runSteady: options\.seed\.x must be a Float64Array of finite numbers, got undefined$/],
    ["x with NaN", { ...seed, x: seed.x.map(() => NaN) }, /options\.seed\.x must be/],
    ["a period of −1", { ...seed, period: -1 }, /^runSteady: options\.seed\.period must be a finite time above 0 s, got -1$/],
    ["an infinite period", { ...seed, period: Infinity }, /options\.seed\.period must be/],
    ["no grid", { ...seed, fractions: new Float64Array(0), states: [] }, /options\.seed\.fractions must be a non-empty Float64Array of steps above 0/],
    ["a step of 0", { ...seed, fractions: seed.fractions.map((f, k) => (k === 0 ? 0 : f)) }, /options\.seed\.fractions must be/],
    ["three states", { ...seed, states: seed.states.slice(0, 3) }, new RegExp(`options\\.seed\\.states must be ${seed.fractions.length + 1} arrays \\(one per grid point\\) of ${seed.x.length} finite numbers, got an array of 3$`)],
    ["a matrix of 5", { ...seed, matrix: new Float64Array(5) }, /options\.seed\.matrix must be empty or \(\d+ \+ 1\)² finite numbers/],
    ["a phase past the unknowns", { ...seed, phase: 999 }, /options\.seed\.phase must be an unknown's index from 0 to \d+, got 999$/],
    ["a negative contraction", { ...seed, contraction: -1 }, /options\.seed\.contraction must be a number from 0 \(Infinity allowed\), got -1$/],
  ])("%s is a bad argument naming the field", (_, bad, message) => {
    expect(refused(bad)).toMatch(message);
  });

  test("a well-formed seed of another circuit's size is not used (the run goes on as without one)", () => {
    const other = { x: new Float64Array(3), period: 1e-3, fractions: new Float64Array([0.5, 0.5]), states: [new Float64Array(3), new Float64Array(3), new Float64Array(3)], matrix: new Float64Array(0), phase: 0 };
    const r = runSteady(tank, analysis, { seed: other });
    expect(r.found).toBe(true);
    expect(r.frequency).toBe(plain.frequency);
  });
});

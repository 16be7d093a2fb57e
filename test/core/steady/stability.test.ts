// The trivial Floquet multiplier, given apart from the rest (steady/stability.ts).
import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { nonTrivialMultipliers, trivialMultiplier } from "../../../packages/core/src/steady/stability.js";

const multiplier = fc.record({ re: fc.double({ min: -2, max: 2, noNaN: true }), im: fc.double({ min: -2, max: 2, noNaN: true }) });
const distance = (m: { re: number; im: number }) => Math.hypot(m.re - 1, m.im);

describe("trivialMultiplier", () => {
  test("autonomous: the multiplier nearest 1, the one nonTrivialMultipliers leaves out", () => {
    fc.assert(
      fc.property(fc.array(multiplier, { minLength: 1, maxLength: 8 }), (ms) => {
        const trivial = trivialMultiplier(ms, true)!;
        expect(ms.every((m) => distance(trivial) <= distance(m))).toBe(true);
        expect(nonTrivialMultipliers(ms, true)).not.toContain(trivial);
      }),
    );
  });
  test("driven, or no multipliers: none", () => {
    expect(trivialMultiplier([{ re: 1, im: 0 }], false)).toBeNull();
    expect(trivialMultiplier([], true)).toBeNull();
  });
});

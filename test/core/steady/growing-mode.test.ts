// The steady analysis starts in the dominant pole's natural mode (growing-mode.ts). Around a
// near-ideal amplifier (open-loop gain 1e7) the pencil 1e-7 off the pole is too ill-conditioned
// for the LU's pivot test, and the analysis answered "the growing mode could not be computed".
import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { opampPresets, runPoles, runSteady } from "@onset/core";
import { circuit, crLadder, part } from "../../support/circuits.js";
import { ladderReference } from "../../support/clipped-oscillators.js";
import { largestNode, type UnknownInfo } from "@onset/core/engine";

const R = 4.7e3;
const C = 22e-9;
const k = 35;

describe("modeOfPole through runSteady: a C–R ladder around the ideal op-amp preset", () => {
  const c = circuit([
    ...crLadder(R, C),
    part("resistor", "R3", ["c", "n"], R),
    part("resistor", "Rf", ["n", "o"], k * R),
    part("opamp", "U1", ["gnd", "n", "o"], undefined, { ...opampPresets.ideal, rails: [-5, 5] }),
  ]);

  test("finds the stable orbit at the frequency of the ideal clip's state equations (odex ODE integrator) within 0.5 %", () => {
    const r = runSteady(c, { kind: "steady", probe: { kind: "node", node: "o" } });
    expect(r.explanation).not.toMatch(/growing mode could not be computed/);
    expect(r.found).toBe(true);
    expect(r.stability!.verdict).toBe("stable");
    const reference = ladderReference(k, R, C, 5, 150e-3);
    // 0.5 %: the preset's 1 mV knee rounds the clip (as in hard-clipped.test.ts).
    expect(Math.abs(r.frequency! / reference.frequency - 1)).toBeLessThan(0.005);
    // and near the poles' pair, which the clip's harmonics move by well under 1 %
    expect(Math.abs(r.frequency! / runPoles(c, { kind: "poles" }).frequency! - 1)).toBeLessThan(0.01);
  });
});

describe("largestNode: the node voltage the approach watches", () => {
  const unknowns = (nodes: boolean[]) => nodes.map((isNode) => ({ isNode }) as UnknownInfo);
  test("the largest entry in size among the nodes, whatever larger entry another unknown has", () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.double({ min: -10, max: 10, noNaN: true }), fc.boolean()), { minLength: 1, maxLength: 20 }), (entries) => {
        const mode = Float64Array.from(entries.map(([v]) => v));
        const top = largestNode(mode, unknowns(entries.map(([, n]) => n)));
        const nodes = entries.map(([v, n], i) => ({ v: Math.abs(v), n, i })).filter((e) => e.n);
        if (nodes.length === 0) return top === 0;
        return entries[top]![1] && nodes.every((e) => e.v <= Math.abs(mode[top]!));
      }),
    );
  });
});

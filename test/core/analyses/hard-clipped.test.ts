// Issue 12, item 3: hard-limited oscillators around near-ideal op-amps (gain 1M, gbw 1G, rails
// ±10 V, no headroom, the default slew rate) are settled, at the frequency and distortion of
// their ideal-amplifier state equations integrated by odex (test/support/clipped-oscillators.ts).
import { describe, expect, test } from "vitest";
import { runStartup, type PartSpec } from "@onset/core";
import { circuit, crLadder, part, wienNetwork } from "../../support/circuits.js";
import { ladderReference, wienReference, type SettledReference } from "../../support/clipped-oscillators.js";

const R = 1e3;
const C = 100e-9;
const node = (n: string) => ({ kind: "node", node: n }) as const;
const amplifier = (rout: number, knee?: number) => ({ gain: 1e6, gbw: 1e9, rails: [-10, 10], headroom: 0, rout, ...(knee === undefined ? {} : { knee }) });

const wien = (A: number, rout: number, knee?: number): PartSpec[] => [
  ...wienNetwork({ R1: R, R2: R, C1: C, C2: C }),
  part("resistor", "Rf", ["o", "n"], (A - 1) * R),
  part("resistor", "Rg", ["n", "gnd"], R),
  part("opamp", "U1", ["p", "n", "o"], undefined, amplifier(rout, knee)),
];

const ladder = (k: number, rout: number, knee?: number): PartSpec[] => [
  ...crLadder(R, C),
  part("resistor", "R3", ["c", "n"], R),
  part("resistor", "Rf", ["n", "o"], k * R),
  part("opamp", "U1", ["gnd", "n", "o"], undefined, amplifier(rout, knee)),
];

const variants: Array<[number, number | undefined]> = [
  [0, 1e-4],
  [0, undefined],
  [1e-3, 1e-4],
  [1e-3, undefined],
];

function check(parts: PartSpec[], reference: SettledReference) {
  const r = runStartup(circuit(parts), { kind: "startup", probe: node("o"), until: "auto" });
  expect(r.verdict).toBe("settled");
  expect(Math.abs(r.frequency! / reference.frequency - 1)).toBeLessThan(0.005);
  expect(Math.abs(r.thd! / reference.thd - 1)).toBeLessThan(0.1);
}

describe("hard-clipped oscillators against their ideal-amplifier state equations (odex, Gragg–Bulirsch–Stoer)", () => {
  // Wien at A = 3.3: odex gives 1541.4769 Hz, the fundamental 11.3473 V (docs/references.md §2.4 lists the same digits).
  let wienRef: SettledReference;
  let ladderRef: SettledReference;

  test.each(variants)("Wien bridge, A = 3.3, rout = %d Ω, knee %s V: settled, f within 0.5 %, THD within 10 %", (rout, knee) => {
    wienRef ??= wienReference(3.3, R, C, 10, 80e-3);
    expect(wienRef.frequency).toBeCloseTo(1541.4769, 3);
    check(wien(3.3, rout, knee), wienRef);
  });

  test.each(variants)("C–R ladder, inverting gain 35, rout = %d Ω, knee %s V: settled, f within 0.5 %, THD within 10 %", (rout, knee) => {
    ladderRef ??= ladderReference(35, R, C, 10, 150e-3);
    check(ladder(35, rout, knee), ladderRef);
  });
});

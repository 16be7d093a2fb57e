// steady from=poles on a Wien clipped hard at the rails (gain 1 + 37k/10k = 4.7): the orbit
// repeats at 2.76 kHz, far from the poles' 2.00 kHz, so a shooting from the poles' period does
// not converge; the next starts from the measured period and finds the orbit from=startup finds.
import { expect, test } from "vitest";
import { runSteady } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";

const clipped = buildCircuit(
  loadSource(
    "clipped-wien.onset",
    `resistor  R1 o s 4.4k
capacitor C1 s p 10n
resistor  R2 p gnd 4.4k
capacitor C2 p gnd 10n
resistor  Rf o n 37k
resistor  Rg n gnd 10k
opamp     U1 p n o preset=general rails=(-12, 12)
`,
  ),
).circuit;
const probe = { kind: "node", node: "o" } as const;

test("from=poles finds the orbit from=startup finds, within their error bars, where the poles' period is 1.4 times the orbit's", () => {
  const poles = runSteady(clipped, { kind: "steady", probe, from: "poles" });
  const startup = runSteady(clipped, { kind: "steady", probe });
  // measured: 2764.90 Hz, 10.4627 V peak from both (before: from=poles "no periodic orbit found after 20 periods")
  expect(poles.found).toBe(true);
  expect(startup.found).toBe(true);
  // Cross-check: the two starts' orbits agree within the sum of their error bars.
  expect(Math.abs(poles.frequency! - startup.frequency!)).toBeLessThan(poles.numericalError!.frequency + startup.numericalError!.frequency);
  expect(Math.abs(poles.amplitude! - startup.amplitude!)).toBeLessThan(poles.numericalError!.amplitude + startup.numericalError!.amplitude);
  expect(poles.frequency! / poles.predicted.frequency!).toBeGreaterThan(1.3);
});

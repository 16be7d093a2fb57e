// The steady analysis' error bars on waveforms with corners (an op-amp clipped at its rails), at
// the default settings and at a tighter accuracy=, against independent references: scipy's
// solve_ivp (Radau, rtol 1e-11) on the same circuits' state equations, through the validation
// table's scripts (test/validation/reference/*.py), and the closed form of a linear filter.
import { describe, expect, test } from "vitest";
import { readFileSync } from "node:fs";
import { runSteady, type SteadyResult } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";

const probe = { kind: "node", node: "o" } as const;

function steadyOf(text: string, accuracy?: number): SteadyResult {
  const circuit = buildCircuit(loadSource("corners.onset", text)).circuit!;
  return runSteady(circuit, { kind: "steady", probe, ...(accuracy === undefined ? {} : { accuracy }) });
}

const wien = (r: string, rf: string, opamp: string) => `resistor R1 o s ${r}
capacitor C1 s p 10n
resistor R2 p gnd ${r}
capacitor C2 p gnd 10n
resistor Rg n gnd 10k
resistor Rf n o ${rf}
opamp U1 p n o ${opamp}
`;

interface Reference {
  readonly frequency: number;
  readonly amplitude: number;
  readonly rms: number;
  /** THD_F over harmonics 2 … 30, the steady analysis' default. */
  readonly thd: number;
}

const cases: { name: string; text: string; accuracy?: number; reference: Reference }[] = [
  {
    name: "the validation table's Wien clipped at its rails (gain 3.15), defaults",
    text: readFileSync("test/validation/circuits/wien-rail-clipped.onset", "utf8").replace(/^startup .*$/m, ""),
    // test/validation/references.json, case wien-rail-clipped: scipy Radau, rtol 1e-11.
    reference: { frequency: 1530.010728335586, amplitude: 10.461102787735138, rms: 8.091756957840525, thd: 0.06893350816896188 },
  },
  {
    name: "a Wien clipped hard (gain 4.7, general, rails ±12 V), defaults",
    text: wien("10k", "37k", "preset=general rails=(-12, 12)"),
    // scipy 1.17 solve_ivp Radau, rtol 1e-11, atol 1e-11 V, largest step T/1000, through test/validation/reference/orbit.py.
    reference: { frequency: 1251.3070215199314, amplitude: 10.477117126762028, rms: 9.609790456974176, thd: 0.30209258357900254 },
  },
  {
    name: "a Wien clipped hard (gain 4.7, fast, rails ±12 V), accuracy=3e-5",
    text: wien("10k", "37k", "preset=fast rails=(-12, 12)"),
    accuracy: 3e-5,
    // scipy 1.17 solve_ivp Radau, rtol 1e-11, atol 1e-11 V, largest step T/1000, through test/validation/reference/orbit.py.
    reference: { frequency: 1263.69528467971, amplitude: 10.784673869505315, rms: 9.915078840396816, thd: 0.30573575593432806 },
  },
  {
    name: "a Wien held by an ideal op-amp's rails (gain 3.5, rails ±12 V), accuracy=1e-3: the frequency's bar for a first-order error at the corners",
    text: wien("10k", "25k", "preset=ideal rails=(-12, 12)"),
    accuracy: 1e-3,
    // scipy 1.17 solve_ivp Radau, rtol 1e-11, atol 1e-11 V, largest step T/1000, through test/validation/reference/orbit.py.
    reference: { frequency: 1496.5702475718003, amplitude: 12.00079302761441, rms: 10.06087629400638, thd: 0.16245411315380887 },
  },
];

describe("error bars on a Wien bridge clipped at the op-amp's rails", () => {
  for (const c of cases) {
    test(`${c.name}: every figure's bar covers its difference from scipy's orbit`, () => {
      const r = steadyOf(c.text, c.accuracy);
      expect(r.found).toBe(true);
      const bars = r.numericalError!;
      for (const figure of ["frequency", "amplitude", "rms", "thd"] as const) {
        expect(Math.abs(r[figure]! - c.reference[figure]), figure).toBeLessThanOrEqual(bars[figure]);
      }
    });
  }
});

describe("THD of a linear filter driven by a sine", () => {
  // Closed form: a linear circuit driven by a pure sine answers with that sine alone, THD 0 (the
  // op-amp without a slew limit and far inside its rails is linear).
  const sallenKey = `vsource V1 i gnd wave=sine amp=1 freq=1k
resistor R1 i a 10k
resistor R2 a p 10k
capacitor C1 a o 22n
capacitor C2 p gnd 10n
opamp U1 p o o preset=ideal rails=(-12, 12)
`;
  for (const accuracy of [undefined, 1e-5]) {
    test(`a unity-gain low-pass (accuracy ${accuracy ?? "default"}): the THD's bar reaches zero, the closed form`, () => {
      const r = steadyOf(sallenKey, accuracy);
      expect(r.thd!).toBeLessThanOrEqual(r.numericalError!.thd);
    });
  }
});

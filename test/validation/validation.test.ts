// The validation table (issue 18): oscillators whose settled frequency, amplitude, r.m.s. and THD
// were computed by an independent integrator from the same device equations — scipy's Radau,
// cross-checked with LSODA, on state equations written in Python (test/validation/reference/,
// values in references.json, method and sources in references.md; [np] in docs/references.md's
// marking). This file checks that those references stand for the circuits in the files;
// accuracy.test.ts checks Onset against them at default settings.
import { describe, expect, test } from "vitest";
import type { Circuit } from "@onset/core";
import { caseCircuit, validationCases, type TranscribedPart } from "./validation-cases.mjs";

const cases = validationCases();

function number(x: number | string): number {
  return x === "inf" ? Infinity : x === "-inf" ? -Infinity : (x as number);
}

/** The reference's transcription (references.json `parts`) against the project's own elaboration. */
function expectSameParts(transcribed: readonly TranscribedPart[], circuit: Circuit) {
  expect(circuit.parts.map((p) => p.name).sort()).toEqual(transcribed.map((p) => p.name).sort());
  for (const t of transcribed) {
    const p = circuit.parts.find((q) => q.name === t.name)!;
    expect(p.kind, t.name).toBe(t.kind);
    expect(p.nodes, t.name).toEqual(t.nodes);
    if (t.value !== null) expect(p.value, t.name).toBeCloseTo(t.value, 9);
    for (const [key, value] of Object.entries(t.options ?? {})) {
      // An op-amp without rails= has the schema's default rails (−15, 15) V.
      const given = key === "rails" && p.options.rails === undefined ? [-15, 15] : p.options[key];
      if (typeof value === "object") expect((given as number[]).map(Number), `${t.name}.${key}`).toEqual(value.map(number));
      else if (value === "inf" || value === "-inf" || typeof value === "number") expect(given, `${t.name}.${key}`).toBe(number(value));
      else expect(given, `${t.name}.${key}`).toBe(value);
    }
  }
}

describe("validation references (test/validation/references.json, [np] scipy Radau, cross-checked with LSODA)", () => {
  test("every case of cases.json has a reference", () => {
    expect(cases.filter((c) => c.reference === undefined).map((c) => c.name)).toEqual([]);
  });

  for (const c of cases) {
    test(`${c.name}: the reference models the circuit in ${c.file} (parts, nodes, values, device options)`, () => {
      expectSameParts(c.reference!.parts, caseCircuit(c.file));
    });

    test(`${c.name}: the reference orbit is settled and its cross-check agrees`, () => {
      const r = c.reference!;
      expect(r.settled).toBe(true);
      expect(r.crossCheck.settled).toBe(true);
      for (const metric of ["frequency", "amplitude", "rms"]) expect(Math.abs(r.crossCheck.relativeDifference[metric]!), metric).toBeLessThan(1e-8);
      for (const metric of ["thd10", "thd30"]) expect(Math.abs(r.crossCheck.relativeDifference[metric]!), metric).toBeLessThan(1e-6);
      // THD_F from the harmonics it lists (2 … 10 of 1 … 30).
      const h = r.harmonics;
      expect(Math.hypot(...h.slice(1, 10)) / h[0]!).toBeCloseTo(r.thd, 12);
      expect(Math.hypot(...h.slice(1, 30)) / h[0]!).toBeCloseTo(r.thd30, 12);
    });
  }
});

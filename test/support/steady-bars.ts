// The acceptance passes' common check: a steady orbit was found, and its frequency, amplitude and
// rms each lie within their printed error bars of an outside reference (each caller names it).
import { expect } from "vitest";
import type { SteadyResult } from "@onset/core";

export function expectFiguresWithinBars(r: SteadyResult, reference: { readonly frequency: number; readonly amplitude: number; readonly rms: number }): void {
  expect(r.found, r.explanation).toBe(true);
  const bars = r.numericalError!;
  expect(Math.abs(r.frequency! - reference.frequency)).toBeLessThanOrEqual(bars.frequency);
  expect(Math.abs(r.amplitude! - reference.amplitude)).toBeLessThanOrEqual(bars.amplitude);
  expect(Math.abs(r.rms! - reference.rms)).toBeLessThanOrEqual(bars.rms);
}

import type { AnalysisSpec, Circuit, OptionValue, PartSpec } from "@onset/core";

/** A part written as in the language: kind, name, nodes, optional value and options. */
export function part(kind: string, name: string, nodes: string[], value?: number, options: Record<string, OptionValue> = {}): PartSpec {
  return value === undefined ? { kind, name, nodes, options } : { kind, name, nodes, value, options };
}

export function circuit(parts: PartSpec[], analyses: AnalysisSpec[] = []): Circuit {
  return { parts, analyses, tolerances: [] };
}

/**
 * Value of a sampled signal at time `t` by the cubic through the four nearest samples
 * (Lagrange form); used to read a waveform between accepted points.
 */
export function sampleAt(time: ArrayLike<number>, values: ArrayLike<number>, t: number): number {
  let lo = 0;
  let hi = time.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (time[mid]! <= t) lo = mid;
    else hi = mid;
  }
  const start = Math.max(0, Math.min(time.length - 4, lo - 1));
  let sum = 0;
  for (let i = start; i < start + 4; i++) {
    let w = 1;
    for (let j = start; j < start + 4; j++) if (j !== i) w *= (t - time[j]!) / (time[i]! - time[j]!);
    sum += w * values[i]!;
  }
  return sum;
}

/**
 * The Wien network from output `o` to input `p`: series R1–C1 (through node s) and parallel
 * R2 ∥ C2 to gnd (docs/references.md §2.1).
 */
export function wienNetwork(v: { R1: number; R2: number; C1: number; C2: number }): PartSpec[] {
  return [
    part("resistor", "R1", ["o", "s"], v.R1),
    part("capacitor", "C1", ["s", "p"], v.C1),
    part("resistor", "R2", ["p", "gnd"], v.R2),
    part("capacitor", "C2", ["p", "gnd"], v.C2),
  ];
}

/** The C–R ladder of a phase-shift oscillator from `o` to node c (its last R is added by the caller). */
export function crLadder(R: number, C: number): PartSpec[] {
  return [
    part("capacitor", "C1", ["o", "a"], C),
    part("resistor", "R1", ["a", "gnd"], R),
    part("capacitor", "C2", ["a", "b"], C),
    part("resistor", "R2", ["b", "gnd"], R),
    part("capacitor", "C3", ["b", "c"], C),
  ];
}

/** A Wien bridge in the language, gain 3.3 (R = 10 kΩ, C = 10 nF: f₀ ≈ 1.59 kHz), diode-limited, ±12 V rails; no analyses. */
export const DIODE_WIEN_SOURCE = `param R = 10k
param C = 10n
resistor  R1 o s (R)±1%
capacitor C1 s p (C)±5%
resistor  R2 p gnd (R)±1%
capacitor C2 p gnd (C)±5%
resistor  Rg n gnd 10k
resistor  Rf n o 23k
diode     D1 n o
diode     D2 o n
opamp     U1 p n o preset=general rails=(-12, 12)
`;

import { opampPresets, type Circuit, type PartSpec } from "@onset/core";
import { buildSystem, probeReader, recordPeriod, TransientStepper, type MnaSystem, type PeriodStart, type ProbeReader } from "@onset/core/engine";
import { circuit, part, wienNetwork } from "../../support/circuits.js";

/** R = 1 k, C = 100 nF Wien bridge at gain A around a near-ideal amplifier clipping at ±10 V (docs/references.md §2.4). */
export function clippedWien(A: number): Circuit {
  const R = 1e3;
  const C = 100e-9;
  const parts: PartSpec[] = [
    ...wienNetwork({ R1: R, R2: R, C1: C, C2: C }),
    part("resistor", "Rf", ["o", "n"], (A - 1) * R),
    part("resistor", "Rg", ["n", "gnd"], R),
    part("opamp", "U1", ["p", "n", "o"], undefined, { ...opampPresets.ideal, knee: 1e-4, rails: [-10, 10] }),
  ];
  return circuit(parts);
}

/**
 * A settled run of a circuit started by a 10 mV step on a charged node, and one recorded period
 * of it (the shooting guess and the run's own grid), as the start-up analysis hands them over.
 */
export interface SettledPeriod {
  readonly system: MnaSystem;
  readonly guess: PeriodStart;
  readonly fractions: Float64Array;
  readonly trajectory: Float64Array[];
  readonly read: ProbeReader;
}

export function settledPeriod(c: Circuit, kickNode: string, period: number, until: number, maxStep = period / 100): SettledPeriod {
  const system = buildSystem(c);
  const rest = new TransientStepper(system, { start: "bias", maxStep });
  const x = Float64Array.from(rest.x);
  x[system.nodeIndex.get(kickNode)!] += 1e-2;
  const run = new TransientStepper(system, { start: { t: 0, x }, maxStep });
  run.advance(until);
  const recorded = recordPeriod(system, run.snapshot(), period, maxStep);
  return { system, ...recorded, read: probeReader(system, { kind: "node", node: "o" }) };
}

/**
 * A ladder-network oscillator (bench/ladder-oscillator.mjs, shared with the matrix-free bench): an
 * RC ladder of `sections` sections (values varied over 7- and 5-section cycles) turns the phase by
 * 180°, an inverting op-amp stage of gain 40 the other 180°, and two diode pairs across three
 * quarters of its feedback resistor bring the gain down to 10 as the amplitude grows.
 * sections + 11 unknowns.
 */
export { ladderOscillator } from "../../../bench/ladder-oscillator.mjs";

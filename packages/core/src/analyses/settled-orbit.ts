import type { Probe } from "../circuit/circuit.js";
import { isOnsetError } from "../circuit/diagnostic.js";
import type { MnaSystem } from "../solver/system.js";
import type { Tolerances } from "../solver/tolerances.js";
import { orbitPointLimit, recordPeriod, refineOrbit, type RefinedOrbit } from "../steady/refine.js";
import { isRunLimitError, RUN_LIMITS } from "./limits.js";
import { probeReader } from "./probes.js";
import type { TransientStepper } from "./stepper.js";

/** The orbit is found to within this fraction of the step control's relative accuracy. */
const ORBIT_SHARE = 1e-2;

/** Why the settled figures come from the run's last cycles instead of the periodic orbit. */
export interface OrbitFailure {
  readonly failure: string;
}

/** The settled orbit, and how many of the run's steps each step of its grid merges (1: none). */
export type SettledOrbit = RefinedOrbit & { readonly merged: number };

/**
 * The periodic steady state next to a settled run: one period of the run continued without its
 * noise (`quiet` is the circuit with the same unknowns and no excitation), refined by shooting
 * on the run's own grid and on it halved (see `refineOrbit`). A circuit driven by a periodic
 * source at the measured frequency has the drive's period; otherwise the period is an unknown.
 * When no orbit is found (the oscillation still drifts, or is not periodic) it says why. The
 * grid keeps its memory within `maxStoredPoints` values (see `orbitPointLimit`): a finer run
 * has its steps merged in twos, fours, … (`merged`).
 */
export function settledOrbit(
  quiet: MnaSystem,
  stepper: TransientStepper,
  probe: Probe,
  measured: { readonly period: number; readonly drive: number | undefined },
  maxStep: number,
  tolerances: Tolerances,
  maxOrder: number,
  check?: () => void,
  maxStoredPoints: number = RUN_LIMITS.maxStoredPoints,
): SettledOrbit | OrbitFailure {
  const period = measured.drive === undefined ? measured.period : 1 / measured.drive;
  try {
    const { guess, fractions, trajectory, merged } = recordPeriod(quiet, stepper.snapshot(), period, maxStep, tolerances, orbitPointLimit(maxStoredPoints, quiet.n));
    const refined = refineOrbit(quiet, guess, fractions, trajectory, probeReader(quiet, probe), maxOrder, {
      tolerances,
      autonomous: measured.drive === undefined,
      relative: ORBIT_SHARE * tolerances.lteRelative,
      corners: cornersWithin(quiet, guess.t0, period),
      ...(check ? { check } : {}),
    });
    return { ...refined, merged };
  } catch (error) {
    // A run limit stops the whole run, not just the refinement.
    if (!isOnsetError(error) || isRunLimitError(error)) throw error;
    return { failure: error.diagnostic.message };
  }
}

/** The sources' corners in [t₀, t₀ + T], as times after t₀. */
export function cornersWithin(system: MnaSystem, t0: number, period: number): number[] {
  const out: number[] = [];
  for (const s of system.sources) {
    for (let c = s.nextBreakpoint(t0 - 1e-9 * period); c <= t0 + period * (1 + 1e-9); c = s.nextBreakpoint(c)) out.push(c - t0);
  }
  return out;
}

export function isOrbitFailure(x: SettledOrbit | OrbitFailure): x is OrbitFailure {
  return "failure" in x;
}

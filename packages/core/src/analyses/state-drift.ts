import type { MnaSystem } from "../solver/system.js";
import { absoluteTolerances, type Tolerances } from "../solver/tolerances.js";
import { TransientStepper, type StepperSnapshot } from "./stepper.js";

/** The charged state that moves most over one period, and by what share of its largest magnitude. */
export interface StateDrift {
  /** Its probe name (a node, `L1.temperature`, …). */
  readonly label: string;
  /** The change of its mean from one period to the next, over its largest magnitude in them (floored at the step control's absolute tolerance). */
  readonly share: number;
}

/**
 * How far the charged states move over a period of the run continued without its noise
 * (`quiet`: the circuit with the same unknowns, no excitation): the change of each one's mean
 * from one period to the next, against its largest magnitude in them. Means, not x(T) − x(0): the
 * measured period is off by a little, which moves a steep state's end a lot and its mean only by
 * that fraction. A settled oscillation repeats (a share of the order of the step control's
 * accuracy); a swing clipped at a limit repeats at the probe while a slow state behind it — an
 * amplitude loop's detector still charging — moves on.
 */
export function largestStateDrift(quiet: MnaSystem, snapshot: StepperSnapshot, period: number, maxStep: number, tolerances: Tolerances): StateDrift {
  const columns = quiet.stateColumns;
  const floor = absoluteTolerances(quiet.unknowns, tolerances, "lte");
  const peak = Float64Array.from(columns, (j) => Math.max(Math.abs(snapshot.x[j]!), floor[j]!));
  // Each state's integral over the first and the second period (trapezoids on the accepted steps).
  const area = [new Float64Array(columns.length), new Float64Array(columns.length)];
  const previous = Float64Array.from(columns, (j) => snapshot.x[j]!);
  let tPrevious = snapshot.t;
  const seam = snapshot.t + period;
  const stepper = new TransientStepper(quiet, { start: snapshot, maxStep, tolerances });
  stepper.observe((t, x) => {
    const into = t <= seam ? area[0]! : area[1]!;
    for (let k = 0; k < columns.length; k++) {
      const v = x[columns[k]!]!;
      peak[k] = Math.max(peak[k]!, Math.abs(v));
      into[k] = into[k]! + 0.5 * (v + previous[k]!) * (t - tPrevious);
      previous[k] = v;
    }
    tPrevious = t;
  });
  stepper.advance(seam);
  stepper.advance(seam + period);
  let largest: StateDrift = { label: "", share: 0 };
  for (let k = 0; k < columns.length; k++) {
    const share = Math.abs(area[1]![k]! - area[0]![k]!) / period / peak[k]!;
    if (share > largest.share) largest = { label: quiet.unknowns[columns[k]!]!.label, share };
  }
  return largest;
}

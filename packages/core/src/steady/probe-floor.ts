import { QUANTITIES, type QuantityUnit } from "../solver/quantities.js";
import type { Tolerances } from "../solver/tolerances.js";

/** The step control's absolute tolerance on a probe of `unit` (1 µV, 1 nA, … at the defaults). */
export function probeFloor(unit: QuantityUnit, tolerances: Tolerances): number {
  for (const q of Object.values(QUANTITIES)) if (q.unit === unit) return tolerances[q.lte];
  return 0;
}

import type { MnaSystem } from "../solver/system.js";
import { Linearisation } from "../solver/linearisation.js";

/** The small-signal matrices of a circuit at an operating point: G + s·C. */
export interface SmallSignal {
  readonly n: number;
  /** Row-major n×n: G + ∂f/∂x at the operating point. */
  readonly G: Float64Array;
  /** Row-major n×n: C + ∂q/∂x at the operating point. */
  readonly C: Float64Array;
}

/**
 * Linearises every part at `x`: an op-amp becomes its single-pole small-signal model (the clamp
 * and slew terms contribute their slopes, which vanish inside the limits), a diode its
 * small-signal conductance and junction capacitance. The circuit is taken fully powered.
 */
export function linearize(system: MnaSystem, x: Float64Array): SmallSignal {
  const { n, G, C } = new Linearisation(system).at(x);
  return { n, G, C };
}

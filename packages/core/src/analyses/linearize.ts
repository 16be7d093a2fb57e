import type { NonlinearLoad } from "../devices/device.js";
import type { MnaSystem } from "../solver/system.js";

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
  const n = system.n;
  const G = Float64Array.from(system.G);
  const C = Float64Array.from(system.C);
  const load: NonlinearLoad = {
    addF() {},
    adddF(row, col, value) {
      if (row >= 0 && col >= 0) G[row * n + col] += value;
    },
    addQ() {},
    adddQ(row, col, value) {
      if (row >= 0 && col >= 0) C[row * n + col] += value;
    },
  };
  for (const device of system.nonlinear) device.load(x, load, Infinity);
  return { n, G, C };
}

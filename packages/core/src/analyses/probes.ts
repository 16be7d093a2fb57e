import type { Probe } from "../circuit/circuit.js";
import { GROUND, probeName } from "../circuit/circuit.js";
import { inputError } from "../circuit/diagnostic.js";
import type { QuantityUnit } from "../solver/quantities.js";
import { didYouMean } from "../circuit/suggest.js";
import type { MnaSystem } from "../solver/system.js";

/** Reads a probe's value from the unknowns `x`, their rates `dxdt`, at time `t`. */
export type ProbeReader = (x: Float64Array, dxdt: Float64Array, t: number) => number;

function nodeReader(system: MnaSystem, node: string, probe: Probe): (x: Float64Array) => number {
  if (node === GROUND) return () => 0;
  const i = system.stateIndex.get(node);
  if (i === undefined) {
    throw inputError("unknown-node", `probe '${probeName(probe)}' names unknown node '${node}'${didYouMean(node, system.nodeIndex.keys())}`);
  }
  return (x) => x[i]!;
}

/** The index of a part's internal state in the unknowns. */
export function stateIndexOf(system: MnaSystem, probe: Extract<Probe, { kind: "state" }>): number {
  const i = system.stateIndex.get(probeName(probe));
  if (i === undefined) {
    throw inputError("unknown-state", `probe '${probeName(probe)}': part '${probe.part}' has no state '${probe.state}' in this circuit`);
  }
  return i;
}

/** The unit a probe's values are in (SI base units): volts, amperes, kelvin. */
export function probeUnit(system: MnaSystem, probe: Probe): QuantityUnit {
  switch (probe.kind) {
    case "node":
    case "difference":
      return "V";
    case "current":
      return "A";
    case "state":
      return system.unknowns[stateIndexOf(system, probe)]!.unit;
  }
}

/** A function that reads a probe's value (a node voltage, a difference, a part's current or internal state) from the unknowns. */
export function probeReader(system: MnaSystem, probe: Probe): ProbeReader {
  switch (probe.kind) {
    case "node": {
      const read = nodeReader(system, probe.node, probe);
      return (x) => read(x);
    }
    case "difference": {
      const plus = nodeReader(system, probe.plus, probe);
      const minus = nodeReader(system, probe.minus, probe);
      return (x) => plus(x) - minus(x);
    }
    case "current": {
      const device = system.deviceByName.get(probe.part);
      if (!device?.current) {
        const withCurrent = [...system.deviceByName].flatMap(([name, d]) => (d.current ? [name] : []));
        throw inputError("unknown-part", `probe '${probeName(probe)}': no part '${probe.part}' with a current${didYouMean(probe.part, withCurrent)}`);
      }
      const current = device.current.bind(device);
      return (x, dxdt, t) => current(x, dxdt, t);
    }
    case "state": {
      const i = stateIndexOf(system, probe);
      return (x) => x[i]!;
    }
  }
}

/** Every node of the system as a probe, in unknown order. */
export function allNodeProbes(system: MnaSystem): Probe[] {
  return system.unknowns.filter((u) => u.isNode).map((u) => ({ kind: "node", node: u.label }) as const);
}

/** A probe's small-signal weights: its change per unit change of each unknown and of each rate. */
export interface ProbeWeights {
  readonly value: Float64Array;
  readonly rate: Float64Array;
}

/**
 * The probe linearised at the operating point x (rates 0): central differences of its reader,
 * exact for a node, a difference and the current of a linear part.
 */
export function probeWeights(system: MnaSystem, probe: Probe, x: Float64Array): ProbeWeights {
  const read = probeReader(system, probe);
  const n = system.n;
  const value = new Float64Array(n);
  const rate = new Float64Array(n);
  const at = Float64Array.from(x);
  const rates = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const h = 1e-6 * Math.max(1, Math.abs(x[i]!));
    at[i] = x[i]! + h;
    const up = read(at, rates, 0);
    at[i] = x[i]! - h;
    const down = read(at, rates, 0);
    at[i] = x[i]!;
    value[i] = (up - down) / (2 * h);
    rates[i] = h;
    const rateUp = read(at, rates, 0);
    rates[i] = -h;
    const rateDown = read(at, rates, 0);
    rates[i] = 0;
    rate[i] = (rateUp - rateDown) / (2 * h);
  }
  return { value, rate };
}

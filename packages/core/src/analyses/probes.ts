import type { Probe } from "../circuit/circuit.js";
import { GROUND, probeName } from "../circuit/circuit.js";
import { inputError } from "../circuit/diagnostic.js";
import type { MnaSystem } from "../solver/system.js";

/** Reads a probe's value from the unknowns `x`, their rates `dxdt`, at time `t`. */
export type ProbeReader = (x: Float64Array, dxdt: Float64Array, t: number) => number;

function nodeReader(system: MnaSystem, node: string, probe: Probe): (x: Float64Array) => number {
  if (node === GROUND) return () => 0;
  const i = system.nodeIndex.get(node);
  if (i === undefined) {
    throw inputError("unknown-node", `probe '${probeName(probe)}' names unknown node '${node}'`);
  }
  return (x) => x[i]!;
}

/** A function that reads a probe's value (a node voltage, a difference or a part's current) from the unknowns. */
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
        throw inputError("unknown-part", `probe '${probeName(probe)}': no part '${probe.part}' with a current`);
      }
      const current = device.current.bind(device);
      return (x, dxdt, t) => current(x, dxdt, t);
    }
  }
}

/** Every node of the system as a probe, in unknown order. */
export function allNodeProbes(system: MnaSystem): Probe[] {
  return system.unknowns.filter((u) => u.isNode).map((u) => ({ kind: "node", node: u.label }) as const);
}

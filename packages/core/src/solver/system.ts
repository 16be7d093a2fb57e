import type { Circuit, PartSpec } from "../circuit/circuit.js";
import { GROUND } from "../circuit/circuit.js";
import { inputError, isOnsetError } from "../circuit/diagnostic.js";
import { didYouMean } from "../circuit/suggest.js";
import type { Device, LinearStamp, NonlinearTerm, PowerOn, SourceTerm, UnknownKind } from "../devices/device.js";
import { deviceModels } from "../devices/registry.js";
import { nodesOfPart } from "../circuit/topology.js";

export interface UnknownInfo {
  /** Node name, or `PART.i` / `PART.pole` for branch currents and internal states. */
  readonly label: string;
  readonly kind: UnknownKind;
  /** True for node voltages (rows that are KCL equations). */
  readonly isNode: boolean;
  readonly backwardEuler: boolean;
}

/** Sparse list of (row, col, value) entries. */
export interface Triplets {
  readonly rows: Int32Array;
  readonly cols: Int32Array;
  readonly values: Float64Array;
}

/**
 * The assembled MNA description of a circuit: the unknown layout, the constant G and C
 * matrices (dense for factoring, triplets for products), and the sources and nonlinear devices
 * that contribute per time point.
 */
export interface MnaSystem {
  readonly n: number;
  readonly unknowns: readonly UnknownInfo[];
  readonly nodeIndex: ReadonlyMap<string, number>;
  readonly devices: readonly Device[];
  readonly deviceByName: ReadonlyMap<string, Device>;
  readonly sources: readonly SourceTerm[];
  readonly nonlinear: readonly NonlinearTerm[];
  /** The nonlinear devices that watch their own change per step (see `NonlinearTerm.changeRatio`). */
  readonly changeWatchers: readonly NonlinearTerm[];
  /** Row-major n×n. */
  readonly G: Float64Array;
  readonly C: Float64Array;
  readonly gTriplets: Triplets;
  readonly cTriplets: Triplets;
  /** 1 where the row's charge is integrated with backward Euler at every step. */
  readonly backwardEulerRows: Uint8Array;
  /** Unknowns whose local truncation error steers the step: columns of C outside BE rows. */
  readonly stateColumns: Int32Array;
}

function toTriplets(dense: Float64Array, n: number): Triplets {
  let count = 0;
  for (let i = 0; i < n * n; i++) if (dense[i] !== 0) count++;
  const rows = new Int32Array(count);
  const cols = new Int32Array(count);
  const values = new Float64Array(count);
  let k = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const v = dense[i * n + j]!;
      if (v === 0) continue;
      rows[k] = i;
      cols[k] = j;
      values[k++] = v;
    }
  }
  return { rows, cols, values };
}

/** How the circuit is set up for a run. */
export interface BuildOptions {
  /** Start from the unpowered circuit: DC levels and fixed rails ramp up (see `PowerOn`). */
  readonly powerOn?: PowerOn;
}

/** Places every part of the circuit in one unknown vector and stamps the constant matrices. */
export function buildSystem(circuit: Circuit, extraParts: readonly PartSpec[] = [], options: BuildOptions = {}): MnaSystem {
  const parts = [...circuit.parts, ...extraParts];
  const nodeIndex = new Map<string, number>();
  const unknowns: UnknownInfo[] = [];
  for (const part of parts) {
    for (const node of nodesOfPart(part)) {
      if (node === GROUND || nodeIndex.has(node)) continue;
      nodeIndex.set(node, unknowns.length);
      unknowns.push({ label: node, kind: "voltage", isNode: true, backwardEuler: false });
    }
  }
  const devices: Device[] = [];
  const deviceByName = new Map<string, Device>();
  for (const part of parts) {
    const model = deviceModels[part.kind];
    if (!model) {
      throw inputError("unknown-kind", `unknown part kind '${part.kind}' (${part.name})${didYouMean(part.kind, Object.keys(deviceModels))}`, { span: part.span });
    }
    try {
      model.validate?.(part);
      const device = model.create(part, {
        node(name) {
          if (name === GROUND) return -1;
          const i = nodeIndex.get(name);
          if (i === undefined) throw inputError("unknown-node", `${part.kind} ${part.name}: unknown node '${name}'${didYouMean(name, nodeIndex.keys())}`, { span: part.span });
          return i;
        },
        addUnknown(label, kind, unknownOptions) {
          unknowns.push({ label, kind, isNode: false, backwardEuler: unknownOptions?.backwardEuler ?? false });
          return unknowns.length - 1;
        },
        ...(options.powerOn ? { powerOn: options.powerOn } : {}),
      });
      devices.push(device);
      deviceByName.set(part.name, device);
    } catch (error) {
      if (isOnsetError(error) && !error.diagnostic.span && part.span) {
        throw inputError(error.diagnostic.code, error.diagnostic.message, { ...error.diagnostic, span: part.span });
      }
      throw error;
    }
  }
  const n = unknowns.length;
  const G = new Float64Array(n * n);
  const C = new Float64Array(n * n);
  const stamp: LinearStamp = {
    addG(row, col, value) {
      if (row >= 0 && col >= 0) G[row * n + col] += value;
    },
    addC(row, col, value) {
      if (row >= 0 && col >= 0) C[row * n + col] += value;
    },
  };
  for (const device of devices) device.stampLinear?.(stamp);
  const backwardEulerRows = new Uint8Array(n);
  unknowns.forEach((u, i) => {
    if (u.backwardEuler) backwardEulerRows[i] = 1;
  });
  const states: number[] = [];
  for (let j = 0; j < n; j++) {
    if (backwardEulerRows[j]) continue;
    for (let i = 0; i < n; i++) {
      if (C[i * n + j] !== 0 && !backwardEulerRows[i]) {
        states.push(j);
        break;
      }
    }
  }
  return {
    n,
    unknowns,
    nodeIndex,
    devices,
    deviceByName,
    sources: devices.flatMap((d) => (d.source ? [d.source] : [])),
    nonlinear: devices.flatMap((d) => (d.nonlinear ? [d.nonlinear] : [])),
    changeWatchers: devices.flatMap((d) => (d.nonlinear?.changeRatio ? [d.nonlinear] : [])),
    G,
    C,
    gTriplets: toTriplets(G, n),
    cTriplets: toTriplets(C, n),
    backwardEulerRows,
    stateColumns: Int32Array.from(states),
  };
}

/** The same system with further excitations (a noise bank built from its devices). */
export function withSources(system: MnaSystem, sources: readonly SourceTerm[]): MnaSystem {
  return { ...system, sources: [...system.sources, ...sources] };
}

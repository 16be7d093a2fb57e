import type { Circuit, PartSpec } from "../circuit/circuit.js";
import { GROUND } from "../circuit/circuit.js";
import { inputError, isOnsetError } from "../circuit/diagnostic.js";
import { didYouMean } from "../circuit/suggest.js";
import type { Device, LinearStamp, NonlinearTerm, PowerOn, SourceTerm, UnknownRole as UnknownRoleOfPart } from "../devices/device.js";
import { deviceModels } from "../devices/registry.js";
import { nodesOfPart } from "../circuit/topology.js";
import { unitOf, type Quantity, type QuantityUnit } from "./quantities.js";

/** Where an unknown comes from: a node's voltage, a branch current, or a state inside a part. */
export type UnknownRole = "node" | UnknownRoleOfPart;

/**
 * One row of the state table: what an unknown is, in what unit it is reported, how it is
 * integrated and whether its truncation error steers the step.
 */
export interface UnknownInfo {
  /** Its probe name: the node name, or `PART.i` / `PART.pole` / `PART.junction`. */
  readonly label: string;
  readonly role: UnknownRole;
  /** The physical quantity (decides the unit and the absolute tolerances). */
  readonly quantity: Quantity;
  readonly unit: QuantityUnit;
  /** True for node voltages (rows that are KCL equations). */
  readonly isNode: boolean;
  /** Its own charge row is integrated by an L-stable formula at every step (see `UnknownOptions.stiff`). */
  readonly stiff: boolean;
  /**
   * Some charge, linear or nonlinear, depends on it, so its local truncation error is estimated
   * and steers the step.
   */
  readonly errorControl: boolean;
}

/** Sparse list of (row, col, value) entries. */
export interface Triplets {
  readonly rows: Int32Array;
  readonly cols: Int32Array;
  readonly values: Float64Array;
}

/**
 * The assembled MNA description of a circuit: the unknown layout, the constant G and C
 * matrices (as triplets, and dense on demand), and the sources and nonlinear devices
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
  /**
   * Row-major n×n, built on first read for the analyses that work dense (small-signal,
   * periodic); the transient path reads only the triplets.
   */
  readonly G: Float64Array;
  readonly C: Float64Array;
  readonly gTriplets: Triplets;
  readonly cTriplets: Triplets;
  /** 1 where the row's charge is integrated with an L-stable formula at every step. */
  readonly stiffRows: Uint8Array;
  /** Unknowns whose local truncation error steers the step (`errorControl`), in order. */
  readonly stateColumns: Int32Array;
  /** Per state column: 1 when an L-stable row's charge depends on it (its error follows that formula). */
  readonly stiffStates: Uint8Array;
  /** 1 on rows that carry a charge (a linear C entry or a declared nonlinear charge); 0 on algebraic rows. */
  readonly chargedRows: Uint8Array;
  /** Every probe name of an unknown (labels and aliases) and its index. */
  readonly stateIndex: ReadonlyMap<string, number>;
}

/** The dense G and C once built; both keys are there from the start, so the holder keeps one shape. */
interface DenseMatrices {
  G: Float64Array | undefined;
  C: Float64Array | undefined;
}

/** A system's fields but the dense matrices. */
type SystemFields = Omit<MnaSystem, "G" | "C">;

function fieldsOf(s: SystemFields): SystemFields {
  return {
    n: s.n,
    unknowns: s.unknowns,
    nodeIndex: s.nodeIndex,
    devices: s.devices,
    deviceByName: s.deviceByName,
    sources: s.sources,
    nonlinear: s.nonlinear,
    changeWatchers: s.changeWatchers,
    gTriplets: s.gTriplets,
    cTriplets: s.cTriplets,
    stiffRows: s.stiffRows,
    stateColumns: s.stateColumns,
    stiffStates: s.stiffStates,
    chargedRows: s.chargedRows,
    stateIndex: s.stateIndex,
  };
}

/**
 * A class, so that every system has one shape and the hot loop reads its fields through one
 * map: an object literal with getters is kept as a dictionary, and a copy of it took another shape.
 * The fields are set in `fieldsOf`'s order, whatever the order of the object given.
 */
interface AssembledSystem extends SystemFields {}
class AssembledSystem implements MnaSystem {
  constructor(
    f: SystemFields,
    readonly dense: DenseMatrices,
  ) {
    Object.assign(this, fieldsOf(f));
  }

  get G(): Float64Array {
    return (this.dense.G ??= denseOf(this.gTriplets, this.n));
  }

  get C(): Float64Array {
    return (this.dense.C ??= denseOf(this.cTriplets, this.n));
  }
}

/** Sums stamped values per position, without n×n storage. */
class TripletSum {
  private readonly at = new Map<number, number>();
  private readonly keys: number[] = [];
  private readonly sums: number[] = [];

  constructor(private readonly n: number) {}

  add(row: number, col: number, value: number): void {
    const key = row * this.n + col;
    const k = this.at.get(key);
    if (k === undefined) {
      this.at.set(key, this.keys.length);
      this.keys.push(key);
      this.sums.push(value);
    } else {
      this.sums[k] += value;
    }
  }

  /** The nonzero sums in row-major order. */
  triplets(): Triplets {
    const order = this.keys.map((_, k) => k).filter((k) => this.sums[k] !== 0);
    order.sort((p, q) => this.keys[p]! - this.keys[q]!);
    return {
      rows: Int32Array.from(order, (k) => Math.floor(this.keys[k]! / this.n)),
      cols: Int32Array.from(order, (k) => this.keys[k]! % this.n),
      values: Float64Array.from(order, (k) => this.sums[k]!),
    };
  }
}

/** The row-major n×n matrix of some triplets. */
export function denseOf(t: Triplets, n: number): Float64Array {
  const dense = new Float64Array(n * n);
  for (let k = 0; k < t.rows.length; k++) dense[t.rows[k]! * n + t.cols[k]!] = t.values[k]!;
  return dense;
}

/** An unknown as allocated, before the charges decide its error control. */
type Allocated = Omit<UnknownInfo, "errorControl">;

/**
 * Which unknowns some charge depends on (the linear C and the devices' declared nonlinear
 * charges): 1 on a trapezoidal row's charge, 2 on an L-stable row's (whose formula has the
 * larger error constant, so it decides where both apply), 0 for algebraic unknowns.
 */
function chargeDependence(n: number, C: Triplets, declared: readonly (readonly [number, number])[], stiff: Uint8Array): Uint8Array {
  const judged = new Uint8Array(n);
  const mark = (row: number, col: number) => {
    judged[col] = Math.max(judged[col]!, stiff[row] ? 2 : 1);
  };
  for (let k = 0; k < C.rows.length; k++) mark(C.rows[k]!, C.cols[k]!);
  for (const [row, col] of declared) mark(row, col);
  return judged;
}

function chargedRowsOf(n: number, C: Triplets, declared: readonly (readonly [number, number])[]): Uint8Array {
  const charged = new Uint8Array(n);
  for (let k = 0; k < C.rows.length; k++) charged[C.rows[k]!] = 1;
  for (const [row] of declared) charged[row] = 1;
  return charged;
}

/** How the circuit is set up for a run. */
export interface BuildOptions {
  /** Start from the unpowered circuit: DC levels and fixed rails ramp up (see `PowerOn`). */
  readonly powerOn?: PowerOn;
  /** The ambient temperature (K) of self-heated parts (lamps, thermistors); default {@link DEFAULT_AMBIENT}. */
  readonly ambient?: number;
}

/** 27 °C in kelvin: the ambient when an analysis names no temperature. */
export const DEFAULT_AMBIENT = 300.15;

/** Places every part of the circuit in one unknown vector and stamps the constant matrices. */
export function buildSystem(circuit: Circuit, extraParts: readonly PartSpec[] = [], options: BuildOptions = {}): MnaSystem {
  const parts = [...circuit.parts, ...extraParts];
  const nodeIndex = new Map<string, number>();
  const stateIndex = new Map<string, number>();
  const allocated: Allocated[] = [];
  const declared: [number, number][] = [];
  for (const part of parts) {
    for (const node of nodesOfPart(part)) {
      if (node === GROUND || nodeIndex.has(node)) continue;
      nodeIndex.set(node, allocated.length);
      stateIndex.set(node, allocated.length);
      allocated.push({ label: node, role: "node", quantity: "voltage", unit: "V", isNode: true, stiff: false });
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
        addUnknown(label, quantity, options) {
          stateIndex.set(label, allocated.length);
          allocated.push({ label, role: options?.role ?? "internal", quantity, unit: unitOf(quantity), isNode: false, stiff: options?.stiff ?? false });
          return allocated.length - 1;
        },
        alias(label, index) {
          if (index >= 0) stateIndex.set(label, index);
        },
        declareCharge(row, cols) {
          if (row < 0) return;
          for (const col of cols) if (col >= 0) declared.push([row, col]);
        },
        ...(options.powerOn ? { powerOn: options.powerOn } : {}),
        ambient: options.ambient ?? DEFAULT_AMBIENT,
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
  const n = allocated.length;
  const gSum = new TripletSum(n);
  const cSum = new TripletSum(n);
  const stamp: LinearStamp = {
    addG(row, col, value) {
      if (row >= 0 && col >= 0) gSum.add(row, col, value);
    },
    addC(row, col, value) {
      if (row >= 0 && col >= 0) cSum.add(row, col, value);
    },
  };
  for (const device of devices) device.stampLinear?.(stamp);
  const gTriplets = gSum.triplets();
  const cTriplets = cSum.triplets();
  const stiffRows = Uint8Array.from(allocated, (u) => (u.stiff ? 1 : 0));
  const judged = chargeDependence(n, cTriplets, declared, stiffRows);
  const unknowns: UnknownInfo[] = allocated.map((u, j) => ({ ...u, errorControl: judged[j]! > 0 }));
  const states: number[] = [];
  for (let j = 0; j < n; j++) if (judged[j]) states.push(j);
  return new AssembledSystem(
    {
      n,
      unknowns,
      nodeIndex,
      devices,
      deviceByName,
      sources: devices.flatMap((d) => (d.source ? [d.source] : [])),
      nonlinear: devices.flatMap((d) => (d.nonlinear ? [d.nonlinear] : [])),
      changeWatchers: devices.flatMap((d) => (d.nonlinear?.changeRatio ? [d.nonlinear] : [])),
      gTriplets,
      cTriplets,
      stiffRows,
      stateColumns: Int32Array.from(states),
      stiffStates: Uint8Array.from(states, (j) => (judged[j] === 2 ? 1 : 0)),
      chargedRows: chargedRowsOf(n, cTriplets, declared),
      stateIndex,
    },
    { G: undefined, C: undefined },
  );
}

/** The same system with further excitations (a noise bank built from its devices). */
export function withSources(system: MnaSystem, sources: readonly SourceTerm[]): MnaSystem {
  const fields = { ...fieldsOf(system), sources: [...system.sources, ...sources] };
  // The dense G and C are shared with the original, built once by whichever reads them first.
  return new AssembledSystem(fields, system instanceof AssembledSystem ? system.dense : { G: undefined, C: undefined });
}

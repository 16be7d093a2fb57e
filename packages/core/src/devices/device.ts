import type { PartSpec } from "../circuit/circuit.js";
import type { PartKindSchema } from "../circuit/schema.js";
import type { Quantity } from "../solver/quantities.js";

/** What an unknown of the MNA vector measures: it decides its unit and tolerances. */
export type UnknownKind = Quantity;

/** Where an extra unknown comes from: a branch current of an ideal element, or a state inside a part. */
export type UnknownRole = "branch" | "internal";

export interface UnknownOptions {
  /** `branch` for the current of a voltage-defining element; default `internal`. */
  readonly role?: UnknownRole;
  /**
   * Integrate this unknown's own charge row with an L-stable formula even between breakpoints.
   * For internal states whose closed-loop time constant is far below the step (an op-amp's
   * pole node), where the trapezoidal rule would leave an undamped, sign-alternating error
   * (A-stable but not L-stable, docs/references.md §3).
   */
  readonly stiff?: boolean;
}

/**
 * The circuit switched on at t = 0: every DC level of every source, and the fixed rails of
 * op-amps without supply pins, rise linearly from 0 to their value over `ramp` seconds.
 */
export interface PowerOn {
  readonly ramp: number;
}

/** The fraction of its final value a ramped DC level has reached at time t. */
export function powerOnLevel(powerOn: PowerOn, t: number): number {
  return t <= 0 ? 0 : t >= powerOn.ramp ? 1 : t / powerOn.ramp;
}

/** Handed to a device factory: resolves nodes and allocates extra unknowns. */
export interface SetupContext {
  /** Index of a node in the unknown vector; -1 for ground. */
  node(name: string): number;
  /**
   * Allocates an extra unknown (a branch current or an internal state). `label` is its probe
   * name, `PART.state` (`U1.pole`, `L1.i`); states a user may probe are listed in the schema.
   */
  addUnknown(label: string, quantity: UnknownKind, options?: UnknownOptions): number;
  /** Gives an existing unknown a second probe name (a diode without series resistance: its junction is its anode). */
  alias(label: string, index: number): void;
  /**
   * Declares that the nonlinear charge the device adds to `row` depends on the unknowns `cols`
   * (every `adddQ(row, col)` it may stamp). Step control judges every unknown that any charge,
   * linear or nonlinear, depends on.
   */
  declareCharge(row: number, cols: readonly number[]): void;
  /** Set when the run starts from the unpowered circuit (`startup kick=power-on`). */
  readonly powerOn?: PowerOn;
  /** The ambient temperature (K) self-heated parts cool to: the analysis temperature, 27 °C unless written. */
  readonly ambient: number;
}

/**
 * One independent noise generator of a part, described by its small-signal injection: its level
 * x(t) (a current in A, or an input voltage in V) adds gain·x to excitation row `to` and
 * subtracts it from row `from` (-1: none). For a current source between two nodes the gain is
 * 1 (it leaves `from` and enters `to`); for a voltage in series with a branch it is 1 on the
 * branch row; an op-amp's input noise voltage enters its pole row through the input stage's
 * transconductance.
 */
export interface NoiseGenerator {
  /** Names the generator's random stream under the seed: `R1`, `P1.end1`, `D1.series`, `U1.input`. */
  readonly name: string;
  /** One-sided spectral density of x (A²/Hz for a current, V²/Hz for a voltage). */
  readonly density: number;
  readonly from: number;
  readonly to: number;
  readonly gain: number;
}

/** Accumulates the constant (linear) parts of G and C. Indices of -1 (ground) are ignored. */
export interface LinearStamp {
  addG(row: number, col: number, value: number): void;
  addC(row: number, col: number, value: number): void;
}

/**
 * Accumulates a nonlinear device's contribution at one Newton iterate: currents `f(x)` and
 * charges `q(x)` per row, and their derivatives. Devices stamp the derivatives on every
 * iterate; the solver decides from them whether its factorisation is still good enough.
 */
export interface NonlinearLoad {
  /** Adds to the residual row (a current for node rows, a voltage for branch rows). */
  addF(row: number, value: number): void;
  /** Adds ∂f_row/∂x_col. */
  adddF(row: number, col: number, value: number): void;
  /** Adds a charge (or flux) to a row. */
  addQ(row: number, value: number): void;
  /** Adds ∂q_row/∂x_col. */
  adddQ(row: number, col: number, value: number): void;
}

/** An independent excitation: adds its value at time `t` to the source vector. */
export interface SourceTerm {
  /**
   * Adds the source's contribution to `u` (rows of the excitation vector), scaled by `scale`
   * (source stepping). `left` asks for the value just before `t` when `t` is an edge.
   */
  addSource(t: number, scale: number, u: Float64Array, left: boolean): void;
  /** The first time strictly after `t` where the waveform has a corner, or Infinity. */
  nextBreakpoint(t: number): number;
  /** After this time the source adds nothing (a start-up kick that has ended); default never. */
  readonly quietAfter?: number;
}

/** A device whose equations depend nonlinearly on the unknowns. */
export interface NonlinearTerm {
  /**
   * Adds f(x), q(x) and, when asked, their Jacobians, at time `t` (only devices with a ramped
   * supply depend on it; small-signal analyses pass Infinity: the circuit fully powered).
   */
  load(x: Float64Array, out: NonlinearLoad, t: number): void;
  /**
   * Voltage-limiting hook: the largest fraction λ ∈ (0, 1] of the Newton update `dx` from `x`
   * that keeps this device in a region where its linearisation is trustworthy.
   */
  limitStep?(x: Float64Array, dx: Float64Array): number;
  /**
   * Whether the device's tangents at `x` still describe it at x + dx (its derivatives change by
   * no more than a tenth or so). The Newton core does not accept a solve on an update a device
   * does not trust, however small: near a steep, curved characteristic (a clamp's knee) a tiny
   * update can hide a large residual. Only when every nonlinear device has this hook does the
   * core also accept an iterate after a single update by the last solve's contraction.
   */
  tangentHolds?(x: Float64Array, dx: Float64Array): boolean;
  /**
   * Step-control hook for a state whose sudden jumps the truncation-error estimate may miss (an
   * algebraic pole node, gbw=inf): how much of the largest change one time step may make, from
   * `x` to the candidate `xNew`, the candidate makes (above 1: the step is retried shorter).
   */
  changeRatio?(x: Float64Array, xNew: Float64Array): number;
}

/** A part once placed in the unknown vector. */
export interface Device {
  readonly part: PartSpec;
  stampLinear?(stamp: LinearStamp): void;
  readonly source?: SourceTerm;
  readonly nonlinear?: NonlinearTerm;
  /**
   * Charges of the device's rows at the start of a run from rest (`initial=` on capacitors and
   * inductors); the default is zero.
   */
  initialCharge?(q: Float64Array): void;
  /**
   * Writes the part's unknowns that are not zero at rest (a self-heated body's temperature: its
   * ambient), where the bias point's Newton iteration starts; the default leaves them at zero.
   */
  restingState?(x: Float64Array): void;
  /** The part's current (pin 1 → pin 2 through the part) at time t, given the unknowns and their rates. */
  current?(x: Float64Array, dxdt: Float64Array, t: number): number;
  /** The part's own noise at an absolute temperature (K): thermal noise of its resistances, an op-amp's input noise. */
  noise?(kelvin: number): readonly NoiseGenerator[];
  /**
   * For a limiting amplifier: the unknown that its limits confine (an op-amp's pole node) and
   * the range (low, high) it is confined to at operating point x, fully powered.
   */
  outputLimits?(x: Float64Array): { readonly state: number; readonly low: number; readonly high: number };
}

/** Which pins conduct at DC and which pins an ideal voltage constraint ties together. */
export interface PartTopology {
  /** Pairs of nodes joined by a DC path through the part (`gnd` allowed). */
  readonly conducting: ReadonlyArray<readonly [string, string]>;
  /** Pairs of nodes whose voltage difference the part fixes (sources, VCVS outputs, bare inductors). */
  readonly voltageDefined: ReadonlyArray<readonly [string, string]>;
}

/** Everything the engine and the language know about one part kind. */
export interface DeviceModel {
  readonly schema: PartKindSchema;
  /** Part names and option values have been validated against the schema by the caller. */
  create(part: PartSpec, setup: SetupContext): Device;
  topology(part: PartSpec): PartTopology;
  /** Checks the values the schema cannot express (e.g. cross-option rules); throws OnsetError. */
  validate?(part: PartSpec): void;
}

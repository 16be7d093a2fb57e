import type { PartSpec } from "../circuit/circuit.js";
import type { Device, NonlinearLoad, NonlinearTerm, SetupContext } from "./device.js";
import { stampNonlinearBranch, valueAt } from "./stamps.js";
import { thermalCurrent } from "./thermal-noise.js";

/** The conductance of a temperature-dependent resistor and its slope in temperature. */
export interface ConductanceState {
  /** S */
  conductance: number;
  /** S/K */
  slope: number;
}

/** A resistance law R(T): writes 1/R and d(1/R)/dT at absolute temperature `kelvin` into `out`. */
export interface ResistanceLaw {
  conductanceAt(kelvin: number, out: ConductanceState): void;
}

/** A body heated by its own dissipation: first-order thermal network to the ambient. */
export interface ThermalNetwork {
  /** Thermal resistance to the ambient (K/W). */
  readonly resistance: number;
  /** Heat capacity (J/K). */
  readonly capacity: number;
  /** Ambient temperature (K). */
  readonly ambient: number;
}

/** An update may lower the temperature to no less than this share of its value (it stays positive). */
const COOLING_REACH = 0.5;
/** A tangent whose conductance changes by more than this share over an update does not hold. */
const TANGENT_CHANGE = 0.1;
/**
 * The dissipated power's linearisation error g·Δv² may move the temperature by at most this
 * much (K), judged at the thermal resistance (the steady-state gain from power to temperature,
 * an upper bound of what one step can do): the LTE floor of a temperature.
 */
const HEAT_REMAINDER = 1e-4;

/**
 * A resistor between a and b whose resistance follows its own temperature θ, an unknown of the
 * MNA system (row `theta`): the electrical rows carry i = v·g(θ); the thermal row is the heat
 * balance C·dθ/dt + (θ − θ_amb)/R_th − v·i = 0 (in W), whose C and 1/R_th are constant and
 * stamped once. A class, so every lamp and thermistor share one `load`.
 */
export class HeatedResistor implements NonlinearTerm {
  // Written before it is read; NaN makes its fields doubles from the start (see jfet.ts).
  private readonly state: ConductanceState = { conductance: NaN, slope: NaN };
  private readonly ambientFlow: number;
  private readonly floor: number;

  constructor(
    private readonly a: number,
    private readonly b: number,
    private readonly theta: number,
    private readonly law: ResistanceLaw,
    private readonly network: ThermalNetwork,
  ) {
    this.ambientFlow = network.ambient / network.resistance;
    this.floor = network.ambient * 1e-3;
  }

  /** g(θ) at the unknowns `x` (θ held above a thousandth of the ambient, where no update can take it). */
  conductanceAt(x: Float64Array): ConductanceState {
    this.law.conductanceAt(Math.max(x[this.theta]!, this.floor), this.state);
    return this.state;
  }

  load(x: Float64Array, out: NonlinearLoad): void {
    const { a, b, theta } = this;
    const v = valueAt(x, a) - valueAt(x, b);
    const { conductance: g, slope } = this.conductanceAt(x);
    const i = v * g;
    stampNonlinearBranch(out, a, b, i, g);
    const di = v * slope;
    out.adddF(a, theta, di);
    out.adddF(b, theta, -di);
    // Heat balance: the constant ambient term stays here (not a source), so source stepping
    // never cools the body below its ambient.
    out.addF(theta, -v * i - this.ambientFlow);
    out.adddF(theta, a, -2 * i);
    out.adddF(theta, b, 2 * i);
    out.adddF(theta, theta, -v * di);
  }

  limitStep(x: Float64Array, dx: Float64Array): number {
    const t = x[this.theta]!;
    const step = dx[this.theta]!;
    if (!(step < -COOLING_REACH * t) || !(t > 0)) return 1;
    return (COOLING_REACH * t) / -step;
  }

  tangentHolds(x: Float64Array, dx: Float64Array): boolean {
    const { conductance: g, slope } = this.conductanceAt(x);
    if (Math.abs(slope * dx[this.theta]!) > TANGENT_CHANGE * g) return false;
    const dv = valueAt(dx, this.a) - valueAt(dx, this.b);
    return g * dv * dv * this.network.resistance <= HEAT_REMAINDER;
  }
}

/** The device of a self-heated resistor: stamps, noise at the ambient, the current. */
export function heatedResistorDevice(part: PartSpec, setup: SetupContext, law: ResistanceLaw, network: ThermalNetwork): Device {
  const a = setup.node(part.nodes[0]!);
  const b = setup.node(part.nodes[1]!);
  const theta = setup.addUnknown(`${part.name}.temperature`, "temperature");
  const term = new HeatedResistor(a, b, theta, law, network);
  const ambient: ConductanceState = { conductance: NaN, slope: NaN };
  law.conductanceAt(network.ambient, ambient);
  return {
    part,
    stampLinear(s) {
      s.addG(theta, theta, 1 / network.resistance);
      s.addC(theta, theta, network.capacity);
    },
    nonlinear: term,
    // From rest the body is at the ambient, not at 0 K.
    initialCharge(q) {
      q[theta] += network.capacity * network.ambient;
    },
    restingState(x) {
      x[theta] = network.ambient;
    },
    current(x) {
      return (valueAt(x, a) - valueAt(x, b)) * term.conductanceAt(x).conductance;
    },
    // Johnson–Nyquist noise at its resistance at the ambient, where a start-up begins.
    noise: (kelvin) => [thermalCurrent(part.name, 1 / ambient.conductance, kelvin, a, b)],
  };
}

/** Links a and b as a DC path (the body is a resistor), for the topology checks. */
export function heatedResistorTopology(part: PartSpec) {
  return { conducting: [[part.nodes[0]!, part.nodes[1]!] as const], voltageDefined: [] };
}

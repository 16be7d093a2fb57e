import type { PartKindSchema } from "../circuit/schema.js";
import type { DeviceModel, NonlinearLoad, NonlinearTerm } from "./device.js";
import { numberOption, requirePositive } from "./options.js";
import { stampConductance, stampNonlinearBranch, valueAt } from "./stamps.js";
import { BOLTZMANN, thermalCurrent } from "./thermal-noise.js";

export const diodeSchema: PartKindSchema = {
  kind: "diode",
  summary: "junction diode (Shockley law) with series resistance and optional junction capacitance",
  pins: ["anode", "cathode"],
  value: null,
  options: {
    saturation: { type: "number", unit: "A", default: 2.5e-9, min: 0, minExclusive: true, summary: "saturation current Is" },
    emission: { type: "number", unit: "1", default: 1.8, min: 0, minExclusive: true, summary: "emission coefficient n" },
    series: { type: "number", unit: "Ω", default: 0.5, min: 0, summary: "ohmic series resistance" },
    junction: { type: "number", unit: "F", default: 0, min: 0, summary: "zero-bias junction capacitance (0: none)" },
  },
  states: {
    junction: { quantity: "voltage", summary: "the junction's anode side, behind the series resistance (the anode itself when series=0)" },
  },
};

/** Thermal voltage kT/q at 300.15 K with the exact SI 2019 constants (docs/references.md §7: 25.8649 mV). */
export const THERMAL_VOLTAGE = (BOLTZMANN * 300.15) / 1.602176634e-19;
/** A conductance across every junction so a reverse-biased diode never leaves a node floating. */
export const JUNCTION_LEAK = 1e-12;
/** Junction potential and grading coefficient of the depletion capacitance (abrupt junction). */
const BUILT_IN = 0.7;
const GRADING = 0.5;
/** Forward-bias fraction of the built-in potential beyond which the capacitance is linearised. */
const FORWARD_KNEE = 0.5;
/** ln 1.1: the junction-voltage change over which the Shockley conductance moves by a tenth. */
const TANGENT_SPAN = Math.log1p(0.1);
/** Beyond this many thermal voltages the exponential continues as its tangent (no overflow). */
const EXP_LIMIT = 40;

export interface JunctionState {
  current: number;
  conductance: number;
}

/** Shockley current and its slope at junction voltage v, exponential linearised past EXP_LIMIT. */
export function junctionCurrent(v: number, is: number, nvt: number, out: JunctionState): void {
  const z = v / nvt;
  // Past the limit the exponential continues along its tangent: e·(1 + z − limit).
  const beyond = z > EXP_LIMIT ? z - EXP_LIMIT : 0;
  const e = Math.exp(beyond > 0 ? EXP_LIMIT : z);
  out.current = is * (e * (1 + beyond) - 1) + JUNCTION_LEAK * v;
  out.conductance = (is * e) / nvt + JUNCTION_LEAK;
}

/** Depletion charge and capacitance at v: Cj0/(1 − v/φ)^m, linear past FORWARD_KNEE·φ. */
export function junctionCharge(v: number, cj0: number, out: JunctionState): void {
  const m = GRADING;
  const phi = BUILT_IN;
  const vk = FORWARD_KNEE * phi;
  if (v < vk) {
    const s = 1 - v / phi;
    out.current = ((cj0 * phi) / (1 - m)) * (1 - Math.pow(s, 1 - m));
    out.conductance = cj0 / Math.pow(s, m);
  } else {
    const f = Math.pow(1 - FORWARD_KNEE, 1 + m);
    const q0 = ((cj0 * phi) / (1 - m)) * (1 - Math.pow(1 - FORWARD_KNEE, 1 - m));
    const a = 1 - FORWARD_KNEE * (1 + m);
    out.current = q0 + (cj0 / f) * (a * (v - vk) + (m / (2 * phi)) * (v * v - vk * vk));
    out.conductance = (cj0 / f) * (a + (m * v) / phi);
  }
}

/**
 * Junction-voltage limiting after the 1970s circuit-analysis practice (docs/references.md §7): past the
 * critical voltage a large Newton step is replaced by a logarithmic one.
 */
export function limitJunctionVoltage(vOld: number, vNew: number, nvt: number, vcrit: number): number {
  if (vNew > vcrit && Math.abs(vNew - vOld) > 2 * nvt) {
    if (vOld > 0) {
      const arg = 1 + (vNew - vOld) / nvt;
      return arg > 0 ? vOld + nvt * Math.log(arg) : vcrit;
    }
    return nvt * Math.log(vNew / nvt);
  }
  return vNew;
}

/**
 * The diode's nonlinear term between junction nodes a and c. A class, so all diodes share one
 * `load` and one `limitStep` (the solver's calls then stay monomorphic however many there are).
 */
class Junction implements NonlinearTerm {
  // Written before it is read; NaN makes its fields doubles from the start (see jfet.ts).
  private readonly state: JunctionState = { current: NaN, conductance: NaN };

  constructor(
    private readonly a: number,
    private readonly c: number,
    private readonly is: number,
    private readonly nvt: number,
    private readonly cj0: number,
    private readonly vcrit: number,
  ) {}

  load(x: Float64Array, out: NonlinearLoad): void {
    const { a, c, state } = this;
    const vd = valueAt(x, a) - valueAt(x, c);
    junctionCurrent(vd, this.is, this.nvt, state);
    stampNonlinearBranch(out, a, c, state.current, state.conductance);
    if (this.cj0 > 0) {
      junctionCharge(vd, this.cj0, state);
      // The depletion charge from a to c, row by row (sign +1 on a, −1 on c).
      for (let side = 0; side < 2; side++) {
        const row = side === 0 ? a : c;
        const sign = side === 0 ? 1 : -1;
        out.addQ(row, sign * state.current);
        out.adddQ(row, a, sign * state.conductance);
        out.adddQ(row, c, -sign * state.conductance);
      }
    }
  }

  tangentHolds(_x: Float64Array, dx: Float64Array): boolean {
    const step = valueAt(dx, this.a) - valueAt(dx, this.c);
    // The conductance scales as e^(v/nVt) (the depletion capacitance far more slowly): within a
    // tenth while the junction voltage moves by nVt·ln 1.1.
    return Math.abs(step) <= this.nvt * TANGENT_SPAN;
  }

  limitStep(x: Float64Array, dx: Float64Array): number {
    const { a, c, nvt, vcrit } = this;
    const vOld = valueAt(x, a) - valueAt(x, c);
    const step = valueAt(dx, a) - valueAt(dx, c);
    const vNew = vOld + step;
    // Exactly 1 unless the step is really limited (a ratio of tiny differences is not).
    if (!(vNew > vcrit && Math.abs(step) > 2 * nvt)) return 1;
    const fraction = (limitJunctionVoltage(vOld, vNew, nvt, vcrit) - vOld) / step;
    return fraction > 0 && fraction < 1 ? fraction : 1;
  }
}

export const diode: DeviceModel = {
  schema: diodeSchema,
  validate(part) {
    requirePositive(part, "saturation current", numberOption(part, diodeSchema, "saturation"), "A");
    requirePositive(part, "emission coefficient", numberOption(part, diodeSchema, "emission"), "");
  },
  topology(part) {
    return { conducting: [[part.nodes[0]!, part.nodes[1]!]], voltageDefined: [] };
  },
  create(part, setup) {
    const anode = setup.node(part.nodes[0]!);
    const cathode = setup.node(part.nodes[1]!);
    const is = numberOption(part, diodeSchema, "saturation");
    const nvt = numberOption(part, diodeSchema, "emission") * THERMAL_VOLTAGE;
    const series = numberOption(part, diodeSchema, "series");
    const cj0 = numberOption(part, diodeSchema, "junction");
    const a = series > 0 ? setup.addUnknown(`${part.name}.junction`, "voltage") : anode;
    const c = cathode;
    if (series === 0) setup.alias(`${part.name}.junction`, anode);
    if (cj0 > 0) {
      setup.declareCharge(a, [a, c]);
      setup.declareCharge(c, [a, c]);
    }
    const vcrit = nvt * Math.log(nvt / (Math.SQRT2 * is));
    const state: JunctionState = { current: NaN, conductance: NaN };
    const v = valueAt;
    return {
      part,
      stampLinear:
        series > 0
          ? (s) => {
              stampConductance(s, anode, a, 1 / series);
            }
          : undefined,
      nonlinear: new Junction(a, c, is, nvt, cj0, vcrit),
      current(x, dxdt) {
        if (series > 0) return (v(x, anode) - v(x, a)) / series;
        const vd = v(x, a) - v(x, c);
        junctionCurrent(vd, is, nvt, state);
        let i = state.current;
        if (cj0 > 0) {
          junctionCharge(vd, cj0, state);
          i += state.conductance * (v(dxdt, a) - v(dxdt, c));
        }
        return i;
      },
      // The series resistance is an ohmic resistor; the junction's shot noise is not modelled.
      noise: series > 0 ? (kelvin) => [thermalCurrent(`${part.name}.series`, series, kelvin, anode, a)] : undefined,
    };
  },
};

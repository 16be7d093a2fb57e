import type { OptionValue, PartSpec } from "../circuit/circuit.js";
import { inputError } from "../circuit/diagnostic.js";
import type { PartKindSchema } from "../circuit/schema.js";
import type { DeviceModel, NonlinearLoad, NonlinearTerm } from "./device.js";
import { numberOption, requirePositive } from "./options.js";
import { stampConductance, valueAt } from "./stamps.js";

export const opampSchema: PartKindSchema = {
  kind: "opamp",
  summary: "single-pole op-amp macromodel with smooth rail clipping, slew limit and offset",
  pins: ["plus", "minus", "out"],
  value: null,
  options: {
    preset: { type: "name", summary: "a built-in (general, fast, precision, ideal) or file-defined option set" },
    gain: { type: "number", unit: "1", decibel: true, default: 200e3, min: 1, summary: "open-loop DC gain" },
    gbw: { type: "number", unit: "Hz", default: 1e6, min: 0, minExclusive: true, summary: "gain-bandwidth product" },
    rails: { type: "number-pair", unit: "V", summary: "fixed supply voltages (neg, pos); default (-15, 15)" },
    supply: { type: "node-pair", summary: "follow two supply nodes (neg, pos) instead of fixed rails" },
    headroom: { type: "number", unit: "V", default: 1.5, min: 0, summary: "how far from each rail the output saturates" },
    rout: { type: "number", unit: "Ω", default: 75, min: 0, minExclusive: true, summary: "output resistance" },
    slew: { type: "number", unit: "V/s", default: 0.5e6, min: 0, minExclusive: true, allowInfinite: true, summary: "slew-rate limit (inf: none)" },
    vos: { type: "number", unit: "V", default: 0, summary: "input offset voltage, added to v(plus) − v(minus)" },
    rin: { type: "number", unit: "Ω", default: 2e6, min: 0, minExclusive: true, allowInfinite: true, summary: "differential input resistance (inf: none)" },
    knee: { type: "number", unit: "V", default: 10e-3, min: 0, minExclusive: true, summary: "smoothing width of the rail limiting; → 0 approaches an ideal limiter" },
  },
};

/**
 * Built-in option sets. Values are typical of each class of part (common practice, from memory),
 * not of any product. `general` equals the schema defaults.
 */
export const opampPresets: Readonly<Record<string, Readonly<Record<string, OptionValue>>>> = {
  general: { gain: 200e3, gbw: 1e6, slew: 0.5e6, rout: 75, rin: 2e6, headroom: 1.5, knee: 10e-3 },
  fast: { gain: 100e3, gbw: 10e6, slew: 15e6, rout: 50, rin: 1e6, headroom: 1.2, knee: 10e-3 },
  precision: { gain: 1e6, gbw: 0.8e6, slew: 0.3e6, rout: 60, rin: 30e6, headroom: 1.0, knee: 10e-3 },
  ideal: { gain: 1e7, gbw: 1e9, slew: Infinity, rout: 1e-3, rin: Infinity, headroom: 0, knee: 1e-3 },
};

/** The op-amp's output rails (V) when a part gives neither `rails=` nor `supply=`. */
export const DEFAULT_RAILS: readonly [number, number] = [-15, 15];

/** Scale of the internal transconductance (A/V); it sets the pole node's impedance level only. */
const STAGE_TRANSCONDUCTANCE = 1e-3;

/** Knee widths inside a limit beyond which its clamp is left out (e^−40 ≈ 4e-18). */
const CLAMP_REACH = 40;

/** Stable softplus w·ln(1 + e^(z/w)) and its slope, the logistic σ(z/w). */
function softplus(z: number, w: number): number {
  const u = z / w;
  return u > 30 ? z : u < -30 ? w * Math.exp(u) : w * Math.log1p(Math.exp(u));
}
function logistic(z: number, w: number): number {
  const u = z / w;
  return u > 30 ? 1 : u < -30 ? Math.exp(u) : 1 / (1 + Math.exp(-u));
}

/** Electrical constants of the macromodel derived from the options. */
export interface OpampConstants {
  readonly gain: number;
  readonly gbw: number;
  /** Pole node resistance, capacitance and input-stage transconductance: g·R = gain, R·C = gain/(2π·gbw). */
  readonly rPole: number;
  readonly cPole: number;
  readonly gm: number;
  /** Largest input-stage current (slew·C), Infinity without a slew limit. */
  readonly iMax: number;
  /** Clamp conductance beyond the limits (A/V). */
  readonly gClamp: number;
  readonly knee: number;
  readonly headroom: number;
  readonly rout: number;
  readonly rin: number;
  readonly vos: number;
  readonly rails: readonly [number, number];
}

function railsOf(part: PartSpec): readonly [number, number] {
  const rails = part.options.rails;
  if (Array.isArray(rails) && rails.length === 2) return [rails[0] as number, rails[1] as number];
  return DEFAULT_RAILS;
}

/** The op-amp macromodel's constants for a part: its preset merged with its own options, rails resolved. */
export function opampConstants(part: PartSpec): OpampConstants {
  const num = (k: string) => numberOption(part, opampSchema, k);
  const gain = num("gain");
  const gbw = num("gbw");
  const gm = STAGE_TRANSCONDUCTANCE;
  const rPole = gain / gm;
  const cPole = gm / (2 * Math.PI * gbw);
  const slew = num("slew");
  const knee = num("knee");
  return {
    gain,
    gbw,
    rPole,
    cPole,
    gm,
    iMax: Number.isFinite(slew) ? slew * cPole : Infinity,
    // Sized so that the largest drive (the slew current, else g·1 V) is balanced about half a
    // knee width past the limit: the clamp is steep on the scale of the knee, yet its Newton
    // iterations stay out of the far exponential tail where each one gains only one width.
    gClamp: (Number.isFinite(slew) ? slew * cPole : gm * 1) / knee,
    knee,
    headroom: num("headroom"),
    rout: num("rout"),
    rin: num("rin"),
    vos: num("vos"),
    rails: railsOf(part),
  };
}

/**
 * The macromodel's nonlinear part on its pole node p: the rail clamps and, with a slew limit,
 * the tanh input stage (see `opamp`). A class, so every op-amp shares one `load`.
 */
class OutputStage implements NonlinearTerm {
  private readonly slewLimited: boolean;

  constructor(
    private readonly plus: number,
    private readonly minus: number,
    private readonly p: number,
    /** Supply nodes (neg, pos) followed instead of fixed rails. */
    private readonly supply: readonly [number, number] | undefined,
    private readonly k: OpampConstants,
  ) {
    this.slewLimited = Number.isFinite(k.iMax);
  }

  load(x: Float64Array, o: NonlinearLoad): void {
    const { k, p, supply } = this;
    const xp = x[p]!;
    let hi = k.rails[1] - k.headroom;
    let lo = k.rails[0] + k.headroom;
    if (supply) {
      hi = valueAt(x, supply[1]) - k.headroom;
      lo = valueAt(x, supply[0]) + k.headroom;
    }
    const w = k.knee;
    const g = k.gClamp;
    // More than CLAMP_REACH knee widths inside a limit its clamp carries < 1e-17 of g·w: none.
    let sHi = 0;
    let sLo = 0;
    if (xp - hi > -CLAMP_REACH * w) {
      o.addF(p, g * softplus(xp - hi, w));
      sHi = g * logistic(xp - hi, w);
    }
    if (lo - xp > -CLAMP_REACH * w) {
      o.addF(p, -g * softplus(lo - xp, w));
      sLo = g * logistic(lo - xp, w);
    }
    o.adddF(p, p, sHi + sLo);
    if (supply) {
      o.adddF(p, supply[1], -sHi);
      o.adddF(p, supply[0], -sLo);
    }
    if (this.slewLimited) {
      const vd = valueAt(x, this.plus) - valueAt(x, this.minus) + k.vos;
      const t = Math.tanh((k.gm * vd) / k.iMax);
      o.addF(p, -k.iMax * t);
      const slope = k.gm * (1 - t * t);
      o.adddF(p, this.plus, -slope);
      o.adddF(p, this.minus, slope);
    }
  }
}

/**
 * The macromodel. An internal pole node x obeys
 *   C·dx/dt + x/R + i_clamp(x) = i_in(vd),  vd = v(plus) − v(minus) + vos,
 * with i_in = g·vd (or I_max·tanh(g·vd/I_max) under a slew limit, which bounds dx/dt at the
 * slew rate), and the output is x behind `rout`. The clamp is a softplus conductance beyond each
 * limit (rail ∓ headroom), so x itself, not only the output, stays at the limit (fully
 * overdriven, about half a knee width past it; lightly, a few widths inside): there is no
 * integrator wind-up, and the output leaves the rail as soon as the input turns. At the bias
 * point inside the limits the clamp's slope is zero and tanh′(0) = 1, so the
 * linearised model is exactly the single-pole amplifier gain/(1 + s·gain/(2π·gbw)).
 */
export const opamp: DeviceModel = {
  schema: opampSchema,
  validate(part) {
    const k = opampConstants(part);
    requirePositive(part, "gain-bandwidth", k.gbw, "Hz");
    if (part.options.rails !== undefined && part.options.supply !== undefined) {
      throw inputError("conflicting-options", `opamp ${part.name}: give rails= or supply=, not both`, {
        span: part.span,
        hint: "rails= fixes the supply voltages; supply= follows two nodes",
      });
    }
    const [neg, pos] = k.rails;
    if (!(pos - k.headroom > neg + k.headroom)) {
      throw inputError("out-of-range", `opamp ${part.name}: rails (${neg}, ${pos}) V leave no output range with headroom ${k.headroom} V`, {
        span: part.span,
        hint: "write rails=(neg, pos) with neg < pos and more than 2·headroom between them",
      });
    }
  },
  topology(part) {
    const [plus, minus, out] = part.nodes as [string, string, string];
    const rin = numberOption(part, opampSchema, "rin");
    return {
      conducting: Number.isFinite(rin) ? [[out, "gnd"], [plus, minus]] : [[out, "gnd"]],
      voltageDefined: [],
    };
  },
  create(part, setup) {
    const plus = setup.node(part.nodes[0]!);
    const minus = setup.node(part.nodes[1]!);
    const out = setup.node(part.nodes[2]!);
    const supply = part.options.supply as readonly string[] | undefined;
    const neg = supply ? setup.node(supply[0]!) : -1;
    const pos = supply ? setup.node(supply[1]!) : -1;
    const p = setup.addUnknown(`${part.name}.pole`, "voltage", { backwardEuler: true });
    const k = opampConstants(part);
    const slewLimited = Number.isFinite(k.iMax);
    return {
      part,
      stampLinear(s) {
        s.addG(p, p, 1 / k.rPole);
        s.addC(p, p, k.cPole);
        if (!slewLimited) {
          s.addG(p, plus, -k.gm);
          s.addG(p, minus, k.gm);
        }
        s.addG(out, out, 1 / k.rout);
        s.addG(out, p, -1 / k.rout);
        if (Number.isFinite(k.rin)) stampConductance(s, plus, minus, 1 / k.rin);
      },
      // Without a slew limit the input stage is linear and the offset drives the pole node like
      // an input voltage; with one, the offset sits inside the tanh (see load).
      source:
        !slewLimited && k.vos !== 0
          ? {
              addSource(_t, scale, u) {
                u[p] += scale * k.gm * k.vos;
              },
              nextBreakpoint: () => Infinity,
            }
          : undefined,
      nonlinear: new OutputStage(plus, minus, p, supply ? [neg, pos] : undefined, k),
      current(x) {
        return (x[p]! - valueAt(x, out)) / k.rout;
      },
    };
  },
};

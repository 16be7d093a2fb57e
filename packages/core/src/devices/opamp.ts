import type { OptionValue, PartSpec } from "../circuit/circuit.js";
import { inputError } from "../circuit/diagnostic.js";
import type { PartKindSchema } from "../circuit/schema.js";
import { powerOnLevel, type DeviceModel, type NonlinearLoad, type NonlinearTerm, type PowerOn } from "./device.js";
import { numberOption, requirePositive } from "./options.js";
import { stampBranch, stampConductance, valueAt } from "./stamps.js";

export const opampSchema: PartKindSchema = {
  kind: "opamp",
  summary: "single-pole op-amp macromodel with smooth rail clipping, slew limit and offset",
  pins: ["plus", "minus", "out"],
  value: null,
  options: {
    preset: { type: "name", summary: "a built-in (general, fast, precision, ideal) or file-defined option set" },
    gain: { type: "number", unit: "1", decibel: true, default: 200e3, min: 1, allowInfinite: true, summary: "open-loop DC gain (inf: an integrator, or with gbw=inf a nullor)" },
    gbw: { type: "number", unit: "Hz", default: 1e6, min: 0, minExclusive: true, allowInfinite: true, summary: "gain-bandwidth product (inf: no pole, needs slew=inf)" },
    rails: { type: "number-pair", unit: "V", summary: "fixed supply voltages (neg, pos); default (-15, 15)" },
    supply: { type: "node-pair", summary: "follow two supply nodes (neg, pos) instead of fixed rails" },
    headroom: { type: "number", unit: "V", default: 1.5, min: 0, summary: "how far from each rail the output saturates" },
    rout: { type: "number", unit: "Ω", default: 75, min: 0, summary: "output resistance (0: an ideal voltage output)" },
    slew: { type: "number", unit: "V/s", default: 0.5e6, min: 0, minExclusive: true, allowInfinite: true, summary: "slew-rate limit (inf: none)" },
    vos: { type: "number", unit: "V", default: 0, summary: "input offset voltage, added to v(plus) − v(minus)" },
    rin: { type: "number", unit: "Ω", default: 2e6, min: 0, minExclusive: true, allowInfinite: true, summary: "differential input resistance (inf: none)" },
    knee: { type: "number", unit: "V", default: 10e-3, min: 0, minExclusive: true, summary: "smoothing width of the rail limiting; → 0 approaches an ideal limiter" },
    noise: { type: "number", unit: "V/√Hz", default: 20e-9, min: 0, summary: "input noise voltage density (white), the part's own noise under startup kick=thermal or power-on" },
  },
  states: {
    pole: { quantity: "voltage", summary: "the internal pole node: the output voltage before the output resistance and the rail limits" },
  },
};

/**
 * Built-in option sets. Values are typical of each class of part (common practice, from memory),
 * not of any product. `general` equals the schema defaults. Input noise densities, from memory:
 * about 20 nV/√Hz for a general-purpose bipolar part, 12 nV/√Hz for a fast wideband one,
 * 10 nV/√Hz for a precision bipolar one; the ideal amplifier is noiseless.
 */
export const opampPresets: Readonly<Record<string, Readonly<Record<string, OptionValue>>>> = {
  general: { gain: 200e3, gbw: 1e6, slew: 0.5e6, rout: 75, rin: 2e6, headroom: 1.5, knee: 10e-3, noise: 20e-9 },
  fast: { gain: 100e3, gbw: 10e6, slew: 15e6, rout: 50, rin: 1e6, headroom: 1.2, knee: 10e-3, noise: 12e-9 },
  precision: { gain: 1e6, gbw: 0.8e6, slew: 0.3e6, rout: 60, rin: 30e6, headroom: 1.0, knee: 10e-3, noise: 10e-9 },
  ideal: { gain: 1e7, gbw: 1e9, slew: Infinity, rout: 1e-3, rin: Infinity, headroom: 0, knee: 1e-3, noise: 0 },
};

/** The op-amp's output rails (V) when a part gives neither `rails=` nor `supply=`. */
export const DEFAULT_RAILS: readonly [number, number] = [-15, 15];

/** Scale of the internal transconductance (A/V); it sets the pole node's impedance level only. */
const STAGE_TRANSCONDUCTANCE = 1e-3;

/** Knee widths inside a limit beyond which its clamp is left out (e^−40 ≈ 4e-18). */
const CLAMP_REACH = 40;
/**
 * Largest change of the tanh input stage's argument g·vd/I_max that one Newton update may make
 * unless both ends lie deep in the same saturation (`TANH_FLAT`): the stage's tangent is good
 * only within about one unit of its argument.
 */
const TANH_REACH = 2;
const TANH_FLAT = 8;
/** Largest step of the pole node past a limit, in knee widths, from a point inside it. */
const CLAMP_ENTRY = 4;
/** A tangent (a clamp's or the tanh stage's slope) that changes by more than this share over an update does not hold. */
const TANGENT_CHANGE = 0.1;
/**
 * Largest change of the pole node in one time step, as a share of the output range. Without it
 * a step could carry the output from rail to rail — the pole is algebraic with gbw=inf, and even
 * under error control a truncation estimate only sees a jump after it — and a bistable loop (a
 * comparator with positive feedback) could settle each step on the other rail, the implicit
 * step's other root.
 */
const MAX_SWING_PER_STEP = 0.25;

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
  /** Input noise voltage density (V/√Hz). */
  readonly noise: number;
  readonly rails: readonly [number, number];
}

function railsOf(part: PartSpec): readonly [number, number] {
  const rails = part.options.rails;
  const [neg, pos] = Array.isArray(rails) && rails.length === 2 ? [rails[0] as number, rails[1] as number] : DEFAULT_RAILS;
  // An array of doubles whatever the values: whole rails would make an array of small integers
  // and a fractional one another element kind under the same optimised load.
  const doubles: [number, number] = [NaN, NaN];
  doubles[0] = neg;
  doubles[1] = pos;
  return doubles;
}

/**
 * Constants whose number fields are doubles from the start (NaN), so every part's record has one
 * shape: whole values in the first part would make them small integers, and a later part's
 * fractional ones would then change the shape under the optimised clamp and load.
 */
function blankConstants(): OpampConstants {
  return { gain: NaN, gbw: NaN, rPole: NaN, cPole: NaN, gm: NaN, iMax: NaN, gClamp: NaN, knee: NaN, headroom: NaN, rout: NaN, rin: NaN, vos: NaN, noise: NaN, rails: DEFAULT_RAILS };
}

/** The op-amp macromodel's constants for a part: its preset merged with its own options, rails resolved. */
export function opampConstants(part: PartSpec): OpampConstants {
  const num = (k: string) => numberOption(part, opampSchema, k);
  const gain = num("gain");
  const gbw = num("gbw");
  const gm = STAGE_TRANSCONDUCTANCE;
  // gain=inf: no DC load on the pole node (an integrator); gbw=inf: no capacitance (algebraic).
  const rPole = gain / gm;
  const cPole = Number.isFinite(gbw) ? gm / (2 * Math.PI * gbw) : 0;
  const slew = num("slew");
  const knee = num("knee");
  return Object.assign(blankConstants(), {
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
    noise: num("noise"),
    rails: railsOf(part),
  });
}

/**
 * The macromodel's nonlinear part on its pole node p: the rail clamps and, with a slew limit,
 * the tanh input stage (see `opamp`). A class, so every op-amp shares one `load`.
 */
class OutputStage implements NonlinearTerm {
  private readonly slewLimited: boolean;
  /** The share of the fixed rails reached at the time of the last load (1 unless powering on). */
  private railLevel = NaN;

  constructor(
    private readonly plus: number,
    private readonly minus: number,
    private readonly p: number,
    /** Supply nodes (neg, pos) followed instead of fixed rails. */
    private readonly supply: readonly [number, number] | undefined,
    private readonly k: OpampConstants,
    /** Fixed rails that rise from 0 (a power-on run). */
    private readonly powerOn: PowerOn | undefined,
  ) {
    this.slewLimited = Number.isFinite(k.iMax);
    // NaN, then 1: a double field from the start (see TransientStepper.t).
    this.railLevel = 1;
  }

  /**
   * The output limits (lo, hi): each supply ∓ headroom. While a ramped supply is below the
   * headroom the two limits cross and the clamps hold the pole node midway between them.
   */
  private limit(x: Float64Array, upper: boolean): number {
    const { k, supply } = this;
    if (supply) return upper ? valueAt(x, supply[1]) - k.headroom : valueAt(x, supply[0]) + k.headroom;
    return upper ? k.rails[1] * this.railLevel - k.headroom : k.rails[0] * this.railLevel + k.headroom;
  }

  load(x: Float64Array, o: NonlinearLoad, t: number): void {
    const { k, p, supply } = this;
    const xp = x[p]!;
    if (this.powerOn) this.railLevel = powerOnLevel(this.powerOn, t);
    const hi = this.limit(x, true);
    const lo = this.limit(x, false);
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

  tangentHolds(x: Float64Array, dx: Float64Array): boolean {
    const { k, p } = this;
    const w = k.knee;
    const x0 = x[p]!;
    const x1 = x0 + dx[p]!;
    const hi = this.limit(x, true);
    const lo = this.limit(x, false);
    const holds = (a: number, b: number) => Math.abs(a - b) <= TANGENT_CHANGE * Math.max(a, b) || Math.max(a, b) < 1e-6;
    if (!holds(logistic(x0 - hi, w), logistic(x1 - hi, w)) || !holds(logistic(lo - x0, w), logistic(lo - x1, w))) return false;
    if (!this.slewLimited) return true;
    const scale = k.gm / k.iMax;
    const u0 = scale * (valueAt(x, this.plus) - valueAt(x, this.minus) + k.vos);
    const u1 = u0 + scale * (valueAt(dx, this.plus) - valueAt(dx, this.minus));
    const t0 = Math.tanh(u0);
    const t1 = Math.tanh(u1);
    return holds(1 - t0 * t0, 1 - t1 * t1);
  }

  changeRatio(x: Float64Array, xNew: Float64Array): number {
    const span = this.limit(x, true) - this.limit(x, false);
    if (!(span > 0)) return 0;
    return Math.abs(xNew[this.p]! - x[this.p]!) / (MAX_SWING_PER_STEP * span);
  }

  /**
   * Newton updates are trusted only where the tangents they came from hold: the tanh stage's
   * argument moves by at most {@link TANH_REACH} unless it stays saturated, and the pole node
   * enters a clamp by at most {@link CLAMP_ENTRY} knee widths from inside it (from inside, the
   * clamp's tangent is flat and the update would overshoot the limit by whatever the rest of the
   * circuit asks; from there the next iteration's tangent sees the clamp). At a clip corner the
   * first update of a step would otherwise look small enough to accept while the stage still
   * owes many times its current.
   */
  limitStep(x: Float64Array, dx: Float64Array): number {
    const { k, p } = this;
    let lambda = 1;
    if (this.slewLimited) {
      const scale = k.gm / k.iMax;
      const u0 = scale * (valueAt(x, this.plus) - valueAt(x, this.minus) + k.vos);
      const du = scale * (valueAt(dx, this.plus) - valueAt(dx, this.minus));
      const u1 = u0 + du;
      const saturated = (u0 > TANH_FLAT && u1 > TANH_FLAT) || (u0 < -TANH_FLAT && u1 < -TANH_FLAT);
      if (Math.abs(du) > TANH_REACH && !saturated) lambda = TANH_REACH / Math.abs(du);
    }
    const xp = x[p]!;
    const step = dx[p]!;
    const hi = this.limit(x, true);
    const lo = this.limit(x, false);
    const reach = CLAMP_ENTRY * k.knee;
    if (xp < hi && xp + step > hi + reach) lambda = Math.min(lambda, (hi + reach - xp) / step);
    if (xp > lo && xp + step < lo - reach) lambda = Math.min(lambda, (lo - reach - xp) / step);
    return lambda;
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
 *
 * Limits of the options: rout=0 makes the output an ideal voltage v(out) = x (a branch current
 * unknown carries the output current); gbw=inf leaves the pole node without capacitance, so x
 * follows the input at once (a slew limit then has nothing to act on and is refused); gain=inf
 * leaves it without its DC resistance, an integrator (with gbw=inf too: a nullor whose output is
 * whatever keeps vd at 0, within the limits); headroom=0 limits at the rails themselves.
 */
export const opamp: DeviceModel = {
  schema: opampSchema,
  validate(part) {
    const k = opampConstants(part);
    if (!(k.gbw > 0)) requirePositive(part, "gain-bandwidth", k.gbw, "Hz");
    if (!Number.isFinite(k.gbw) && Number.isFinite(numberOption(part, opampSchema, "slew"))) {
      throw inputError("conflicting-options", `opamp ${part.name}: gbw=inf leaves the slew limit nothing to act on`, {
        span: part.span,
        hint: "the slew rate limits how fast the pole's capacitance charges; with gbw=inf write slew=inf too (or give a finite gbw=)",
      });
    }
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
    const rout = numberOption(part, opampSchema, "rout");
    return {
      conducting: Number.isFinite(rin) ? [[out, "gnd"], [plus, minus]] : [[out, "gnd"]],
      voltageDefined: rout === 0 ? [[out, "gnd"]] : [],
    };
  },
  create(part, setup) {
    const plus = setup.node(part.nodes[0]!);
    const minus = setup.node(part.nodes[1]!);
    const out = setup.node(part.nodes[2]!);
    const supply = part.options.supply as readonly string[] | undefined;
    const neg = supply ? setup.node(supply[0]!) : -1;
    const pos = supply ? setup.node(supply[1]!) : -1;
    const p = setup.addUnknown(`${part.name}.pole`, "voltage", { stiff: true });
    const k = opampConstants(part);
    // rout=0: the output is the ideal voltage x, through a branch carrying the output current.
    const branch = k.rout === 0 ? setup.addUnknown(`${part.name}.i`, "current", { role: "branch" }) : -1;
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
        if (branch >= 0) {
          // v(out) − x = 0; the branch current leaves `out` into the amplifier.
          stampBranch(s, out, -1, branch);
          s.addG(branch, p, -1);
        } else {
          s.addG(out, out, 1 / k.rout);
          s.addG(out, p, -1 / k.rout);
        }
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
      nonlinear: new OutputStage(plus, minus, p, supply ? [neg, pos] : undefined, k, supply ? undefined : setup.powerOn),
      // The current the amplifier drives into `out`.
      current(x) {
        return branch >= 0 ? -x[branch]! : (x[p]! - valueAt(x, out)) / k.rout;
      },
      // The input noise voltage drives the pole node through the input stage, like an input
      // voltage (rin and rout are the transistors' small-signal resistances, not thermal
      // resistors: the part's own noise is all in `noise=`).
      outputLimits: (x) => ({
        state: p,
        low: (supply ? valueAt(x, neg) : k.rails[0]) + k.headroom,
        high: (supply ? valueAt(x, pos) : k.rails[1]) - k.headroom,
      }),
      noise: k.noise > 0 ? () => [{ name: `${part.name}.input`, density: k.noise * k.noise, from: -1, to: p, gain: k.gm }] : undefined,
    };
  },
};

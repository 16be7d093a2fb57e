import type { PartSpec } from "../circuit/circuit.js";
import { inputError } from "../circuit/diagnostic.js";
import type { PartKindSchema } from "../circuit/schema.js";
import type { DeviceModel, NonlinearLoad, NonlinearTerm } from "./device.js";
import { junctionCurrent, limitJunctionVoltage, THERMAL_VOLTAGE, type JunctionState } from "./diode.js";
import { numberOption, requirePositive, wordOption } from "./options.js";
import { stampConductance, stampNonlinearBranch, valueAt } from "./stamps.js";

export const jfetSchema: PartKindSchema = {
  kind: "jfet",
  summary: "junction FET: square-law channel (Shichman–Hodges) symmetric in drain and source, gate junctions as diodes",
  pins: ["drain", "gate", "source"],
  value: null,
  options: {
    idss: { type: "number", unit: "A", min: 0, minExclusive: true, summary: "drain current at v(gate, source) = 0 in saturation" },
    pinchoff: { type: "number", unit: "V", summary: "pinch-off voltage VP: negative for type=n, positive for type=p" },
    type: { type: "word", words: ["n", "p"], default: "n", summary: "channel type" },
    lambda: { type: "number", unit: "1/V", default: 0, min: 0, summary: "channel-length modulation: the current grows as 1 + lambda·|v(drain, source)|" },
  },
};

/** Saturation current and emission coefficient of each gate junction (common practice, from memory). */
export const GATE_SATURATION = 1e-14;
const GATE_NVT = THERMAL_VOLTAGE;
/** A conductance from drain to source, so a pinched-off channel never leaves a node floating. */
export const CHANNEL_LEAK = 1e-12;
/** ln 1.1: the junction-voltage change over which the Shockley conductance moves by a tenth. */
const TANGENT_SPAN = Math.log1p(0.1);
/** A tangent whose slopes change by more than this share over an update does not hold. */
const TANGENT_CHANGE = 0.1;

/** The channel's current (drain → source) and its slopes in the gate and channel voltages. */
export interface ChannelState {
  current: number;
  /** ∂i/∂v(gate, source side) */
  gm: number;
  /** ∂i/∂v(drain, source) */
  gds: number;
}

/**
 * Shichman–Hodges square law (docs/references.md §12.3) of an n-channel in normal orientation
 * (v ≥ 0 from drain to source), with β = IDSS/VP² and overdrive vov = vg − VP:
 * cut off for vov ≤ 0; β·(2·vov·v − v²)·(1 + λv) for v < vov; β·vov²·(1 + λv) beyond.
 */
export function channelCurrent(vg: number, v: number, beta: number, vp: number, lambda: number, out: ChannelState): void {
  const vov = vg - vp;
  if (vov <= 0) {
    out.current = 0;
    out.gm = 0;
    out.gds = 0;
    return;
  }
  const m = 1 + lambda * v;
  if (v < vov) {
    const shape = 2 * vov * v - v * v;
    out.current = beta * shape * m;
    out.gm = 2 * beta * v * m;
    out.gds = beta * (2 * vov - 2 * v) * m + beta * shape * lambda;
  } else {
    out.current = beta * vov * vov * m;
    out.gm = 2 * beta * vov * m;
    out.gds = beta * vov * vov * lambda;
  }
}

/**
 * The JFET's nonlinear term. Voltages are taken in the n-channel sense (multiplied by `sign`,
 * −1 for type=p), and the channel is evaluated from whichever of drain and source is lower, so
 * the part is symmetric: with v(drain, source) < 0 the roles swap. The terminal currents are
 * the sign times the n-channel ones, so the slopes carry sign² = 1.
 */
class JfetChannel implements NonlinearTerm {
  // Out-parameters, written before they are read. NaN starts their fields as doubles: a 0 starts
  // them as small integers, and the first fractional value then changes the shape of every such
  // object and throws away the optimised code that had seen it.
  private readonly channel: ChannelState = { current: NaN, gm: NaN, gds: NaN };
  private readonly probe: ChannelState = { current: NaN, gm: NaN, gds: NaN };
  private readonly junction: JunctionState = { current: NaN, conductance: NaN };
  private readonly vcrit = GATE_NVT * Math.log(GATE_NVT / (Math.SQRT2 * GATE_SATURATION));

  constructor(
    readonly d: number,
    readonly g: number,
    readonly s: number,
    private readonly sign: number,
    private readonly beta: number,
    private readonly vp: number,
    private readonly lambda: number,
  ) {}

  /** The channel at terminal voltages: writes the n-sense current drain → source and its slopes. */
  private evaluate(vd: number, vg: number, vs: number, out: ChannelState): boolean {
    const k = this.sign;
    const vds = k * (vd - vs);
    if (vds >= 0) {
      channelCurrent(k * (vg - vs), vds, this.beta, this.vp, this.lambda, out);
      return false;
    }
    channelCurrent(k * (vg - vd), -vds, this.beta, this.vp, this.lambda, out);
    return true;
  }

  /** The terminal current into the drain at x (channel and gate–drain junction). */
  drainCurrent(x: Float64Array): number {
    const vd = valueAt(x, this.d);
    const vg = valueAt(x, this.g);
    const vs = valueAt(x, this.s);
    const swapped = this.evaluate(vd, vg, vs, this.channel);
    junctionCurrent(this.sign * (vg - vd), GATE_SATURATION, GATE_NVT, this.junction);
    const channel = swapped ? -this.channel.current : this.channel.current;
    return this.sign * (channel - this.junction.current) + CHANNEL_LEAK * (vd - vs);
  }

  load(x: Float64Array, out: NonlinearLoad): void {
    const { d, g, s, sign, channel } = this;
    const vd = valueAt(x, d);
    const vg = valueAt(x, g);
    const vs = valueAt(x, s);
    const swapped = this.evaluate(vd, vg, vs, channel);
    // Normal: i(d → s) = ch(vgs, vds). Swapped: i(d → s) = −ch(vgd, vsd); hi is the side the
    // channel is measured from (the higher n-sense potential), lo the other.
    const hi = swapped ? s : d;
    const lo = swapped ? d : s;
    const i = sign * (swapped ? -channel.current : channel.current);
    out.addF(d, i);
    out.addF(s, -i);
    // In its own orientation the current hi → lo is ch(v(g, lo), v(hi, lo)).
    const { gm, gds } = channel;
    out.adddF(hi, g, gm);
    out.adddF(hi, hi, gds);
    out.adddF(hi, lo, -gm - gds);
    out.adddF(lo, g, -gm);
    out.adddF(lo, hi, -gds);
    out.adddF(lo, lo, gm + gds);
    this.loadJunction(x, out, d);
    this.loadJunction(x, out, s);
  }

  /** The gate junction to `side`: anode at the gate for type=n, at `side` for type=p. */
  private loadJunction(x: Float64Array, out: NonlinearLoad, side: number): void {
    const { g, sign, junction } = this;
    junctionCurrent(sign * (valueAt(x, g) - valueAt(x, side)), GATE_SATURATION, GATE_NVT, junction);
    stampNonlinearBranch(out, g, side, sign * junction.current, junction.conductance);
  }

  limitStep(x: Float64Array, dx: Float64Array): number {
    return Math.min(this.limitJunction(x, dx, this.d), this.limitJunction(x, dx, this.s));
  }

  private limitJunction(x: Float64Array, dx: Float64Array, side: number): number {
    const vOld = this.sign * (valueAt(x, this.g) - valueAt(x, side));
    const step = this.sign * (valueAt(dx, this.g) - valueAt(dx, side));
    const vNew = vOld + step;
    if (!(vNew > this.vcrit && Math.abs(step) > 2 * GATE_NVT)) return 1;
    const fraction = (limitJunctionVoltage(vOld, vNew, GATE_NVT, this.vcrit) - vOld) / step;
    return fraction > 0 && fraction < 1 ? fraction : 1;
  }

  tangentHolds(x: Float64Array, dx: Float64Array): boolean {
    const { d, g, s } = this;
    const dg = valueAt(dx, g);
    if (Math.abs(dg - valueAt(dx, d)) > GATE_NVT * TANGENT_SPAN || Math.abs(dg - valueAt(dx, s)) > GATE_NVT * TANGENT_SPAN) return false;
    const vd = valueAt(x, d);
    const vg = valueAt(x, g);
    const vs = valueAt(x, s);
    // Compare the drain current's slopes in v(drain) and v(gate), which are continuous where
    // the channel's orientation swaps.
    const before = this.evaluate(vd, vg, vs, this.channel);
    const after = this.evaluate(vd + valueAt(dx, d), vg + valueAt(dx, g), vs + valueAt(dx, s), this.probe);
    const a = this.channel;
    const b = this.probe;
    const drainA = before ? a.gm + a.gds : a.gds;
    const gateA = before ? -a.gm : a.gm;
    const drainB = after ? b.gm + b.gds : b.gds;
    const gateB = after ? -b.gm : b.gm;
    const scale = Math.abs(drainA) + Math.abs(gateA);
    return Math.abs(drainB - drainA) + Math.abs(gateB - gateA) <= TANGENT_CHANGE * scale + CHANNEL_LEAK;
  }
}

/** The JFET's constants in the n-channel sense: β = IDSS/VP² (A/V²), VP < 0, λ (1/V), sign −1 for type=p. */
export interface JfetConstants {
  readonly idss: number;
  readonly pinchoff: number;
  readonly sign: number;
  readonly lambda: number;
}

/** Reads a jfet part's constants (type=n and lambda=0 unless written). */
export function jfetConstants(part: PartSpec): JfetConstants {
  return {
    idss: numberOption(part, jfetSchema, "idss"),
    pinchoff: numberOption(part, jfetSchema, "pinchoff"),
    sign: wordOption(part, jfetSchema, "type") === "p" ? -1 : 1,
    lambda: numberOption(part, jfetSchema, "lambda"),
  };
}

export const jfet: DeviceModel = {
  schema: jfetSchema,
  validate(part) {
    const k = jfetConstants(part);
    requirePositive(part, "saturation drain current idss", k.idss, "A");
    const type = k.sign > 0 ? "n" : "p";
    if (!(k.sign * k.pinchoff < 0) || !Number.isFinite(k.pinchoff)) {
      throw inputError("out-of-range", `jfet ${part.name}: the pinch-off voltage of a type=${type} jfet must be ${k.sign > 0 ? "negative" : "positive"}, got ${k.pinchoff} V`, {
        span: part.span,
        hint: k.sign > 0 ? "an n-channel part pinches off with its gate below its source: write e.g. pinchoff=-2 (or type=p)" : "a p-channel part pinches off with its gate above its source: write e.g. pinchoff=2 (or type=n)",
      });
    }
    if (!Number.isFinite(k.lambda)) {
      throw inputError("out-of-range", `jfet ${part.name}: lambda must be finite, got ${k.lambda}`, { span: part.span, hint: "write lambda= in 1/V as a plain number, e.g. lambda=0.01" });
    }
  },
  topology(part) {
    const [d, g, s] = part.nodes as [string, string, string];
    return { conducting: [[d, s], [g, s], [g, d]], voltageDefined: [] };
  },
  create(part, setup) {
    const d = setup.node(part.nodes[0]!);
    const g = setup.node(part.nodes[1]!);
    const s = setup.node(part.nodes[2]!);
    const k = jfetConstants(part);
    const vp = k.sign * k.pinchoff;
    const term = new JfetChannel(d, g, s, k.sign, k.idss / (vp * vp), vp, k.lambda);
    return {
      part,
      stampLinear(stamp) {
        stampConductance(stamp, d, s, CHANNEL_LEAK);
      },
      nonlinear: term,
      current: (x) => term.drainCurrent(x),
    };
  },
};

import type { PartSpec } from "../circuit/circuit.js";
import { inputError } from "../circuit/diagnostic.js";
import type { PartKindSchema } from "../circuit/schema.js";
import type { DeviceModel } from "./device.js";
import { numberOption, partValue, requirePositive, wordOption } from "./options.js";
import { stampConductance, valueAt } from "./stamps.js";
import { thermalCurrent } from "./thermal-noise.js";

export const potSchema: PartKindSchema = {
  kind: "pot",
  summary: "potentiometer: a resistive track end1–end2 with a wiper",
  pins: ["end1", "wiper", "end2"],
  value: { unit: "Ω", required: true, min: 0, minExclusive: true, summary: "total track resistance" },
  options: {
    at: { type: "number", unit: "1", default: 0.5, min: 0, max: 1, summary: "wiper position, measured from end1: the fraction of the track between end1 and the wiper (0 at end1, 1 at end2)" },
    taper: { type: "word", words: ["linear", "audio"], default: "linear", summary: "how the track resistance follows the position" },
  },
};

/** Base of the audio taper: r(½) = (√81 − 1)/(81 − 1) = 0.1, i.e. 10 % of the track at mid-rotation. */
export const AUDIO_TAPER_BASE = 81;

/**
 * Fraction of the track resistance between end1 and the wiper at position `at`.
 * linear: r = at. audio: r = (B^at − 1)/(B − 1) with B = 81, an exponential law through
 * r(0) = 0, r(½) = 0.1 and r(1) = 1 (the 10 %-at-half-rotation law is common practice).
 */
export function taperFraction(at: number, taper: string): number {
  if (taper === "audio") return (Math.pow(AUDIO_TAPER_BASE, at) - 1) / (AUDIO_TAPER_BASE - 1);
  return at;
}

/** No segment is shorter than this fraction of the track, so the ends are never a dead short. */
const END_FRACTION = 1e-9;

function segments(part: PartSpec): [number, number] {
  const total = partValue(part);
  const at = numberOption(part, potSchema, "at");
  const r = taperFraction(at, wordOption(part, potSchema, "taper"));
  const floor = total * END_FRACTION;
  return [Math.max(total * r, floor), Math.max(total * (1 - r), floor)];
}

export const pot: DeviceModel = {
  schema: potSchema,
  validate(part) {
    requirePositive(part, "track resistance", partValue(part), "Ω");
    const at = numberOption(part, potSchema, "at");
    if (!(at >= 0 && at <= 1)) {
      throw inputError("out-of-range", `pot ${part.name}: at=${at} is outside 0..1`, {
        span: part.span,
        hint: "at= is measured from end1: 0 puts the wiper on end1, 1 on end2 (end1 to wiper is at × the track on a linear taper)",
      });
    }
  },
  topology(part) {
    return {
      conducting: [
        [part.nodes[0]!, part.nodes[1]!],
        [part.nodes[1]!, part.nodes[2]!],
      ],
      voltageDefined: [],
    };
  },
  create(part, setup) {
    const e1 = setup.node(part.nodes[0]!);
    const w = setup.node(part.nodes[1]!);
    const e2 = setup.node(part.nodes[2]!);
    const [r1, r2] = segments(part);
    return {
      part,
      stampLinear(s) {
        stampConductance(s, e1, w, 1 / r1);
        stampConductance(s, w, e2, 1 / r2);
      },
      // Current entering end1 along the track towards the wiper.
      current(x) {
        return (valueAt(x, e1) - valueAt(x, w)) / r1;
      },
      // Each half of the track is a resistor of its own, with its own noise.
      noise: (kelvin) => [thermalCurrent(`${part.name}.end1`, r1, kelvin, e1, w), thermalCurrent(`${part.name}.end2`, r2, kelvin, w, e2)],
    };
  },
};

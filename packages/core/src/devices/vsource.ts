import type { PartKindSchema } from "../circuit/schema.js";
import { waveFromPart } from "../waves/from-part.js";
import type { DeviceModel } from "./device.js";
import { stampBranch } from "./stamps.js";
import { waveOptionSets } from "./waves-schema.js";

export const vsourceSchema: PartKindSchema = {
  kind: "vsource",
  summary: "independent voltage source: a DC level or a waveform",
  pins: ["plus", "minus"],
  value: { unit: "V", required: false, summary: "DC level (when no wave= is given)" },
  options: {
    wave: { type: "word", words: ["sine", "pulse", "steps", "noise"], summary: "waveform kind" },
  },
  variants: { key: "wave", sets: waveOptionSets("V") },
};

/** Branch current k flows from plus through the source to minus; row k: v(plus) − v(minus) = V(t). */
export const vsource: DeviceModel = {
  schema: vsourceSchema,
  // Building the wave checks what the schema cannot (pulse timing, the order of points).
  validate(part) {
    waveFromPart(part, vsourceSchema);
  },
  topology(part) {
    const pair = [part.nodes[0]!, part.nodes[1]!] as const;
    return { conducting: [pair], voltageDefined: [pair] };
  },
  create(part, setup) {
    const a = setup.node(part.nodes[0]!);
    const b = setup.node(part.nodes[1]!);
    const k = setup.addUnknown(`${part.name}.i`, "current", { role: "branch" });
    const wave = waveFromPart(part, vsourceSchema, setup.powerOn);
    return {
      part,
      stampLinear(s) {
        stampBranch(s, a, b, k);
      },
      source: {
        addSource(t, scale, u, left) {
          u[k] += scale * wave.value(t, left);
        },
        nextBreakpoint: (t) => wave.nextBreakpoint(t),
        quietAfter: wave.quietAfter,
      },
      current(x) {
        return x[k]!;
      },
    };
  },
};

import type { PartKindSchema } from "../circuit/schema.js";
import { waveFromPart } from "../waves/from-part.js";
import type { DeviceModel } from "./device.js";
import { waveOptionSets } from "./waves-schema.js";

export const isourceSchema: PartKindSchema = {
  kind: "isource",
  summary: "independent current source: drives current from `from` through the source to `to`",
  pins: ["from", "to"],
  value: { unit: "A", required: false, summary: "DC level (when no wave= is given)" },
  options: {
    wave: { type: "word", words: ["sine", "pulse", "steps", "noise"], summary: "waveform kind" },
  },
  variants: { key: "wave", sets: waveOptionSets("A") },
};

export const isource: DeviceModel = {
  schema: isourceSchema,
  // Building the wave checks what the schema cannot (pulse timing, the order of points).
  validate(part) {
    waveFromPart(part, isourceSchema);
  },
  topology() {
    return { conducting: [], voltageDefined: [] };
  },
  create(part, setup) {
    const from = setup.node(part.nodes[0]!);
    const to = setup.node(part.nodes[1]!);
    const wave = waveFromPart(part, isourceSchema, setup.powerOn);
    return {
      part,
      source: {
        addSource(t, scale, u, left) {
          const i = scale * wave.value(t, left);
          if (from >= 0) u[from] -= i;
          if (to >= 0) u[to] += i;
        },
        nextBreakpoint: (t) => wave.nextBreakpoint(t),
        quietAfter: wave.quietAfter,
      },
      current(_x, _dxdt, t) {
        return wave.value(t, false);
      },
    };
  },
};

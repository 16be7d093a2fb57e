import type { PartKindSchema } from "../circuit/schema.js";
import type { DeviceModel } from "./device.js";
import { partValue } from "./options.js";
import { stampTransconductance, valueAt } from "./stamps.js";

export const vccsSchema: PartKindSchema = {
  kind: "vccs",
  summary: "voltage-controlled current source: gm·(v(in+) − v(in−)) flows from out+ to out− through it",
  pins: ["out+", "out-", "in+", "in-"],
  value: { unit: "S", required: true, summary: "transconductance (A/V, siemens)" },
  options: {},
};

export const vccs: DeviceModel = {
  schema: vccsSchema,
  topology() {
    return { conducting: [], voltageDefined: [] };
  },
  create(part, setup) {
    const op = setup.node(part.nodes[0]!);
    const on = setup.node(part.nodes[1]!);
    const cp = setup.node(part.nodes[2]!);
    const cn = setup.node(part.nodes[3]!);
    const gm = partValue(part);
    const v = valueAt;
    return {
      part,
      stampLinear(s) {
        stampTransconductance(s, op, on, cp, cn, gm);
      },
      current(x) {
        return gm * (v(x, cp) - v(x, cn));
      },
    };
  },
};

import type { PartKindSchema } from "../circuit/schema.js";
import type { DeviceModel } from "./device.js";
import { partValue } from "./options.js";
import { stampBranch } from "./stamps.js";

export const vcvsSchema: PartKindSchema = {
  kind: "vcvs",
  summary: "voltage-controlled voltage source: v(out+) − v(out−) = gain·(v(in+) − v(in−))",
  pins: ["out+", "out-", "in+", "in-"],
  value: { unit: "1", required: true, summary: "voltage gain" },
  options: {},
};

export const vcvs: DeviceModel = {
  schema: vcvsSchema,
  topology(part) {
    const pair = [part.nodes[0]!, part.nodes[1]!] as const;
    return { conducting: [pair], voltageDefined: [pair] };
  },
  create(part, setup) {
    const op = setup.node(part.nodes[0]!);
    const on = setup.node(part.nodes[1]!);
    const cp = setup.node(part.nodes[2]!);
    const cn = setup.node(part.nodes[3]!);
    const k = setup.addUnknown(`${part.name}.i`, "current", { role: "branch" });
    const gain = partValue(part);
    return {
      part,
      stampLinear(s) {
        stampBranch(s, op, on, k);
        s.addG(k, cp, -gain);
        s.addG(k, cn, gain);
      },
      current(x) {
        return x[k]!;
      },
    };
  },
};

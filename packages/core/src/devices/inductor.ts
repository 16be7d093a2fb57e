import type { PartKindSchema } from "../circuit/schema.js";
import type { DeviceModel } from "./device.js";
import { numberOption, partValue, requirePositive } from "./options.js";
import { stampBranch } from "./stamps.js";
import { thermalVoltage } from "./thermal-noise.js";

export const inductorSchema: PartKindSchema = {
  kind: "inductor",
  summary: "inductor with optional winding resistance",
  pins: ["a", "b"],
  value: { unit: "H", required: true, min: 0, minExclusive: true, summary: "inductance" },
  options: {
    initial: { type: "number", unit: "A", default: 0, summary: "current a→b at the start of a run from rest" },
    series: { type: "number", unit: "Ω", default: 0, min: 0, summary: "winding resistance in series" },
  },
};

/**
 * Branch form: the unknown i (a→b) with v(a) − v(b) − R·i − d(L·i)/dt = 0, so at DC a bare
 * inductor is a short and its flux −L·i is the row's charge.
 */
export const inductor: DeviceModel = {
  schema: inductorSchema,
  validate(part) {
    requirePositive(part, "inductance", partValue(part), "H");
  },
  topology(part) {
    const pair = [part.nodes[0]!, part.nodes[1]!] as const;
    const series = numberOption(part, inductorSchema, "series");
    return { conducting: [pair], voltageDefined: series > 0 ? [] : [pair] };
  },
  create(part, setup) {
    const a = setup.node(part.nodes[0]!);
    const b = setup.node(part.nodes[1]!);
    const k = setup.addUnknown(`${part.name}.i`, "current", { role: "branch" });
    const l = partValue(part);
    const series = numberOption(part, inductorSchema, "series");
    const initial = numberOption(part, inductorSchema, "initial");
    return {
      part,
      stampLinear(s) {
        stampBranch(s, a, b, k);
        if (series > 0) s.addG(k, k, -series);
        s.addC(k, k, -l);
      },
      initialCharge(q) {
        q[k] = -l * initial;
      },
      current(x) {
        return x[k]!;
      },
      noise: series > 0 ? (kelvin) => [thermalVoltage(`${part.name}.series`, series, kelvin, k)] : undefined,
    };
  },
};

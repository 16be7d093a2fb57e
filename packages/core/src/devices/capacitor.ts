import type { PartSpec } from "../circuit/circuit.js";
import type { PartKindSchema } from "../circuit/schema.js";
import type { DeviceModel } from "./device.js";
import { numberOption, partValue, requirePositive } from "./options.js";
import { stampCapacitance, valueAt } from "./stamps.js";

export const capacitorSchema: PartKindSchema = {
  kind: "capacitor",
  summary: "linear capacitor",
  pins: ["a", "b"],
  value: { unit: "F", required: true, min: 0, minExclusive: true, summary: "capacitance" },
  options: {
    initial: { type: "number", unit: "V", default: 0, summary: "voltage a−b at the start of a run from rest" },
  },
};

export const capacitor: DeviceModel = {
  schema: capacitorSchema,
  validate(part) {
    requirePositive(part, "capacitance", partValue(part), "F");
  },
  topology() {
    return { conducting: [], voltageDefined: [] };
  },
  create(part: PartSpec, setup) {
    const a = setup.node(part.nodes[0]!);
    const b = setup.node(part.nodes[1]!);
    const c = partValue(part);
    const initial = numberOption(part, capacitorSchema, "initial");
    return {
      part,
      stampLinear(s) {
        stampCapacitance(s, a, b, c);
      },
      initialCharge(q) {
        if (a >= 0) q[a] += c * initial;
        if (b >= 0) q[b] -= c * initial;
      },
      current(_x, dxdt) {
        return c * (valueAt(dxdt, a) - valueAt(dxdt, b));
      },
    };
  },
};

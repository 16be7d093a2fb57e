import type { PartSpec } from "../circuit/circuit.js";
import type { PartKindSchema } from "../circuit/schema.js";
import type { DeviceModel } from "./device.js";
import { partValue, requirePositive } from "./options.js";
import { stampConductance, valueAt } from "./stamps.js";
import { thermalCurrent } from "./thermal-noise.js";

export const resistorSchema: PartKindSchema = {
  kind: "resistor",
  summary: "linear resistor",
  pins: ["a", "b"],
  value: { unit: "Ω", required: true, min: 0, minExclusive: true, summary: "resistance" },
  options: {},
};

export const resistor: DeviceModel = {
  schema: resistorSchema,
  validate(part) {
    requirePositive(part, "resistance", partValue(part), "Ω");
  },
  topology(part: PartSpec) {
    return { conducting: [[part.nodes[0]!, part.nodes[1]!]], voltageDefined: [] };
  },
  create(part, setup) {
    const a = setup.node(part.nodes[0]!);
    const b = setup.node(part.nodes[1]!);
    const g = 1 / partValue(part);
    return {
      part,
      stampLinear(s) {
        stampConductance(s, a, b, g);
      },
      current(x) {
        return (valueAt(x, a) - valueAt(x, b)) * g;
      },
      noise: (kelvin) => [thermalCurrent(part.name, 1 / g, kelvin, a, b)],
    };
  },
};

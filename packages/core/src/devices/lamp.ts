import { inputError } from "../circuit/diagnostic.js";
import type { PartKindSchema } from "../circuit/schema.js";
import type { DeviceModel } from "./device.js";

export const lampSchema: PartKindSchema = {
  kind: "lamp",
  summary: "electro-thermal amplitude stabiliser (accepted by the language; the engine model is planned)",
  pins: ["a", "b"],
  value: { unit: "Ω", required: true, min: 0, minExclusive: true, summary: "cold resistance" },
  options: {
    hot: { type: "number", unit: "Ω", min: 0, minExclusive: true, summary: "hot resistance" },
    tau: { type: "number", unit: "s", min: 0, minExclusive: true, summary: "thermal time constant" },
  },
  planned: true,
};

export const lamp: DeviceModel = {
  schema: lampSchema,
  topology(part) {
    return { conducting: [[part.nodes[0]!, part.nodes[1]!]], voltageDefined: [] };
  },
  create(part) {
    throw inputError("not-simulated", `lamp ${part.name}: the lamp model is not simulated yet`, {
      span: part.span,
      hint: "the language accepts lamp parts so files can be checked; use a diode limiter to simulate",
    });
  },
};

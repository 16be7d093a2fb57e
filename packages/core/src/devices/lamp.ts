import type { PartSpec } from "../circuit/circuit.js";
import { inputError } from "../circuit/diagnostic.js";
import type { PartKindSchema } from "../circuit/schema.js";
import type { DeviceModel } from "./device.js";
import { heatedResistorDevice, heatedResistorTopology, type ConductanceState, type ResistanceLaw, type ThermalNetwork } from "./heated-resistor.js";
import { numberOption, partValue, requirePositive } from "./options.js";

export const lampSchema: PartKindSchema = {
  kind: "lamp",
  summary: "filament lamp: a tungsten resistance heated by its own dissipation (electro-thermal amplitude stabiliser)",
  pins: ["a", "b"],
  value: { unit: "Ω", required: true, min: 0, minExclusive: true, summary: "cold resistance, at the ambient" },
  options: {
    hot: { type: "number", unit: "Ω", min: 0, minExclusive: true, summary: "hot resistance, with the rated voltage across it (above the cold resistance)" },
    rated: { type: "number", unit: "V", min: 0, minExclusive: true, summary: "rated voltage, at which the resistance is hot=" },
    tau: { type: "number", unit: "s", min: 0, minExclusive: true, summary: "thermal time constant: a step of power reaches 63 % of its temperature rise in tau" },
  },
  states: {
    temperature: { quantity: "temperature", summary: "the filament temperature (K)" },
  },
};

/** Tungsten's resistance grows as the filament temperature to this power (common practice; docs/references.md §12.1). */
export const TUNGSTEN_EXPONENT = 1.2;

/** R = cold·(θ/θ_amb)^1.2, as a conductance and its slope. */
class TungstenLaw implements ResistanceLaw {
  constructor(
    private readonly cold: number,
    private readonly ambient: number,
  ) {}

  conductanceAt(kelvin: number, out: ConductanceState): void {
    const g = Math.pow(kelvin / this.ambient, -TUNGSTEN_EXPONENT) / this.cold;
    out.conductance = g;
    out.slope = (-TUNGSTEN_EXPONENT * g) / kelvin;
  }
}

/** The lamp's constants as written: cold and hot resistance (Ω), rated voltage (V), thermal time constant (s). */
export interface LampConstants {
  readonly cold: number;
  readonly hot: number;
  readonly rated: number;
  readonly tau: number;
}

/**
 * The thermal network behind (cold, hot, rated, tau) at ambient θ_amb: the hot filament is at
 * θ_hot = θ_amb·(hot/cold)^(1/1.2); it dissipates rated²/hot there, so
 * R_th = (θ_hot − θ_amb)/(rated²/hot), and C_th = tau/R_th.
 */
export function lampNetwork(k: LampConstants, ambient: number): ThermalNetwork {
  const hotTemperature = ambient * Math.pow(k.hot / k.cold, 1 / TUNGSTEN_EXPONENT);
  const resistance = (hotTemperature - ambient) / ((k.rated * k.rated) / k.hot);
  return { resistance, capacity: k.tau / resistance, ambient };
}

/** Reads a lamp part's constants (schema defaults filled in). */
export function lampConstants(part: PartSpec): LampConstants {
  return {
    cold: partValue(part),
    hot: numberOption(part, lampSchema, "hot"),
    rated: numberOption(part, lampSchema, "rated"),
    tau: numberOption(part, lampSchema, "tau"),
  };
}

export const lamp: DeviceModel = {
  schema: lampSchema,
  validate(part) {
    const k = lampConstants(part);
    requirePositive(part, "cold resistance", k.cold, "Ω");
    requirePositive(part, "hot resistance", k.hot, "Ω");
    requirePositive(part, "rated voltage", k.rated, "V");
    requirePositive(part, "thermal time constant", k.tau, "s");
    if (!(k.hot > k.cold)) {
      throw inputError("out-of-range", `lamp ${part.name}: the hot resistance (${k.hot} Ω) must exceed the cold resistance (${k.cold} Ω)`, {
        span: part.span,
        hint: "a filament's resistance rises as it heats: hot= is typically 5 to 15 times the cold value",
      });
    }
  },
  topology: heatedResistorTopology,
  create(part, setup) {
    const k = lampConstants(part);
    return heatedResistorDevice(part, setup, new TungstenLaw(k.cold, setup.ambient), lampNetwork(k, setup.ambient));
  },
};

import type { PartSpec } from "../circuit/circuit.js";
import type { PartKindSchema } from "../circuit/schema.js";
import type { DeviceModel } from "./device.js";
import { heatedResistorDevice, heatedResistorTopology, type ConductanceState, type ResistanceLaw, type ThermalNetwork } from "./heated-resistor.js";
import { numberOption, partValue, requirePositive } from "./options.js";
import { ZERO_CELSIUS } from "./thermal-noise.js";

export const thermistorSchema: PartKindSchema = {
  kind: "thermistor",
  summary: "NTC thermistor (B-parameter law) heated by its own dissipation",
  pins: ["a", "b"],
  value: { unit: "Ω", required: true, min: 0, minExclusive: true, summary: "resistance at 25 °C" },
  options: {
    beta: { type: "number", unit: "K", min: 0, minExclusive: true, summary: "B constant (K), written as a bare number" },
    dissipation: { type: "number", unit: "W/K", min: 0, minExclusive: true, summary: "dissipation constant: the power that holds the body 1 K above the ambient" },
    tau: { type: "number", unit: "s", min: 0, minExclusive: true, summary: "thermal time constant: a step of power reaches 63 % of its temperature rise in tau" },
  },
  states: {
    temperature: { quantity: "temperature", summary: "the body temperature (K)" },
  },
};

/** 25 °C, where the B-parameter law is anchored. */
export const REFERENCE_TEMPERATURE = 25 + ZERO_CELSIUS;

/** R = R25·exp(B·(1/θ − 1/298.15 K)), as a conductance and its slope (docs/references.md §12.2). */
class BetaLaw implements ResistanceLaw {
  constructor(
    private readonly r25: number,
    private readonly beta: number,
  ) {}

  conductanceAt(kelvin: number, out: ConductanceState): void {
    const g = Math.exp(-this.beta * (1 / kelvin - 1 / REFERENCE_TEMPERATURE)) / this.r25;
    out.conductance = g;
    out.slope = (g * this.beta) / (kelvin * kelvin);
  }
}

/** The thermistor's constants as written: R25 (Ω), B (K), dissipation constant (W/K), thermal time constant (s). */
export interface ThermistorConstants {
  readonly r25: number;
  readonly beta: number;
  readonly dissipation: number;
  readonly tau: number;
}

/** Reads a thermistor part's constants. */
export function thermistorConstants(part: PartSpec): ThermistorConstants {
  return {
    r25: partValue(part),
    beta: numberOption(part, thermistorSchema, "beta"),
    dissipation: numberOption(part, thermistorSchema, "dissipation"),
    tau: numberOption(part, thermistorSchema, "tau"),
  };
}

/** R_th = 1/D and C_th = tau·D, as datasheets define D and tau. */
export function thermistorNetwork(k: ThermistorConstants, ambient: number): ThermalNetwork {
  return { resistance: 1 / k.dissipation, capacity: k.tau * k.dissipation, ambient };
}

export const thermistor: DeviceModel = {
  schema: thermistorSchema,
  validate(part) {
    const k = thermistorConstants(part);
    requirePositive(part, "resistance at 25 °C", k.r25, "Ω");
    requirePositive(part, "B constant", k.beta, "K");
    requirePositive(part, "dissipation constant", k.dissipation, "W/K");
    requirePositive(part, "thermal time constant", k.tau, "s");
  },
  topology: heatedResistorTopology,
  create(part, setup) {
    const k = thermistorConstants(part);
    return heatedResistorDevice(part, setup, new BetaLaw(k.r25, k.beta), thermistorNetwork(k, setup.ambient));
  },
};

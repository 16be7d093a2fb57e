import type { DeviceModel } from "./device.js";
import { capacitor } from "./capacitor.js";
import { diode } from "./diode.js";
import { inductor } from "./inductor.js";
import { isource } from "./isource.js";
import { lamp } from "./lamp.js";
import { jfet } from "./jfet.js";
import { thermistor } from "./thermistor.js";
import { opamp, opampPresets } from "./opamp.js";
import { pot } from "./pot.js";
import { resistor } from "./resistor.js";
import { vccs } from "./vccs.js";
import { vcvs } from "./vcvs.js";
import { vsource } from "./vsource.js";
import type { OptionValue } from "../circuit/circuit.js";
import type { PartKindSchema } from "../circuit/schema.js";

/** Every part kind the language and the engine know; adding a device adds one line here. */
export const deviceModels: Readonly<Record<string, DeviceModel>> = {
  resistor,
  capacitor,
  inductor,
  pot,
  diode,
  vsource,
  isource,
  vcvs,
  vccs,
  opamp,
  lamp,
  thermistor,
  jfet,
};

/** The schema of every part kind, by kind. */
export const partKinds: Readonly<Record<string, PartKindSchema>> = Object.fromEntries(
  Object.entries(deviceModels).map(([kind, model]) => [kind, model.schema]),
);

/** Built-in presets by part kind, then by preset name. */
export const builtinPresets: Readonly<Record<string, Readonly<Record<string, Readonly<Record<string, OptionValue>>>>>> = {
  opamp: opampPresets,
};

import { opampPresets, type PartSpec } from "@onset/core";
import { part } from "./circuits.js";

/**
 * A parallel tank L ∥ C ∥ R at node v held by a non-inverting stage of gain 3 whose output,
 * clipped at ±1 V by a near-ideal amplifier, feeds the tank through Rfb: a negative conductance
 * 2/Rfb against the tank's loss 1/R. By default 1 mH, 100 nF, 100 kΩ (Q = 1000) and 40 kΩ: 15.92 kHz.
 */
export function clippedTank(R = 100e3, L = 1e-3, C = 100e-9, Rfb = 40e3): PartSpec[] {
  return [
    part("inductor", "L1", ["v", "gnd"], L),
    part("capacitor", "C1", ["v", "gnd"], C),
    part("resistor", "R1", ["v", "gnd"], R),
    part("opamp", "U1", ["v", "n", "o"], undefined, { ...opampPresets.ideal, rails: [-1, 1] }),
    part("resistor", "Rf", ["o", "n"], 2e3),
    part("resistor", "Rg", ["n", "gnd"], 1e3),
    part("resistor", "Rfb", ["o", "v"], Rfb),
  ];
}

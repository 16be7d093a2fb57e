/**
 * The values of a JFET-held Wien bridge (gain 1 + Rf/(Rs + r_on), r_on the channel set by the
 * gate) whose peak detector charges through Rk into Cf, bled by Rb; written as in a file (`6.8k`).
 */
export interface DetectorWien {
  readonly R: string;
  readonly C: string;
  readonly Rf: string;
  readonly Rs: string;
  readonly idss: string;
  readonly pinchoff: string;
  /** Each of the two resistors that feed half the drain–source voltage to the gate. */
  readonly Rgate: string;
  readonly Rk: string;
  readonly Cf: string;
  readonly Rb: string;
  readonly rail: string;
}

/** The circuit's source text, its output at `o`. */
export function detectorWienSource(v: DetectorWien): string {
  return `param R = ${v.R}
param C = ${v.C}
resistor  R1 o s   (R)
capacitor C1 s p   (C)
resistor  R2 p gnd (R)
capacitor C2 p gnd (C)
resistor  Rf o n   ${v.Rf}
resistor  Rs n d   ${v.Rs}
jfet      J1 d g gnd idss=${v.idss} pinchoff=${v.pinchoff}
resistor  Ra d g   ${v.Rgate}
resistor  Rc c g   ${v.Rgate}
resistor  Rk k o   ${v.Rk}
diode     D1 c k
capacitor Cf c gnd ${v.Cf}
resistor  Rb c gnd ${v.Rb}
opamp     U1 p n o preset=general rails=(-${v.rail}, ${v.rail})
`;
}

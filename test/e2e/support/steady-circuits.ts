// Circuits of our own for the steady analysis' acceptance checks (issue 15): values and
// scenarios unlike the examples'. Each comment gives what an independent source says of it.

/**
 * A parallel tank L = 2.2 mH ∥ C = 47 nF ∥ R = 216 kΩ (Q = R·√(C/L) ≈ 1000) fed through Rfb from
 * a non-inverting stage of gain 3 around the ideal op-amp preset clipping at ±2 V: a negative
 * conductance 2/Rfb against the tank's loss 1/R. Closed form: ω₀ = 1/√(LC) (15.651 kHz); the
 * clip's harmonics see the tank's impedance cut by about Q·(n − 1/n), so they move the frequency
 * by a part in ~Q² (Groszkowski 1933).
 */
export const LC_CLIP = `title "LC tank held by an ideal clip, Q 1000"
inductor  L1  v  gnd  2.2m
capacitor C1  v  gnd  47n
resistor  R1  v  gnd  216k
opamp     U1  v  n    o    preset=ideal rails=(-2, 2)
resistor  Rf  o  n    2k
resistor  Rg  n  gnd  1k
resistor  Rfb o  v    68k
poles
steady probe=v
`;

/**
 * A three-section C–R ladder (C = 22 nF, R = 4.7 kΩ, the last R into the virtual ground of an
 * inverting stage of gain 30, threshold 29) around the ideal op-amp preset clipping at ±5 V.
 * Its state equations with an ideal clip are test/support/clipped-oscillators.ts' ladderReference.
 */
export const LADDER_CLIP = `title "C-R ladder held by an ideal clip, gain 30"
param R = 4.7k
param C = 22n
capacitor C1 o a   (C)
resistor  R1 a gnd (R)
capacitor C2 a b   (C)
resistor  R2 b gnd (R)
capacitor C3 b c   (C)
resistor  R3 c n   (R)
resistor  Rf n o   (30*R)
opamp     U1 gnd n o preset=ideal rails=(-5, 5)
poles
steady probe=o
`;

/** A series R–L–C (47 Ω, 4.7 mH with 3 Ω, 220 nF) driven by a ±1 V square of period 333.333 µs. */
export const SQUARE_RLC = `title "Series RLC driven by a 3 kHz square"
vsource   V1 in gnd wave=pulse low=-1 high=1 rise=1u fall=1u width=165.6665u period=333.333u
resistor  Rd in a   47
inductor  L1 a  o   4.7m series=3
capacitor C1 o  gnd 220n
steady probe=o
`;

/** A 1.5 V, 750 Hz sine into R = 2.2 kΩ, C = 100 nF: closed form |v_o| = 1.5/√(1 + (ωRC)²), no harmonics. */
export const SINE_RC = `title "RC low-pass driven by a pure 750 Hz sine"
vsource   V1 in gnd wave=sine amp=1.5 freq=750
resistor  R1 in o   2.2k
capacitor C1 o  gnd 100n
steady probe=o
`;

/**
 * A Wien bridge (5.6 kΩ, 10 nF) whose gain 1 + Rf/R_lamp is set by a lamp (cold 120 Ω: gain 4.9;
 * hot 900 Ω at 10 V; τ = 40 ms). It settles where R_lamp = Rf/2 = 235 Ω; the lamp's thermal
 * balance there gives the amplitude in closed form (see lampAmplitude).
 */
export const LAMP_WIEN = `title "Lamp-stabilised Wien, 2.8 kHz, tau 40 ms"
param R = 5.6k
param C = 10n
resistor  R1 o s   (R)±1%
capacitor C1 s p   (C)±2%
resistor  R2 p gnd (R)±1%
capacitor C2 p gnd (C)±2%
resistor  Rf o n   470±1%
lamp      L1 n gnd 120 hot=900 rated=10 tau=40m
opamp     U1 p n o preset=general rails=(-12, 12)
`;

/**
 * A Wien bridge (4.02 kΩ, 100 nF, about 395 Hz) whose gain 1 + R_th/Rg is set by an NTC bead
 * (4.7 kΩ at 25 °C, B = 3300 K, 60 µW/K, τ = 0.5 s) over Rg = 2 kΩ. It settles where
 * R_th = 2·Rg = 4 kΩ; the bead's thermal balance gives the amplitude (see thermistorAmplitude).
 */
export const THERMISTOR_WIEN = `title "Thermistor-stabilised Wien, 395 Hz, tau 0.5 s"
param R = 4.02k
param C = 100n
resistor   R1  o s   (R)±1%
capacitor  C1  s p   (C)±2%
resistor   R2  p gnd (R)±1%
capacitor  C2  p gnd (C)±2%
thermistor TH1 o n   4.7k beta=3300 dissipation=60uW/K tau=0.5
resistor   Rg  n gnd 2k±1%
opamp      U1  p n o preset=general rails=(-15, 15)
`;

/** A Wien bridge (22 kΩ, 3.3 nF, about 2.2 kHz) whose gain falls as back-to-back diodes across Rf2 conduct. */
export const DIODE_WIEN = `title "Wien with back-to-back diodes, 2.2 kHz"
param R = 22k
param C = 3.3n
resistor  R1  o s   (R)±1%
capacitor C1  s p   (C)±5%
resistor  R2  p gnd (R)±1%
capacitor C2  p gnd (C)±5%
resistor  Rg  n gnd 4.7k±1%
resistor  Rf1 n f   6.8k±1%
resistor  Rf2 f o   3.3k±1%
diode     D1  f o
diode     D2  o f
opamp     U1  p n o preset=general rails=(-12, 12)
`;

/** The same Wien bridge with a gain of 1 + 18k/10k = 2.8, below the 3 it needs: its poles decay. */
export const QUIET_WIEN = `title "Wien below threshold (gain 2.8)"
param R = 8.2k
param C = 22n
resistor  R1 o s   (R)
capacitor C1 s p   (C)
resistor  R2 p gnd (R)
capacitor C2 p gnd (C)
resistor  Rf o n   18k
resistor  Rg n gnd 10k
opamp     U1 p n o preset=general rails=(-12, 12)
steady probe=o
`;

/**
 * A 120 kHz, 5 V sine into 50 Ω, 10 mH and a diode with 100 pF of junction capacitance: driven
 * hard, the varactor resonator period-doubles, so the orbit with the drive's period is unstable.
 */
export const DOUBLING_RESONATOR = `title "Driven diode resonator, 5 V"
vsource  V1 in gnd wave=sine amp=5 freq=120k
resistor R1 in a   50
inductor L1 a  k   10m
diode    D1 k  gnd junction=100p saturation=1n emission=1.5
`;

/** °C to K. */
const KELVIN = 273.15;

/**
 * The lamp's settled output amplitude (closed form from docs/language.md's lamp law): the Wien
 * needs gain 3, so R_lamp = Rf/2; R = cold·(θ/θ_amb)^1.2 gives θ; the thermal network
 * R_th = (θ_hot − θ_amb)·hot/rated² gives the power, P = (θ − θ_amb)/R_th; the lamp carries a
 * third of the output, so v_o,peak = 3·√(2·P·R_lamp).
 */
export function lampAmplitude(rf: number, cold: number, hot: number, rated: number, ambientC = 27): number {
  const ambient = ambientC + KELVIN;
  const thetaHot = ambient * (hot / cold) ** (1 / 1.2);
  const rth = ((thetaHot - ambient) * hot) / rated ** 2;
  const r = rf / 2;
  const theta = ambient * (r / cold) ** (1 / 1.2);
  return 3 * Math.sqrt(2 * ((theta - ambient) / rth) * r);
}

/**
 * The thermistor's settled output amplitude: R_th = 2·Rg for gain 3; the B law
 * R = R25·exp(B·(1/θ − 1/298.15 K)) gives θ; P = D·(θ − θ_amb); the bead carries two thirds of
 * the output, so v_o,peak = 1.5·√(2·P·R_th).
 */
export function thermistorAmplitude(rg: number, r25: number, beta: number, dissipation: number, ambientC = 27): number {
  const ambient = ambientC + KELVIN;
  const r = 2 * rg;
  const theta = 1 / (1 / (25 + KELVIN) + Math.log(r / r25) / beta);
  return 1.5 * Math.sqrt(2 * dissipation * (theta - ambient) * r);
}

/**
 * A Wien bridge (3.16 kΩ, 10 nF, about 4.9 kHz) whose gain 1 + Rf/(Rs + r_channel) is held by a
 * JFET, its gate fed from a peak detector D1 into Cfil = 47 nF, bled by Rb = 470 kΩ. So small a
 * capacitor is recharged by most of each peak's error: the detector over-corrects period by period.
 */
export const JFET_FAST_DETECTOR = `title "JFET-held Wien, 47 nF detector"
param R = 3.16k
param C = 10n
resistor  R1   o s   (R)
capacitor C1   s p   (C)
resistor  R2   p gnd (R)
capacitor C2   p gnd (C)
resistor  Rf   o n   15k
resistor  Rs   n d   5.6k
jfet      J1   d g   gnd idss=5m pinchoff=-2
resistor  Ra   d g   330k
resistor  Rc   c g   330k
diode     D1   c o
capacitor Cfil c gnd 47n
resistor  Rb   c gnd 470k
opamp     U1   p n o preset=general rails=(-12, 12)
`;

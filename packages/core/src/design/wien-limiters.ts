import { DEFAULT_AMBIENT } from "../solver/system.js";
import { lampNetwork, TUNGSTEN_EXPONENT } from "../devices/lamp.js";
import { REFERENCE_TEMPERATURE } from "../devices/thermistor.js";
import { writeValue } from "./choose.js";
import { checkPositive, finiteResult } from "./design-arguments.js";
import { E_SERIES, snapToSeries, type SeriesName } from "./eseries.js";
import { CAPACITOR_TOLERANCE, opampLine, RESISTOR_TOLERANCE, type Line, type Sizing } from "./sizing.js";

/** How a designed Wien bridge holds its amplitude. */
export type AmplitudeLimit = "diodes" | "lamp" | "thermistor" | "jfet";

/** The amplitude controls `onset design wien --limit` offers. */
export const AMPLITUDE_LIMITS: readonly AmplitudeLimit[] = ["diodes", "lamp", "thermistor", "jfet"];

/** What the Wien sizing needs from the request. */
export interface WienRequest {
  readonly frequency: number;
  readonly capacitor: number;
  readonly series: SeriesName;
  readonly preset: string;
  readonly rails: readonly [number, number];
}

/** A small signal lamp (values of our own, typical of the class: common practice). */
export const DESIGN_LAMP = { cold: 100, hot: 1000, rated: 12, tau: 0.1 } as const;
/** A small NTC bead (values of our own, typical of the class: common practice); its tau is chosen per frequency. */
export const DESIGN_BEAD = { r25: 10e3, beta: 3500, dissipation: 40e-6 } as const;
/** A small-signal n-channel JFET (values of our own, typical of the class: common practice). */
export const DESIGN_JFET = { idss: 8e-3, pinchoff: -2.5 } as const;

/** The Wien network from o to p: series R1–C1, parallel R2 ∥ C2 to gnd. */
export function wienNetworkLines(r: number, c: number): Line[] {
  return [
    { kind: "resistor", name: "R1", nodes: ["o", "s"], value: r, tolerance: RESISTOR_TOLERANCE },
    { kind: "capacitor", name: "C1", nodes: ["s", "p"], value: c, tolerance: CAPACITOR_TOLERANCE },
    { kind: "resistor", name: "R2", nodes: ["p", "gnd"], value: r, tolerance: RESISTOR_TOLERANCE },
    { kind: "capacitor", name: "C2", nodes: ["p", "gnd"], value: c, tolerance: CAPACITOR_TOLERANCE },
  ];
}

/** Every value of `series` in [lo, hi], descending. */
function seriesBetween(lo: number, hi: number, series: SeriesName): number[] {
  const out: number[] = [];
  for (let decade = Math.floor(Math.log10(lo)); decade <= Math.ceil(Math.log10(hi)); decade++) {
    for (const m of E_SERIES[series]) {
      const v = Number((m * Math.pow(10, decade)).toPrecision(3));
      if (v >= lo && v <= hi) out.push(v);
    }
  }
  return out.sort((a, b) => b - a);
}

/** The largest settled peak the rails leave room for (V): 80 % of the smaller rail less the op-amp's headroom. */
function amplitudeRoom(rails: readonly [number, number]): number {
  return 0.8 * (Math.min(-rails[0], rails[1]) - 1.5);
}

/** Settled peak of a lamp-stabilised Wien bridge with Rf above the lamp (docs/references.md §12.4). */
export function lampWienAmplitude(rf: number, ambient = DEFAULT_AMBIENT): number {
  checkPositive("lampWienAmplitude", "rf", rf);
  checkPositive("lampWienAmplitude", "ambient", ambient);
  const rLamp = rf / 2;
  const theta = ambient * Math.pow(rLamp / DESIGN_LAMP.cold, 1 / TUNGSTEN_EXPONENT);
  const power = (theta - ambient) / lampNetwork(DESIGN_LAMP, ambient).resistance;
  // Below the lamp's cold resistance (or at an ambient the lamp cannot heat above) there is no settled amplitude.
  return finiteResult("lampWienAmplitude", 3 * Math.sqrt(2 * power * rLamp), `rf = ${rf} Ω and ambient = ${ambient} K`);
}

/** Settled peak of a thermistor-stabilised Wien bridge with the bead above Rg (docs/references.md §12.4). */
export function thermistorWienAmplitude(rg: number, ambient = DEFAULT_AMBIENT): number {
  checkPositive("thermistorWienAmplitude", "rg", rg);
  checkPositive("thermistorWienAmplitude", "ambient", ambient);
  const r = 2 * rg;
  const theta = 1 / (1 / REFERENCE_TEMPERATURE + Math.log(r / DESIGN_BEAD.r25) / DESIGN_BEAD.beta);
  return finiteResult("thermistorWienAmplitude", 1.5 * Math.sqrt(2 * DESIGN_BEAD.dissipation * (theta - ambient) * r), `rg = ${rg} Ω and ambient = ${ambient} K`);
}

const wienDescription = (how: string[]): string[] => [
  "Wien bridge: series R1–C1 and parallel R2∥C2 from the output to the non-inverting input;",
  "f = 1/(2πRC) and the bridge passes 1/3 there, so the amplifier needs a gain of 3.",
  ...how,
];

function lamp(req: WienRequest, r: number, c: number): Sizing {
  const { cold, hot, rated, tau } = DESIGN_LAMP;
  // Cold gain between 3.2 and 3.9 (under 4, where the bridge's poles turn real): the largest Rf
  // whose settled amplitude the rails leave room for.
  const room = amplitudeRoom(req.rails);
  const candidates = seriesBetween(2.2 * cold, 2.9 * cold, req.series);
  const rf = candidates.find((v) => lampWienAmplitude(v) <= room) ?? candidates[candidates.length - 1]!;
  const periods = tau * req.frequency;
  return {
    lines: [
      ...wienNetworkLines(r, c),
      { kind: "resistor", name: "Rf", nodes: ["o", "n"], value: rf, tolerance: RESISTOR_TOLERANCE },
      { kind: "lamp", name: "L1", nodes: ["n", "gnd"], value: cold, options: { hot, rated, tau }, comment: "settles at Rf/2, where the gain is 3" },
      opampLine(["p", "n", "o"], req.preset, req.rails),
    ],
    probe: "o",
    formulaFrequency: 1 / (2 * Math.PI * r * c),
    choices: [],
    gainNote: `cold gain 1 + Rf/${writeValue(cold)} = ${(1 + rf / cold).toFixed(2)}; settled with the lamp at Rf/2 = ${writeValue(rf / 2)}Ω, ${lampWienAmplitude(rf).toFixed(2)} V peak by the closed form`,
    thdLimit: periods >= 50 ? 0.001 : 0.01,
    description: wienDescription([
      `A filament lamp (${writeValue(cold)}Ω cold, ${writeValue(hot)}Ω at ${rated} V, tau ${writeValue(tau)}s) below Rf: as it warms the gain falls.`,
      ...(periods < 50 ? [`Its time constant is only ${periods.toFixed(0)} periods: the gain moves within each cycle, so expect more distortion (a thermistor suits low frequencies).`] : []),
    ]),
    until: 20 * tau,
    runs: 20,
  };
}

function thermistor(req: WienRequest, r: number, c: number): Sizing {
  const { r25, beta, dissipation } = DESIGN_BEAD;
  // About 400 periods, within the 0.3–3 s of small beads (from memory).
  const tau = Number(Math.min(3, Math.max(0.3, 400 / req.frequency)).toPrecision(2));
  const cold = r25 * Math.exp(beta * (1 / DEFAULT_AMBIENT - 1 / REFERENCE_TEMPERATURE));
  // Cold gain about 3.6 (under 4); a larger Rg lowers it and the amplitude when the rails ask.
  const room = amplitudeRoom(req.rails);
  const candidates = seriesBetween(cold / 2.8, cold / 2.1, req.series).reverse();
  const rg = candidates.find((v) => v >= cold / 2.6 && thermistorWienAmplitude(v) <= room) ?? candidates[candidates.length - 1]!;
  return {
    lines: [
      ...wienNetworkLines(r, c),
      { kind: "thermistor", name: "TH1", nodes: ["o", "n"], value: r25, options: { beta, dissipation, tau }, comment: "settles at 2·Rg, where the gain is 3" },
      { kind: "resistor", name: "Rg", nodes: ["n", "gnd"], value: rg, tolerance: RESISTOR_TOLERANCE },
      opampLine(["p", "n", "o"], req.preset, req.rails),
    ],
    probe: "o",
    formulaFrequency: 1 / (2 * Math.PI * r * c),
    choices: [],
    gainNote: `cold gain 1 + ${writeValue(cold)}/Rg = ${(1 + cold / rg).toFixed(2)} at 27 °C; settled with the bead at 2·Rg = ${writeValue(2 * rg)}Ω, ${thermistorWienAmplitude(rg).toFixed(2)} V peak by the closed form`,
    thdLimit: 0.001,
    description: wienDescription([
      `An NTC bead (${writeValue(r25)}Ω at 25 °C, B = ${beta} K, ${writeValue(dissipation)}W/K, tau ${writeValue(tau)}s) above Rg: as it warms the gain falls.`,
      "The loop is slow: the amplitude may overshoot, collapse and start again before it settles.",
    ]),
    until: 15 * tau,
    runs: 10,
  };
}

function jfet(req: WienRequest, r: number, c: number): Sizing {
  const { idss, pinchoff } = DESIGN_JFET;
  const rf = 10e3;
  const ron = (pinchoff * pinchoff) / (2 * idss * -pinchoff);
  // Gate at 0 V the gain is about 3.25, so the tone starts within tens of periods.
  const rs = snapToSeries(rf / 2.25 - ron, req.series);
  // The detector's filter: its ripple at f is the distortion, its time constant the loop's speed
  // (see examples/jfet-loop-filter.onset): 2 ms·kHz, 1 µF at 2 kHz, to the nearest E6 value.
  const cf = snapToSeries(2e-3 / req.frequency, "E6");
  return {
    lines: [
      ...wienNetworkLines(r, c),
      { kind: "resistor", name: "Rf", nodes: ["o", "n"], value: rf, tolerance: RESISTOR_TOLERANCE },
      { kind: "resistor", name: "Rs", nodes: ["n", "d"], value: rs, tolerance: RESISTOR_TOLERANCE, comment: "with the channel: the lower leg" },
      { kind: "jfet", name: "J1", nodes: ["d", "g", "gnd"], options: { idss, pinchoff } },
      { kind: "resistor", name: "Ra", nodes: ["d", "g"], value: 470e3, tolerance: RESISTOR_TOLERANCE, comment: "with Rc: half the drain swing on the gate cancels the square law's v²" },
      { kind: "resistor", name: "Rc", nodes: ["c", "g"], value: 470e3, tolerance: RESISTOR_TOLERANCE },
      { kind: "diode", name: "D1", nodes: ["c", "o"], comment: "charges Cf to the negative peaks" },
      { kind: "capacitor", name: "Cf", nodes: ["c", "gnd"], value: cf, tolerance: 0.1 },
      { kind: "resistor", name: "Rb", nodes: ["c", "gnd"], value: 1e6, tolerance: RESISTOR_TOLERANCE },
      opampLine(["p", "n", "o"], req.preset, req.rails),
    ],
    probe: "o",
    formulaFrequency: 1 / (2 * Math.PI * r * c),
    choices: [],
    gainNote: `gate at 0 V: gain 1 + Rf/(Rs + r_on) = ${(1 + rf / (rs + ron)).toFixed(2)} (r_on = ${writeValue(ron)}Ω); the detector drives the gate negative until the gain is 3`,
    thdLimit: 0.005,
    description: wienDescription([
      `A JFET (IDSS ${writeValue(idss)}A, VP ${pinchoff} V) in the lower leg as a voltage-controlled resistor, driven by a`,
      `peak detector D1–Cf–Rb on the output (Cf = ${writeValue(cf)}F: sweep it to trade distortion against settling).`,
    ]),
    until: 800 / req.frequency,
    runs: 20,
  };
}

/** A Wien bridge with R snapped and its amplitude held by a lamp, a thermistor or a JFET loop. */
export function wienLimited(req: WienRequest, limit: Exclude<AmplitudeLimit, "diodes">, r: number): Sizing {
  const c = req.capacitor;
  return limit === "lamp" ? lamp(req, r, c) : limit === "thermistor" ? thermistor(req, r, c) : jfet(req, r, c);
}

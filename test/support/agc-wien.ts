// A Wien-bridge oscillator whose gain is set by a slow loop built from plain parts: ideal
// amplifiers (vcvs), a diode used as a current-controlled resistor (its small-signal resistance
// nVt/I, the signal across it kept under a millivolt by a 1/1000 attenuator, its DC taken out by
// a matched replica), a peak detector and an RC filter whose time constant makes the envelope
// ring. Here as Onset parts, and as its state equations integrated by odex (Hairer & Wanner's
// Gragg–Bulirsch–Stoer extrapolation code) — no project code in the reference.
import { Solver } from "odex";
import type { PartSpec } from "@onset/core";
import { part } from "./circuits.js";

/** The loop's values: Wien R, C; the gain floor and the controlled share; the loop filter. */
export const AGC = { R: 10e3, C: 16e-9, floor: 2.9, span: 0.2, attenuation: 1e-3, Ra: 1e3, Cc: 10e-6, gm: 200e-6, Rs: 1e3, Cd: 100e-9, Rd: 20e3, Rf: 20e3 } as const;

/**
 * o = floor·p + (span/attenuation)·(b − bref), b the attenuated p across the diode's small-signal
 * resistance rd: the gain runs from `floor` (rd → 0, a large control current) to floor + span.
 */
export function agcWienParts(filterCapacitor: number): PartSpec[] {
  const a = AGC;
  return [
    part("resistor", "R1", ["o", "s"], a.R),
    part("capacitor", "C1", ["s", "p"], a.C),
    part("resistor", "R2", ["p", "gnd"], a.R),
    part("capacitor", "C2", ["p", "gnd"], a.C),
    part("vcvs", "E1", ["o", "m", "p", "gnd"], a.floor),
    part("vcvs", "E2", ["m", "gnd", "b", "bref"], a.span / a.attenuation),
    part("vcvs", "E3", ["att", "gnd", "p", "gnd"], a.attenuation),
    part("capacitor", "Ca", ["att", "ax"], a.Cc),
    part("resistor", "Ra", ["ax", "b"], a.Ra),
    part("diode", "Dv", ["b", "gnd"], undefined, { series: 0 }),
    part("capacitor", "Cr", ["rx", "gnd"], a.Cc),
    part("resistor", "Rr", ["rx", "bref"], a.Ra),
    part("diode", "Dr", ["bref", "gnd"], undefined, { series: 0 }),
    part("vccs", "G1", ["gnd", "b", "ctl", "gnd"], a.gm),
    part("vccs", "G2", ["gnd", "bref", "ctl", "gnd"], a.gm),
    part("diode", "Dd", ["o", "dx"], undefined, { series: 0 }),
    part("resistor", "Rs", ["dx", "det"], a.Rs),
    part("capacitor", "Cd", ["det", "gnd"], a.Cd),
    part("resistor", "Rd", ["det", "gnd"], a.Rd),
    part("resistor", "Rf", ["det", "ctl"], a.Rf),
    part("capacitor", "Cf", ["ctl", "gnd"], filterCapacitor),
  ];
}

// The diode's defaults (docs/language.md: saturation 2.5 nA, emission 1.8) and kT/q at 300.15 K
// with the SI 2019 constants (25.8649 mV); the 1 pS junction leak of the model is kept too.
const IS = 2.5e-9;
const NVT = 1.8 * ((1.380649e-23 * 300.15) / 1.602176634e-19);
const LEAK = 1e-12;
const diode = (v: number) => IS * Math.expm1(v / NVT) + LEAK * v;
const slope = (v: number) => (IS / NVT) * Math.exp(v / NVT) + LEAK;

/** The node voltage v solving (x − v)/R + I = diode(v) (one monotone equation: Newton from a safe start). */
function diodeNode(x: number, r: number, current: number): number {
  let v = Math.min(0.5, Math.max(-0.5, x));
  for (let k = 0; k < 200; k++) {
    const f = (x - v) / r + current - diode(v);
    const step = f / (1 / r + slope(v));
    // junction limiting: at most two nVt per step
    v += Math.max(-2 * NVT, Math.min(2 * NVT, step));
    if (Math.abs(step) < 1e-12 * NVT) break;
  }
  return v;
}

/** The state equations; y = [v(C1), p, v(Ca), v(Cr), det, ctl]. Returns dy/dt and the output o. */
function rhs(y: number[], filterCapacitor: number): { dy: number[]; o: number } {
  const a = AGC;
  const [vc1, p, vca, vcr, det, ctl] = y as [number, number, number, number, number, number];
  const att = a.attenuation * p;
  const ax = att - vca;
  const bias = a.gm * ctl;
  const b = diodeNode(ax, a.Ra, bias);
  const bref = diodeNode(vcr, a.Ra, bias);
  const o = a.floor * p + (a.span / a.attenuation) * (b - bref);
  const i1 = (o - p - vc1) / a.R;
  // the detector diode's voltage w: (o − w − det)/Rs = diode(w)
  const iDet = diode(diodeNode(o - det, a.Rs, 0));
  return {
    o,
    dy: [
      i1 / a.C,
      (i1 - p / a.R) / a.C,
      (ax - b) / a.Ra / a.Cc,
      (bref - vcr) / a.Ra / a.Cc,
      (iDet - det / a.Rd - (det - ctl) / a.Rf) / a.Cd,
      (det - ctl) / a.Rf / filterCapacitor,
    ],
  };
}

/** The output's per-cycle envelope (max − min)/2 between its rising zero crossings, and the cycle mid-times. */
export interface ReferenceEnvelope {
  readonly time: number[];
  readonly value: number[];
}

/** Integrates the loop from p = 1 mV to `until` and returns the output's per-cycle envelope. */
export function agcWienReference(filterCapacitor: number, until: number): ReferenceEnvelope {
  const solver = new Solver(6);
  solver.relativeTolerance = 1e-9;
  solver.absoluteTolerance = 1e-12;
  solver.maxSteps = 1e7;
  solver.denseOutput = true;
  const y0 = [0, 1e-3, 0, 0, 0, 0];
  const dt = (2 * Math.PI * AGC.R * AGC.C) / 400;
  const samples: number[] = [];
  let next = 0;
  solver.solve((_x, y) => rhs(y, filterCapacitor).dy, 0, y0, until, (_n, _xOld, x, yNow, dense) => {
    while (next * dt <= x) {
      const y = dense ? y0.map((_, c) => dense(c, next * dt)) : yNow;
      samples.push(rhs(y, filterCapacitor).o);
      next++;
    }
  });
  const time: number[] = [];
  const value: number[] = [];
  let start = -1;
  let high = -Infinity;
  let low = Infinity;
  for (let k = 1; k < samples.length; k++) {
    high = Math.max(high, samples[k]!);
    low = Math.min(low, samples[k]!);
    if (samples[k - 1]! < 0 && samples[k]! >= 0) {
      const crossing = (k - 1 + -samples[k - 1]! / (samples[k]! - samples[k - 1]!)) * dt;
      if (start >= 0) {
        time.push(0.5 * (start + crossing));
        value.push(0.5 * (high - low));
      }
      start = crossing;
      high = -Infinity;
      low = Infinity;
    }
  }
  return { time, value };
}

import { checkAnalysis, checkAnalysisFields, checkCircuit, checkOptions } from "../circuit/arguments.js";
import { responseOptions } from "./kinds/response-options.js";
import type { Circuit, Probe, ResponseAnalysis } from "../circuit/circuit.js";
import { GROUND, probeName } from "../circuit/circuit.js";
import { inputError, simulationError } from "../circuit/diagnostic.js";
import type { QuantityUnit } from "../solver/quantities.js";
import { didYouMean } from "../circuit/suggest.js";
import { LuSolver } from "../solver/lu.js";
import { NewtonSolver } from "../solver/newton.js";
import { buildSystem, type MnaSystem } from "../solver/system.js";
import { resolveTolerances } from "../solver/tolerances.js";
import { solveBias } from "./bias.js";
import { linearize, type SmallSignal } from "./linearize.js";
import { probeUnit, stateIndexOf } from "./probes.js";
import { fillPhasorMatrix } from "./phasor-matrix.js";
import type { RunOptions } from "./transient.js";
import { budgetOf, storedPointsError } from "./limits.js";

/** The small-signal response at one frequency: magnitude (also in dB) and unwrapped phase. */
export interface ResponsePoint {
  /** Hz */
  readonly frequency: number;
  /** |H| (V/V, or the probe's unit per unit source) */
  readonly magnitude: number;
  readonly magnitudeDb: number;
  /** Unwrapped phase in degrees. */
  readonly phase: number;
}

/** Where the phase crosses a multiple of 180°, refined between sweep points. */
export interface PhaseCrossing {
  /** The multiple of 180° crossed (0, −180, 180, −360, …). */
  readonly phase: number;
  readonly frequency: number;
  readonly magnitude: number;
  /** The response there as a real number (its sign tells in-phase or inverted). */
  readonly value: number;
}

/** What `runResponse` returns: the swept points, the deepest notch, phase crossings and −3 dB points. */
export interface ResponseResult {
  readonly analysis: "response";
  readonly from: string;
  readonly to: string;
  /** The unit of the probe (the response's magnitude is in this unit per unit of the source). */
  readonly unit: QuantityUnit;
  readonly points: readonly ResponsePoint[];
  /** The deepest interior minimum of |H|, refined, with its depth below the sweep's maximum. */
  readonly notch: { readonly frequency: number; readonly magnitude: number; readonly depthDb: number } | null;
  readonly phaseCrossings: readonly PhaseCrossing[];
  /** Frequencies where |H| crosses max|H|/√2 (the −3 dB points), refined. */
  readonly cutoffs: readonly number[];
}

/** Default sweep when the file gives none. */
export const RESPONSE_DEFAULTS = { start: 10, stop: 100e3, perDecade: 50 };

/** The unit small-signal excitation vector of an independent source. */
function excitation(system: MnaSystem, from: string): Float64Array {
  const b = new Float64Array(system.n);
  const device = system.deviceByName.get(from);
  if (!device || (device.part.kind !== "vsource" && device.part.kind !== "isource")) {
    const sources = [...system.deviceByName.values()].flatMap((d) => (d.part.kind === "vsource" || d.part.kind === "isource" ? [d.part.name] : []));
    throw inputError("bad-response-source", `response from='${from}' must name a vsource or isource${device ? "" : didYouMean(from, sources)}`, {
      hint: "the response is of the probe to a unit small signal at that source",
    });
  }
  if (device.part.kind === "vsource") {
    b[system.unknowns.findIndex((u) => u.label === `${from}.i`)] = 1;
  } else {
    const [a, c] = device.part.nodes as [string, string];
    if (a !== GROUND) b[system.nodeIndex.get(a)!] -= 1;
    if (c !== GROUND) b[system.nodeIndex.get(c)!] += 1;
  }
  return b;
}

/** Index weights so that the probe's phasor is Σ wᵢ·Xᵢ. */
function probeWeights(system: MnaSystem, probe: Probe): Float64Array {
  const w = new Float64Array(system.n);
  const add = (node: string, sign: number) => {
    if (node === GROUND) return;
    const i = system.stateIndex.get(node);
    if (i === undefined) throw inputError("unknown-node", `response to='${probeName(probe)}' names unknown node '${node}'${didYouMean(node, system.nodeIndex.keys())}`);
    w[i] += sign;
  };
  if (probe.kind === "state") w[stateIndexOf(system, probe)] = 1;
  else if (probe.kind === "node") add(probe.node, 1);
  else if (probe.kind === "difference") {
    add(probe.plus, 1);
    add(probe.minus, -1);
  } else {
    const k = system.unknowns.findIndex((u) => u.label === `${probe.part}.i`);
    if (k < 0) throw inputError("bad-response-probe", `response to='${probeName(probe)}': only branch currents of sources, inductors and VCVS can be probed here`);
    w[k] = 1;
  }
  return w;
}

/** Solves (G + jωC)·X = b as the real system [[G, −ωC], [ωC, G]]·[Xr; Xi] = [b; 0]. */
export class PhasorSolver {
  private readonly lu: LuSolver;
  private readonly m: Float64Array;
  private readonly rhs: Float64Array;
  private readonly x: Float64Array;
  constructor(
    private readonly ss: SmallSignal,
    b: Float64Array,
    private readonly w: Float64Array,
  ) {
    const n2 = 2 * ss.n;
    this.lu = new LuSolver(n2);
    this.m = new Float64Array(n2 * n2);
    this.rhs = new Float64Array(n2);
    this.rhs.set(b);
    this.x = new Float64Array(n2);
  }

  /** The probe's phasor [re, im] at frequency f (Hz). */
  at(f: number): [number, number] {
    const n = this.ss.n;
    const m = this.m;
    fillPhasorMatrix(this.ss, 2 * Math.PI * f, m, false);
    if (!this.lu.factor(m)) throw simulationError("singular-response", `the small-signal circuit is singular at ${f} Hz`);
    this.lu.solve(this.rhs, this.x);
    let re = 0;
    let im = 0;
    for (let i = 0; i < n; i++) {
      re += this.w[i]! * this.x[i]!;
      im += this.w[i]! * this.x[n + i]!;
    }
    return [re, im];
  }
}

const degrees = (re: number, im: number) => (Math.atan2(im, re) * 180) / Math.PI;

/** Brings `phase` within ±180° of `reference` by whole turns. */
function unwrapNear(phase: number, reference: number): number {
  return phase + 360 * Math.round((reference - phase) / 360);
}

/** Bisection in log-frequency for the point where g crosses zero between fa and fb. */
function bisect(g: (f: number) => number, fa: number, fb: number, ga: number): number {
  let lo = fa;
  let hi = fb;
  let glo = ga;
  for (let k = 0; k < 60; k++) {
    const mid = Math.sqrt(lo * hi);
    const gm = g(mid);
    if (gm === 0) return mid;
    if (gm > 0 === glo > 0) {
      lo = mid;
      glo = gm;
    } else hi = mid;
    if (hi / lo - 1 < 1e-13) break;
  }
  return Math.sqrt(lo * hi);
}

/** Golden-section search for the minimum of |H| in log-frequency. */
function goldenMinimum(mag: (f: number) => number, fa: number, fb: number): number {
  const r = (Math.sqrt(5) - 1) / 2;
  let a = Math.log(fa);
  let b = Math.log(fb);
  let c = b - r * (b - a);
  let d = a + r * (b - a);
  let mc = mag(Math.exp(c));
  let md = mag(Math.exp(d));
  for (let k = 0; k < 100 && b - a > 1e-14; k++) {
    if (mc < md) {
      b = d;
      d = c;
      md = mc;
      c = b - r * (b - a);
      mc = mag(Math.exp(c));
    } else {
      a = c;
      c = d;
      mc = md;
      d = a + r * (b - a);
      md = mag(Math.exp(d));
    }
  }
  return Math.exp((a + b) / 2);
}

/** Runs a `response` analysis: small-signal |H| and phase of `to` for a unit signal at `from`. */
export function runResponse(circuit: Circuit, analysis: ResponseAnalysis, options: RunOptions = {}): ResponseResult {
  checkCircuit("runResponse", circuit);
  checkAnalysis("runResponse", analysis, "response");
  checkAnalysisFields("runResponse", analysis as unknown as Readonly<Record<string, unknown>>, responseOptions);
  checkOptions("runResponse", options);
  const budget = budgetOf(options);
  const start = analysis.start ?? RESPONSE_DEFAULTS.start;
  const stop = analysis.stop ?? RESPONSE_DEFAULTS.stop;
  const perDecade = analysis.perDecade ?? RESPONSE_DEFAULTS.perDecade;
  if (!(start > 0 && stop > start)) {
    throw inputError("bad-sweep", `response needs 0 < start < stop, got start=${start} Hz, stop=${stop} Hz`, { span: analysis.span });
  }
  const count = Math.max(2, Math.round(Math.log10(stop / start) * perDecade) + 1);
  // Each point keeps four numbers; refused before the bias point, as a transient's length is.
  if (!(4 * count <= budget.maxStoredPoints)) {
    throw storedPointsError(
      budget.maxStoredPoints,
      4 * count,
      `the response from ${start} Hz to ${stop} Hz at ${perDecade} points per decade has ${count} frequency points (4 values each), more than the stored-points limit of ${budget.maxStoredPoints}; it was not started`,
      analysis.span,
    );
  }
  const system = buildSystem(circuit, options.extraParts);
  const solver = new NewtonSolver(system, resolveTolerances(options.tolerances));
  const bias = solveBias(system, solver, solver.tolerances);
  budget.refuseDense(system.n, "the response", analysis.span, 2 * system.n);
  const ss = linearize(system, bias.x);
  const phasor = new PhasorSolver(ss, excitation(system, analysis.from), probeWeights(system, analysis.to));
  const points: ResponsePoint[] = [];
  let previousPhase = 0;
  for (let k = 0; k < count; k++) {
    const f = start * Math.pow(stop / start, k / (count - 1));
    budget.check("in the response sweep");
    const [re, im] = phasor.at(f);
    const magnitude = Math.hypot(re, im);
    const phase = k === 0 ? degrees(re, im) : unwrapNear(degrees(re, im), previousPhase);
    previousPhase = phase;
    points.push({ frequency: f, magnitude, magnitudeDb: 20 * Math.log10(magnitude), phase });
  }
  const mag = (f: number) => Math.hypot(...phasor.at(f));
  // Phase crossings of multiples of 180°, refined on the continuous (unwrapped) phase.
  const phaseCrossings: PhaseCrossing[] = [];
  for (let k = 1; k < points.length; k++) {
    const a = points[k - 1]!;
    const b = points[k]!;
    const lo = Math.min(a.phase, b.phase);
    const hi = Math.max(a.phase, b.phase);
    for (let m = Math.ceil(lo / 180); m * 180 <= hi; m++) {
      const target = m * 180;
      if (target === a.phase && k > 1) continue;
      const g = (f: number) => {
        const [re, im] = phasor.at(f);
        return unwrapNear(degrees(re, im), a.phase) - target;
      };
      const f = a.phase === target ? a.frequency : bisect(g, a.frequency, b.frequency, a.phase - target);
      const [re, im] = phasor.at(f);
      phaseCrossings.push({ phase: target, frequency: f, magnitude: Math.hypot(re, im), value: Math.abs(re) >= Math.abs(im) ? re : im });
    }
  }
  // The deepest interior minimum, if it is a real dip.
  let notch: ResponseResult["notch"] = null;
  let maxMag = 0;
  for (const p of points) maxMag = Math.max(maxMag, p.magnitude);
  let kMin = -1;
  for (let k = 1; k < points.length - 1; k++) {
    const p = points[k]!;
    if (p.magnitude <= points[k - 1]!.magnitude && p.magnitude <= points[k + 1]!.magnitude && (kMin < 0 || p.magnitude < points[kMin]!.magnitude)) kMin = k;
  }
  if (kMin > 0) {
    const f = goldenMinimum(mag, points[kMin - 1]!.frequency, points[kMin + 1]!.frequency);
    const m = mag(f);
    if (m < maxMag / Math.SQRT2) notch = { frequency: f, magnitude: m, depthDb: 20 * Math.log10(maxMag / m) };
  }
  const level = maxMag / Math.SQRT2;
  const cutoffs: number[] = [];
  for (let k = 1; k < points.length; k++) {
    const a = points[k - 1]!;
    const b = points[k]!;
    if (a.magnitude - level > 0 !== b.magnitude - level > 0) cutoffs.push(bisect((f) => mag(f) - level, a.frequency, b.frequency, a.magnitude - level));
  }
  return { analysis: "response", from: analysis.from, to: probeName(analysis.to), unit: probeUnit(system, analysis.to), points, notch, phaseCrossings, cutoffs };
}

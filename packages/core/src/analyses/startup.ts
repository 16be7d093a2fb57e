import type { Circuit, PartSpec, Probe, StartupAnalysis } from "../circuit/circuit.js";
import { GROUND, probeName } from "../circuit/circuit.js";
import { inputError } from "../circuit/diagnostic.js";
import { opampConstants } from "../devices/opamp.js";
import { measureStartup, type StartupMetrics } from "../metrics/startup.js";
import { NewtonSolver } from "../solver/newton.js";
import { buildSystem, type MnaSystem } from "../solver/system.js";
import { DEFAULT_TOLERANCES } from "../solver/tolerances.js";
import { solveBias } from "./bias.js";
import { GrowableSeries } from "./growable.js";
import { linearize } from "./linearize.js";
import { dominantPair, pencilPoles, startsFrom, type Pole } from "./poles.js";
import { probeReader } from "./probes.js";
import { TransientStepper, type StepperStats } from "./stepper.js";
import type { RunOptions } from "./transient.js";
import { budgetOf } from "./limits.js";

/** The default r.m.s. kick current (A): tiny next to any signal, far above rounding. */
export const DEFAULT_KICK_LEVEL = 1e-9;
/** The kick lasts this many cycles of the predicted frequency. */
const KICK_CYCLES = 5;
/** Steps per predicted period when the file sets no max-step. */
const STEPS_PER_PERIOD = 100;
/** `until=auto`: the run stops at the latest after this many predicted periods… */
const AUTO_MAX_CYCLES = 4000;
/** …and looks at the verdict first after this many. */
const AUTO_FIRST_CYCLES = 60;
/** Frequency assumed when the linearised circuit has no complex poles (Hz). */
const FALLBACK_FREQUENCY = 1e3;

/** What the start-up run did, besides the metrics. */
export interface StartupRun {
  /** Simulated time (s). */
  readonly until: number;
  readonly maxStep: number;
  readonly kick: { readonly kind: "noise" | "none"; readonly level: number; readonly seed: number; readonly duration: number; readonly node: string };
  /** The linear prediction at the bias point, used to size the run. */
  readonly predicted: { readonly frequency: number | null; readonly growthRate: number | null; readonly starts: boolean };
  readonly solver: StepperStats;
}

/** What `runStartup` returns: the start-up metrics of the probe, how the run was made, and the waveform. */
export interface StartupResult extends StartupMetrics {
  readonly analysis: "startup";
  readonly probe: string;
  readonly run: StartupRun;
  /** The probe waveform at every accepted step (for plots and CSV). */
  readonly waveform: { readonly time: Float64Array; readonly values: Float64Array };
}

/** The node the kick current is injected into, and its return. */
function kickNodes(probe: Probe, circuit: Circuit): [string, string] {
  switch (probe.kind) {
    case "node":
      return [GROUND, probe.node];
    case "difference":
      return [probe.minus, probe.plus];
    case "current": {
      const p = circuit.parts.find((x) => x.name === probe.part);
      if (!p) throw inputError("unknown-part", `startup probe '${probeName(probe)}' names no part`);
      return [GROUND, p.nodes[0] === GROUND ? p.nodes[1]! : p.nodes[0]!];
    }
  }
}

/** The linear prediction at the bias point: dominant pole pair of the linearised loop. */
function predict(system: MnaSystem, x: Float64Array): { pole: Pole | null } {
  try {
    return { pole: dominantPair(pencilPoles(linearize(system, x))) };
  } catch {
    return { pole: null };
  }
}

/** Half the widest op-amp output range: the largest envelope the circuit could reach. */
function amplitudeLimit(circuit: Circuit): number | undefined {
  let limit: number | undefined;
  for (const p of circuit.parts) {
    if (p.kind !== "opamp" || p.options.supply !== undefined) continue;
    const k = opampConstants(p);
    const span = (k.rails[1] - k.rails[0]) / 2 - k.headroom;
    limit = Math.max(limit ?? 0, span);
  }
  return limit;
}

/**
 * Runs a `startup` analysis: the bias point, a deterministic excitation (a seeded noise current
 * into the probe node for the first few predicted cycles, or none), the transient to `until`
 * (or, with `until=auto`, on until the verdict is settled or clearly silent, within a bound),
 * then the start-up metrics of the probe waveform.
 */
export function runStartup(circuit: Circuit, analysis: StartupAnalysis, options: RunOptions = {}): StartupResult {
  const tolerances = { ...DEFAULT_TOLERANCES, ...options.tolerances };
  const budget = budgetOf(options);
  if (typeof analysis.until === "number") budget.refuseLength(analysis.until, "the start-up run", analysis.span);
  // The prediction comes from the circuit without the kick (the kick source is off at DC anyway).
  const plain = buildSystem(circuit, options.extraParts);
  const bias = solveBias(plain, new NewtonSolver(plain, tolerances), tolerances);
  const { pole } = predict(plain, bias.x);
  budget.check("after the bias point and poles");
  const f0 = pole && pole.imag > 0 ? pole.imag / (2 * Math.PI) : FALLBACK_FREQUENCY;
  const period = 1 / f0;
  const level = analysis.level ?? DEFAULT_KICK_LEVEL;
  const seed = analysis.seed ?? 1;
  const duration = KICK_CYCLES * period;
  const [from, to] = kickNodes(analysis.probe, circuit);
  const kickParts: PartSpec[] =
    analysis.kick === "noise"
      ? [
          {
            kind: "isource",
            name: "startup.kick",
            nodes: [from, to],
            options: { wave: "noise", rms: level, seed, corner: 4 * f0, stop: duration },
          },
        ]
      : [];
  const system = buildSystem(circuit, [...(options.extraParts ?? []), ...kickParts]);
  const maxStep = analysis.maxStep ?? period / STEPS_PER_PERIOD;
  const stepper = new TransientStepper(system, { start: "bias", maxStep, tolerances });
  const read = probeReader(system, analysis.probe);
  const time = new GrowableSeries(4096);
  const values = new GrowableSeries(4096);
  let steps = 0;
  stepper.observe((t, x, dxdt) => {
    time.push(t);
    values.push(read(x, dxdt, t));
    if (options.onProgress && ++steps % 4096 === 0) options.onProgress(t, typeof analysis.until === "number" ? analysis.until : NaN);
  });
  budget.watch(stepper, "the start-up run", analysis.span);
  // The kick's own peak response bounds what counts as silence.
  let kickPeak = 0;
  const restLevel = values.view()[0]!;
  const limit = amplitudeLimit(circuit);
  const measure = () => {
    const v = values.view();
    const t = time.view();
    if (kickPeak === 0) {
      for (let k = 0; k < t.length && t[k]! <= duration; k++) kickPeak = Math.max(kickPeak, Math.abs(v[k]! - restLevel));
    }
    return measureStartup(t, v, { noiseFloor: kickPeak, amplitudeLimit: limit });
  };
  let metrics: StartupMetrics;
  if (analysis.until === "auto") {
    const bound = AUTO_MAX_CYCLES * period;
    let target = AUTO_FIRST_CYCLES * period;
    if (pole && startsFrom(pole) && pole.real > 0) {
      // time to grow from the kick to a volt-scale envelope, then settle
      target = Math.max(target, Math.log((limit ?? 10) / Math.max(level * 1e3, 1e-9)) / pole.real + 30 * period);
    }
    target = Math.min(target, bound);
    for (;;) {
      stepper.advance(target);
      metrics = measure();
      const done =
        metrics.verdict === "settled" ||
        ((metrics.verdict === "silent" || metrics.verdict === "decaying") && target >= AUTO_FIRST_CYCLES * period) ||
        target >= bound;
      if (done) break;
      const extra = metrics.verdict === "growing" && metrics.suggestedExtraTime ? metrics.suggestedExtraTime : target;
      target = Math.min(bound, target + Math.max(extra, 20 * period));
      options.onProgress?.(stepper.t, target);
    }
  } else {
    stepper.advance(analysis.until);
    metrics = measure();
  }
  if (options.onProgress) options.onProgress(stepper.t, stepper.t);
  return {
    analysis: "startup",
    probe: probeName(analysis.probe),
    ...metrics,
    run: {
      until: stepper.t,
      maxStep,
      kick: { kind: analysis.kick, level: analysis.kick === "noise" ? level : 0, seed, duration: analysis.kick === "noise" ? duration : 0, node: to },
      predicted: {
        frequency: pole ? pole.imag / (2 * Math.PI) : null,
        growthRate: pole ? pole.real : null,
        starts: pole ? startsFrom(pole) : false,
      },
      solver: { ...stepper.stats },
    },
    waveform: { time: time.toArray(), values: values.toArray() },
  };
}

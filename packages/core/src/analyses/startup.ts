import { checkAnalysis, checkAnalysisFields, checkCircuit, checkOptions, checkSeconds } from "../circuit/arguments.js";
import { startupOptions } from "./kinds/startup-options.js";
import type { Circuit, Probe, StartupAnalysis, StartupKick } from "../circuit/circuit.js";
import { probeName } from "../circuit/circuit.js";
import { isOnsetError, type Diagnostic } from "../circuit/diagnostic.js";
import type { PowerOn, SourceTerm } from "../devices/device.js";
import { formatPercent, formatQuantity } from "../metrics/format.js";
import { probeFigures, type ProbeFigures } from "../metrics/probe-figures.js";
import { judgeStartup, type StartupJudgement, type StartupMetrics } from "../metrics/startup.js";
import { endsCollapsed, explainCutWatch, recordWatch, slowestTimeConstant } from "../metrics/restart-watch.js";
import { drivingFrequency, type LinearPrediction } from "../metrics/oscillation-kind.js";
import { NewtonSolver } from "../solver/newton.js";
import type { QuantityUnit } from "../solver/quantities.js";
import { buildSystem, withSources, type MnaSystem } from "../solver/system.js";
import { accuracyTolerances, resolveTolerances, type Tolerances } from "../solver/tolerances.js";
import { mergedGridNote, type NumericalError } from "../steady/refine.js";
import { NoiseBank } from "../waves/noise-bank.js";
import { solveBias } from "./bias.js";
import { defaultWarnings } from "./default-rails.js";
import { DEFAULT_TEMPERATURE, excitationSetup, firstCycleRms, periodicDrives, type Excitation } from "./excitation.js";
import { ZERO_CELSIUS } from "../devices/thermal-noise.js";
import { latchedAt, outputRange } from "./latch.js";
import { linearize, type SmallSignal } from "./linearize.js";
import { noiseLevel } from "./noise-level.js";
import { dominantPair, pencilPoles, startsFrom, type Pole } from "./poles.js";
import { isOrbitFailure, settledOrbit, type SettledOrbit } from "./settled-orbit.js";
import { orbitFigures } from "../steady/orbit-metrics.js";
import { judgedNode, probeOscillation, probeView, SETTLED_AT } from "./judged-node.js";
import { largestStateDrift } from "./state-drift.js";
import { probeReader, probeUnit, probeWeights } from "./probes.js";
import { TransientStepper, type StepperStats } from "./stepper.js";
import type { RunOptions } from "./transient.js";
import { watchOperation } from "./operating-check.js";
import { refuseShortWindow, refuseSparseRecord } from "./window-length.js";
import { budgetOf } from "./limits.js";
import { checkResolved, startupRecord } from "./startup-record.js";
import type { TailRecord } from "./tail-record.js";
import { sizingFrequency, stepPeriod } from "./run-sizing.js";
import { withoutAbsentFundamental, withoutBandHarmonics } from "./thd-none.js";

/** The default r.m.s. current of `kick=noise` (A): tiny next to any signal, far above rounding. */
export const DEFAULT_KICK_LEVEL = 1e-9;
/** The default excitation. */
export const DEFAULT_KICK: StartupKick = "thermal";
/** Steps per predicted period when the file sets no max-step. */
const STEPS_PER_PERIOD = 100;
/** `until=auto`: the run stops at the latest after this many predicted periods… */
export const AUTO_MAX_CYCLES = 4000;
/** …and looks at the verdict first after this many. */
const AUTO_FIRST_CYCLES = 60;
/** `until=auto` stops at once on these verdicts. */
const FINAL_VERDICTS: ReadonlySet<StartupMetrics["verdict"]> = new Set(["settled", "relaxation", "parasitic", "bouncing"]);
/** Frequency assumed when the linearised circuit has no complex poles and no periodic sources (Hz). */
const FALLBACK_FREQUENCY = 1e3;
/** THD counts harmonics 2 … this order unless `harmonics=` or `bandwidth=` says otherwise. */
export const DEFAULT_THD_ORDER = 30;
/**
 * …and never beyond this one, the largest `harmonics=` takes: `bandwidth=` far above the
 * frequency would otherwise ask for a spectrum of any size (1e300 Hz).
 */
export const MAX_THD_ORDER = 1000;
/** A measured frequency within this fraction of a periodic source's is that source's (a driven circuit). */
const DRIVE_MATCH = 1e-3;
/**
 * The peak a stationary noise of r.m.s. σ is taken to reach: the largest per-cycle envelope of
 * narrow-band Gaussian noise over thousands of cycles is about √(2 ln 4000)·σ ≈ 4.1σ (a Rayleigh
 * envelope), so an oscillation must pass 2 × 5σ to count.
 */
const NOISE_PEAK = 5;

/** What the start-up run did, besides the metrics. */
export interface StartupRun {
  /** Simulated time (s). */
  readonly until: number;
  readonly maxStep: number;
  readonly excitation: Excitation;
  /** The linear prediction at the bias point, used to size the run and to classify it. */
  readonly predicted: { readonly frequency: number | null; readonly growthRate: number | null; readonly starts: boolean; readonly realGrowth: boolean };
  readonly solver: StepperStats;
  /**
   * The node the outcome (verdict, start-up and settling times, when to stop) was judged at,
   * when that is not the probe: the one the growing mode swings most (see `judgedNode`).
   */
  readonly judgedAt?: string;
}

/** The start-up time over several noise seeds (`seeds=`): a noise-started oscillator's start-up is a distribution. */
export interface StartupTimeSpread {
  /** The seeds run, in order (the analysis's seed first). */
  readonly seeds: readonly number[];
  /** Each seed's start-up time (s), null where it did not settle. */
  readonly times: readonly (number | null)[];
  readonly min: number | null;
  readonly median: number | null;
  readonly max: number | null;
}

/** Where the settled figures come from, and how sure they are. */
export interface SettledFigures {
  /**
   * `orbit`: the periodic steady state next to the settled run, found by shooting on the run's
   * own step pattern and on it halved, and extrapolated in the step; `run`: the run's last
   * cycles (when no orbit was found, or the run did not settle).
   */
  readonly from: "orbit" | "run";
  /** Why the orbit was not used, when it was tried; with the orbit, that its grid merges the run's steps (stored-points bounds it), else null. */
  readonly note: string | null;
  /** Shooting iterations (periods integrated) on the two grids. */
  readonly iterations: readonly [number, number] | null;
  /** Grid points per period on the two grids. */
  readonly points: readonly [number, number] | null;
}

/** What `runStartup` returns: the start-up metrics of the probe, how the run was made, and the waveform. */
export interface StartupResult extends StartupMetrics {
  readonly analysis: "startup";
  /**
   * The estimated numerical error of each settled figure (absolute, in its own unit: Hz, the
   * probe's unit, a fraction for THD), from the difference between the two grids; null when the
   * figures come from the run.
   */
  readonly numericalError: NumericalError | null;
  /** The harmonic orders THD counts: [2, N]. */
  readonly thdOrders: readonly [number, number];
  readonly settled: SettledFigures;
  readonly probe: string;
  /** The unit of the probe's values, and so of amplitude, peak-to-peak, rms and offset. */
  readonly unit: QuantityUnit;
  readonly run: StartupRun;
  /** Things the designer should know about how the circuit was simulated (the default ±15 V rails). */
  readonly warnings: readonly Diagnostic[];
  /** With `seeds=N` (N > 1): the start-up time over N seeds. */
  readonly startupTimeSpread?: StartupTimeSpread;
  /**
   * The probe waveform (for plots and CSV): every accepted step, or on a run longer than
   * `limits.maxStoredPoints` allows, its last quarter of stored points at every step and every
   * 2nd, 4th, … step before them.
   */
  readonly waveform: { readonly time: Float64Array; readonly values: Float64Array };
}

/**
 * The linear prediction from the circuit linearised at its bias point: every pole, the dominant
 * pair. A pencil singular at every frequency tried (`singular-pencil`) has none, and the run goes
 * on without it; any other error is a fault and propagates.
 */
export function linearPrediction(ss: SmallSignal, check?: () => void): { poles: readonly Pole[]; pole: Pole | null; ok: boolean } {
  try {
    const poles = pencilPoles(ss, check);
    return { poles, pole: dominantPair(poles), ok: true };
  } catch (error) {
    if (!isOnsetError(error) || error.diagnostic.code !== "singular-pencil") throw error;
    return { poles: [], pole: null, ok: false };
  }
}

/** Half the widest op-amp output range: the largest envelope the circuit could reach. */
export function amplitudeLimit(system: MnaSystem, x: Float64Array): number | undefined {
  let limit: number | undefined;
  for (const d of system.devices) {
    const range = outputRange(system, d, x);
    if (range) limit = Math.max(limit ?? 0, (range[1] - range[0]) / 2);
  }
  return limit;
}

/** A source that adds nothing but has a corner: the end of the power-on ramp, landed on exactly. */
function corner(at: number): SourceTerm {
  return { addSource() {}, nextBreakpoint: (t) => (t < at ? at : Infinity) };
}

/**
 * Runs a `startup` analysis: the bias point and the linear prediction there, the excitation
 * (`kick=thermal`: every resistance's Johnson–Nyquist noise and every op-amp's input noise, for
 * the whole run; `power-on`: the same noise on a circuit whose DC levels rise from 0 over the
 * ramp; `noise`: a seeded current into the probe node for the first few predicted cycles;
 * `none`), the transient to `until` (or, with `until=auto`, on until the verdict is settled or
 * clearly silent, within a bound), then the start-up metrics of the probe waveform and the
 * outcome's class.
 */
export function runStartup(circuit: Circuit, analysis: StartupAnalysis, options: RunOptions = {}): StartupResult {
  checkCircuit("runStartup", circuit);
  checkAnalysis("runStartup", analysis, "startup");
  if (analysis.until !== "auto") checkSeconds("runStartup", "until", analysis.until);
  checkSeconds("runStartup", "maxStep", analysis.maxStep, true);
  checkAnalysisFields("runStartup", analysis as unknown as Readonly<Record<string, unknown>>, startupOptions);
  checkOptions("runStartup", options);
  const tolerances = resolveTolerances({ ...accuracyTolerances(analysis.accuracy, analysis.accuracyFloor), ...options.tolerances });
  const kick = analysis.kick ?? DEFAULT_KICK;
  const budget = budgetOf(options);
  if (typeof analysis.until === "number") budget.refuseLength(analysis.until, "the start-up run", analysis.span);
  // The prediction comes from the powered circuit without any excitation.
  const ambient = (analysis.temperature ?? DEFAULT_TEMPERATURE) + ZERO_CELSIUS;
  const plain = buildSystem(circuit, options.extraParts, { ambient });
  const bias = solveBias(plain, new NewtonSolver(plain, tolerances), tolerances);
  budget.refuseDense(plain.n, "the start-up run's linear prediction (the bias point's poles)", analysis.span);
  const { poles, pole, ok } = linearPrediction(linearize(plain, bias.x), () => budget.check("during the bias point's poles", analysis.span));
  budget.check("after the bias point and poles");
  const drives = periodicDrives(circuit);
  const f0 = sizingFrequency(pole, drives) ?? FALLBACK_FREQUENCY;
  const period = 1 / f0;
  const setup = excitationSetup(circuit, plain, analysis, kick, f0);
  const powerOn: PowerOn | undefined = kick === "power-on" ? { ramp: setup.excitation.ramp! } : undefined;
  const run = buildSystem(circuit, options.extraParts, powerOn ? { powerOn, ambient } : { ambient });
  const sources: SourceTerm[] = [];
  if (setup.generators.length > 0) sources.push(new NoiseBank(setup.generators, setup.bank));
  if (powerOn) sources.push(corner(powerOn.ramp));
  const system = withSources(run, sources);

  // The noise level the tool's own excitation leaves at the probe, through the linearised circuit.
  // (A frequency where the circuit is singular is left out of its integral, so it does not throw.)
  const noiseAt = (probe: Probe) => (setup.generators.length > 0 ? noiseLevel(linearize(plain, bias.x), probeWeights(plain, probe, bias.x), setup.generators, setup.bank.corner, poles, () => budget.check("during the noise level at the probe", analysis.span)) : 0);
  const noiseAtProbe = noiseAt(analysis.probe);
  // The outcome is judged where the growing mode swings most, whatever the probe (the probe's own figures are reported).
  let judgedAt = judgedNode(plain, () => linearize(plain, bias.x), pole, analysis.probe);
  let judgedUnit = probeUnit(system, judgedAt ?? analysis.probe);
  let noiseAtJudged = judgedAt ? noiseAt(judgedAt) : noiseAtProbe;
  const maxStep = analysis.maxStep ?? stepPeriod(period, drives) / STEPS_PER_PERIOD;
  refuseShortWindow(analysis, pole && pole.imag > 0 ? f0 : null, maxStep);
  if (typeof analysis.until === "number") budget.refuseSteps(analysis.until, maxStep, "the start-up run", analysis.span);
  const stepper = new TransientStepper(system, { start: "bias", maxStep, tolerances });
  const read = probeReader(system, analysis.probe);
  const records = judgedAt ? 2 : 1;
  const recordRun = { until: analysis.until, maxStep, frequency: pole && pole.imag > 0 ? f0 : null, ...(analysis.span ? { span: analysis.span } : {}) };
  const record = startupRecord(budget, recordRun, records);
  // A second record of the same time points at the judged node, within the same stored points.
  let judgedRecord = judgedAt ? startupRecord(budget, recordRun, records) : record;
  const readJudged = judgedAt ? probeReader(system, judgedAt) : read;
  let steps = 0;
  stepper.observe((t, x, dxdt) => {
    record.push(t, read(x, dxdt, t));
    if (judgedRecord !== record) judgedRecord.push(t, readJudged(x, dxdt, t));
    if (options.onProgress && ++steps % 4096 === 0) options.onProgress(t, typeof analysis.until === "number" ? analysis.until : NaN);
  });
  const watch = watchOperation(stepper);
  budget.watch(stepper, "the start-up run", analysis.span);
  const limit = amplitudeLimit(plain, bias.x);
  const realGrowth = poles.some((p) => p.imag === 0 && p.real > 0);
  const prediction: LinearPrediction | undefined = ok ? { frequency: pole ? pole.imag / (2 * Math.PI) : null, naturalFrequency: pole ? Math.hypot(pole.real, pole.imag) / (2 * Math.PI) : null, starts: pole ? startsFrom(pole) : false, realGrowth } : undefined;
  const searchFrom = powerOn ? powerOn.ramp : 0;
  const windowOrder = thdOrder(analysis, f0);
  let judgement: StartupJudgement | undefined;
  const judge = (from: TailRecord, noise: number, unit: QuantityUnit) => {
    const { time, values } = from.toArrays();
    refuseSparseRecord(analysis, time.length, stepper.t, maxStep);
    const judged = judgeStartup(time, values, {
      maxOrder: windowOrder,
      noiseFloor: NOISE_PEAK * noise,
      ...(limit === undefined ? {} : { amplitudeLimit: limit }),
      ...(prediction ? { prediction } : {}),
      drives,
      searchFrom,
      unit,
    });
    checkResolved(budget, from, judged.metrics.frequency, analysis.span, records);
    return judged;
  };
  let orbitSettings = { quiet: plain, stepper, analysis, drives, maxStep, tolerances, orders: windowOrder, check: () => budget.check("during the settled orbit", analysis.span), maxStoredPoints: budget.maxStoredPoints, raise: analysis.until === "auto" ? "settle-within=" : "until=", judgedAt };
  // The frequencies of the other growing pairs: a second oscillator the probe may watch.
  const otherPairs = poles.filter((p) => p !== pole && p.imag > 0 && startsFrom(p)).map((p) => p.imag / (2 * Math.PI));
  /** The probe shows an oscillation of its own still forming (an `until=auto` run waits for it). */
  let forming = false;
  /** Once the probe is judged on an oscillation of its own: what the explanation adds about the other. */
  let otherOscillator = "";
  const measure = () => {
    judgement = judge(judgedRecord, noiseAtJudged, judgedUnit);
    // Only another growing pair makes a second oscillator the probe could watch.
    if (!judgedAt || otherPairs.length === 0) return judgement.metrics;
    const own = judge(record, noiseAtProbe, probeUnit(system, analysis.probe));
    const relation = probeOscillation(own.metrics, judgement.metrics, otherPairs);
    forming = relation === "forming";
    if (relation === "own") {
      // A second oscillator: the probe watches an outcome of its own, and is judged itself from now on.
      const f = judgement.metrics.frequency;
      otherOscillator = `; judged at the probe: its oscillation is not the one at node ${probeName(judgedAt)}${f === null ? "" : ` (${formatQuantity(f, "Hz")})`}, where the bias point's growing mode swings most`;
      [judgedAt, judgedRecord, noiseAtJudged, judgedUnit, judgement] = [null, record, noiseAtProbe, probeUnit(system, analysis.probe), own];
      orbitSettings = { ...orbitSettings, judgedAt };
    }
    return judgement.metrics;
  };
  let metrics: StartupMetrics;
  const settledFromOrbit = options.settledFromOrbit ?? true;
  /** The settled figures, once found (see `refineSettled`). */
  let refined: ReturnType<typeof refineSettled> | undefined;
  const warnings = defaultWarnings(circuit);
  // A circuit that starts by itself and dies after its overshoot may grow again once its amplitude loop's slow state bleeds back.
  const recovery = prediction?.starts ? slowestTimeConstant(poles.map((p) => p.real)) : 0;
  const mayRestart = (m: StartupMetrics, now: number) => m.verdict === "decaying" && now < (recordWatch(m, recovery)?.until ?? 0);
  if (analysis.until === "auto") {
    const bound = (analysis.settleWithin ?? AUTO_MAX_CYCLES * period) + searchFrom;
    let target = AUTO_FIRST_CYCLES * period + searchFrom;
    if (pole && startsFrom(pole) && pole.real > 0 && noiseAtJudged > 0) {
      // time to grow from the noise to a volt-scale envelope, then settle
      target = Math.max(target, Math.log((limit ?? 10) / noiseAtJudged) / pole.real + 30 * period + searchFrom);
    }
    target = Math.min(target, bound);
    for (;;) {
      // Whole steps past each look: where the run is looked at must not change its waveform (a chaotic loop amplifies a shortened step); the bound is landed on.
      stepper.advance(target, target >= bound);
      metrics = measure();
      // A settled run's orbit is found now: one far from the run's last cycles says it has not settled, and the run goes on.
      refined = metrics.verdict === "settled" ? refineSettled(metrics, settledFromOrbit, orbitSettings) : undefined;
      if (refined) metrics = refined.metrics;
      // Irregular collapses may yet land on the orbit: bouncing is final once they repeat a cycle (or at the bound).
      const done =
        (FINAL_VERDICTS.has(metrics.verdict) && !judgement!.irregular) ||
        ((metrics.verdict === "silent" || metrics.verdict === "decaying") && target >= AUTO_FIRST_CYCLES * period && !mayRestart(metrics, target)) ||
        target >= bound;
      if (done && !(forming && target < bound)) break;
      const extra = metrics.suggestedExtraTime ?? target;
      target = Math.min(bound, target + Math.max(extra, 20 * period));
      options.onProgress?.(stepper.t, target);
    }
    const restarting = mayRestart(metrics, stepper.t);
    if (metrics.verdict === "growing" || metrics.verdict === "unsettled" || judgement!.irregular || restarting) {
      // The excitation's own noise, against the swing: above the settled tolerance the envelope never holds still (a collapsed swing is not the one waited for).
      const noisy = !restarting && !endsCollapsed(metrics.envelope) && metrics.amplitude !== null && metrics.amplitude > 0 && noiseAtJudged > NOISY_SHARE * metrics.amplitude ? { rms: noiseAtJudged, unit: judgedUnit, share: noiseAtJudged / metrics.amplitude } : null;
      warnings.push(boundWarning(analysis, bound - searchFrom, period, noisy));
    }
  } else {
    stepper.advance(analysis.until);
    metrics = measure();
  }
  if (options.onProgress) options.onProgress(stepper.t, stepper.t);
  warnings.push(...watch.finish("in the start-up run").map((w) => w.diagnostic));
  const { time: t, values: v } = record.toArrays();
  metrics = reclassify(metrics, system, stepper, plain, bias.x, kick, prediction);
  // A fixed until= that ends inside the watch is as unfinished as until=auto cut by its bound.
  if (prediction?.starts && mayRestart(metrics, stepper.t)) {
    const raise = analysis.until === "auto" ? "settle-within=" : "until=";
    metrics = { ...metrics, verdict: "unsettled", explanation: explainCutWatch(recordWatch(metrics, recovery)!, stepper.t, recovery, judgedUnit, raise) };
  }
  if (!refined || refined.metrics !== metrics) refined = refineSettled(metrics, settledFromOrbit, orbitSettings);
  const reported = judgedAt ? probeView(refined.metrics, seenAtProbe(t, v, judgement!, windowOrder, refined.orbit), { probe: probeName(analysis.probe), judgedAt: probeName(judgedAt), unit: probeUnit(system, analysis.probe), noise: NOISE_PEAK * noiseAtProbe }) : otherOscillator ? { ...refined.metrics, explanation: refined.metrics.explanation + otherOscillator } : refined.metrics;
  // The probe's figures without THD where its spectrum has no fundamental, or bandwidth= no harmonic.
  const toneless = withoutAbsentFundamental({ metrics: reported, numericalError: refined.numericalError }, probeName(analysis.probe), drives, analysis.span);
  const bandless = withoutBandHarmonics(toneless.refined, analysis.bandwidth, analysis.span);
  const shown = bandless.refined;
  for (const w of [toneless.warning, bandless.warning]) if (w) warnings.push(w);
  const excitation: Excitation = {
    ...setup.excitation,
    noiseAtProbe: setup.generators.length > 0 ? noiseAtProbe : null,
    firstCycleRms: firstCycleRms(t, v, searchFrom, period),
  };
  return {
    analysis: "startup",
    probe: probeName(analysis.probe),
    unit: probeUnit(system, analysis.probe),
    ...shown.metrics,
    numericalError: shown.numericalError,
    thdOrders: [2, refined.orders],
    settled: refined.settled,
    run: {
      until: stepper.t,
      maxStep,
      excitation,
      predicted: {
        frequency: pole ? pole.imag / (2 * Math.PI) : null,
        growthRate: pole ? pole.real : null,
        starts: pole ? startsFrom(pole) : false,
        realGrowth,
      },
      solver: { ...stepper.stats },
      ...(judgedAt ? { judgedAt: probeName(judgedAt) } : {}),
    },
    warnings,
    waveform: { time: t, values: v },
  };
}

/** The warning of an `until=auto` run that reached its bound before it settled, at `settle-within=` or the analysis. */
function boundWarning(analysis: StartupAnalysis, bound: number, period: number, noisy: { readonly rms: number; readonly unit: QuantityUnit; readonly share: number } | null): Diagnostic {
  const span = analysis.settleWithinSpan ?? analysis.span;
  const given = analysis.settleWithin !== undefined;
  return {
    severity: "warning",
    stage: "simulation",
    code: "not-settled-within",
    message: `until=auto stopped at ${formatQuantity(bound, "s")} (${given ? "settle-within=" : `the default bound of ${AUTO_MAX_CYCLES} predicted cycles`}) before the oscillation settled`,
    ...(span ? { span } : {}),
    hint: noisy
      ? `the excitation's noise at the probe (${formatQuantity(noisy.rms, noisy.unit)} rms) is ${formatPercent(noisy.share)} of the amplitude, more than a settled envelope may move per cycle, so waiting longer does not help: kick=none measures a driven circuit without it, and a steady analysis gives the noiseless orbit`
      : `a slow amplitude loop can need longer: raise settle-within= (now ${formatQuantity(bound, "s")}, about ${Math.round(bound / period)} cycles), or see the report's suggestion`,
  };
}

/** Noise at the probe above this share of the amplitude keeps the envelope from settling (the settled tolerance, 0.1 %/cycle). */
const NOISY_SHARE = 1e-3;

/**
 * Outcomes the probe waveform alone cannot name: a record without oscillation whose amplifier
 * ended stuck at a limit is `latched`; one that shows nothing although the poles say it starts,
 * run without excitation, says why.
 */
function reclassify(
  metrics: StartupMetrics,
  system: MnaSystem,
  stepper: TransientStepper,
  plain: MnaSystem,
  biasX: Float64Array,
  kick: StartupKick,
  prediction: LinearPrediction | undefined,
): StartupMetrics {
  if (metrics.verdict !== "silent" && metrics.verdict !== "decaying") return metrics;
  const latched = latchedAt(system, stepper.x, plain, biasX);
  if (latched) return { ...metrics, verdict: "latched", explanation: latched };
  if (kick === "none" && prediction && (prediction.starts || prediction.realGrowth)) {
    return {
      ...metrics,
      explanation: `${metrics.explanation}; the poles say it starts, but with kick=none nothing disturbs the bias point (an unstable equilibrium holds in exact arithmetic): use kick=thermal or kick=power-on`,
    };
  }
  return metrics;
}

/** The highest harmonic THD counts: `harmonics=`, or the last below `bandwidth=` at frequency f (from 2 to `MAX_THD_ORDER`). */
export function thdOrder(analysis: { readonly harmonics?: number; readonly bandwidth?: number }, f: number): number {
  if (analysis.bandwidth !== undefined) return Math.min(MAX_THD_ORDER, Math.max(2, Math.floor(analysis.bandwidth / f)));
  return analysis.harmonics ?? DEFAULT_THD_ORDER;
}

/**
 * A settled run's figures replaced by those of the periodic steady state next to it (see
 * `settledOrbit`), with their error bars; other outcomes keep the run's figures.
 */
function refineSettled(
  metrics: StartupMetrics,
  fromOrbit: boolean,
  s: {
    readonly quiet: MnaSystem;
    readonly stepper: TransientStepper;
    readonly analysis: StartupAnalysis;
    readonly drives: readonly number[];
    readonly maxStep: number;
    readonly tolerances: Tolerances;
    readonly orders: number;
    readonly check: () => void;
    readonly maxStoredPoints: number;
    /** The option that runs the start-up longer (`until=` or `settle-within=`). */
    readonly raise: string;
    /** The node the outcome is judged at when not the probe (the orbit's swing there is compared with the run's). */
    readonly judgedAt: Probe | null;
  },
): { metrics: StartupMetrics; numericalError: NumericalError | null; orders: number; settled: SettledFigures; orbit: SettledOrbit | null } {
  const fromRun = (note: string | null) => ({ metrics, numericalError: null, orders: s.orders, settled: { from: "run" as const, note, iterations: null, points: null }, orbit: null });
  // A level envelope that has not settled: the run's figures, `unsettled`, and why.
  const notSettled = (run: ReturnType<typeof fromRun>, why: string) => ({
    ...run,
    metrics: {
      ...metrics,
      verdict: "unsettled" as const,
      settlingTime: null,
      explanation: `the envelope held steady, but ${why}: the circuit has not settled (a swing clipped at a limit stays level while a slow state, such as an amplitude loop's, still moves); raise ${s.raise} to see where it goes, or run steady for the orbit and its stability`,
    },
  });
  if (!fromOrbit || metrics.verdict !== "settled" || metrics.frequency === null) return fromRun(null);
  // Shooting over one cycle would find the orbit the swing left when its period doubled (unstable, a multiplier below −1).
  if (metrics.periodDoubled) return fromRun("the settled figures are the run's last cycles: the swing repeats every second cycle, so the periodic orbit of one cycle next to it is not the one it settled on");
  const f = metrics.frequency;
  const drive = drivingFrequency(f, s.drives, DRIVE_MATCH);
  // A driven circuit is periodic in the measured period only if every source repeats within it.
  const harmonic = (d: number) => Math.abs(d / f - Math.round(d / f)) < DRIVE_MATCH * (d / f) && Math.round(d / f) >= 1;
  if (s.drives.length > 0 && !s.drives.every(harmonic)) {
    return fromRun("the settled figures are the run's last cycles: the sources have no common period with the measured one");
  }
  const orders = thdOrder(s.analysis, drive ?? f);
  const orbit = settledOrbit(s.quiet, s.stepper, s.analysis.probe, { period: 1 / f, drive }, s.maxStep, s.tolerances, orders, s.check, s.maxStoredPoints);
  const unit = probeUnit(s.quiet, s.judgedAt ?? s.analysis.probe);
  if (isOrbitFailure(orbit)) {
    const note = `the settled figures are the run's last cycles: no periodic orbit was found next to it (${orbit.failure})`;
    // With no orbit to compare, the run's own state says whether it repeats.
    const drift = largestStateDrift(s.quiet, s.stepper.snapshot(), drive === undefined ? 1 / f : 1 / drive, s.maxStep, s.tolerances);
    if (!(drift.share > STATE_DRIFT)) return fromRun(note);
    return notSettled(fromRun(note), `the charged state ${drift.label} still moves by ${formatPercent(drift.share)} of its size per period and no periodic orbit was found next to the run`);
  }
  // The orbit's swing where the outcome is judged (on the finer grid when that is not the probe: the test allows 5 %).
  const swing = s.judgedAt ? orbitFigures(orbit.orbit, probeReader(s.quiet, s.judgedAt), 2).metrics.amplitude : orbit.amplitude;
  const distance = Math.abs(swing / metrics.amplitude! - 1);
  if (!(distance <= ORBIT_AGREEMENT)) {
    const apart = `${formatQuantity(swing, unit)} peak, ${formatPercent(distance)} from the last cycles' ${formatQuantity(metrics.amplitude!, unit)}`;
    return notSettled(fromRun(`the figures are the run's last cycles: the periodic orbit next to them swings ${apart}`), `the periodic orbit next to the run swings ${apart}`);
  }
  const settled = { from: "orbit" as const, note: orbit.merged > 1 ? mergedGridNote(orbit.merged, s.maxStoredPoints) : null, iterations: orbit.iterations, points: orbit.points };
  // The one-line explanation names the settled amplitude and frequency: the orbit's now.
  const explanation = metrics.explanation.replace(SETTLED_AT, `settled at ${formatQuantity(swing, unit)} peak and ${formatQuantity(orbit.frequency, "Hz")}`);
  // Judged elsewhere, the orbit's figures are the probe's: the caller reports them beside the judged outcome.
  if (s.judgedAt) return { metrics: { ...metrics, explanation }, numericalError: orbit.numericalError, orders, settled, orbit };
  return {
    metrics: { ...metrics, explanation, ...settledFigures(orbit, metrics) },
    numericalError: orbit.numericalError,
    orders,
    settled,
    orbit,
  };
}

/**
 * The probe's figures when the outcome was judged at another node: its record over the judged
 * cycles, or the settled orbit's figures at the probe (THD+N with the run's own noise there).
 */
function seenAtProbe(t: Float64Array, v: Float64Array, judgement: StartupJudgement, maxOrder: number, orbit: SettledOrbit | null): ProbeFigures & { frequency: number | null; envelope: Float64Array } {
  const run = probeFigures(t, v, judgement, maxOrder);
  if (!orbit) return { ...run.figures, frequency: null, envelope: run.envelope };
  return { ...settledFigures(orbit, run.figures), envelope: run.envelope };
}

/** The settled orbit's figures at the probe, THD+N with the run's own noise (see `plusRunNoise`). */
function settledFigures(orbit: SettledOrbit, run: Pick<StartupMetrics, "thd" | "thdPlusNoise">) {
  return {
    frequency: orbit.frequency,
    amplitude: orbit.amplitude,
    peakToPeak: orbit.peakToPeak,
    rms: orbit.rms,
    offset: orbit.offset,
    thd: orbit.thd,
    thdPlusNoise: plusRunNoise(orbit.thd, run),
    harmonics: orbit.harmonics,
  };
}

/**
 * A settled run's last cycles and the orbit next to it agree within their error bars (within
 * 6e-4 in amplitude on the examples); an orbit further from them than this (relative) is not the
 * one the run settled on.
 */
const ORBIT_AGREEMENT = 0.05;

/**
 * A settled run's charged states repeat from one period to the next within the settling
 * tolerance the envelope is held to (0.1 % per cycle, `measureStartup`'s default); a state that
 * moves more than this share of its size per period has not settled.
 */
const STATE_DRIFT = 1e-3;

/**
 * THD+N beside the orbit's THD: the orbit is noiseless, so the noise is the run's own — what its
 * last cycles hold in the band beyond their harmonics, √(THD+N² − THD²) — added in power.
 */
function plusRunNoise(orbitThd: number, run: Pick<StartupMetrics, "thd" | "thdPlusNoise">): number | null {
  if (run.thdPlusNoise === null || run.thd === null) return null;
  const noise = Math.max(0, run.thdPlusNoise ** 2 - run.thd ** 2);
  return Math.sqrt(orbitThd ** 2 + noise);
}

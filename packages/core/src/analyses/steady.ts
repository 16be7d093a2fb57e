import { steadyOptions } from "./kinds/steady-options.js";
import type { Circuit, SteadyAnalysis, StartupAnalysis } from "../circuit/circuit.js";
import { probeName } from "../circuit/circuit.js";
import { badArgument, checkAnalysis, checkAnalysisFields, checkCircuit, checkOptions } from "../circuit/arguments.js";
import { isOnsetError, simulationError, type Diagnostic } from "../circuit/diagnostic.js";
import { formatQuantity } from "../metrics/format.js";
import type { Harmonic } from "../metrics/spectrum.js";
import { NewtonSolver } from "../solver/newton.js";
import type { QuantityUnit } from "../solver/quantities.js";
import { buildSystem, type MnaSystem } from "../solver/system.js";
import { absoluteTolerances, accuracyTolerances, loosenedTolerances, resolveTolerances, type Tolerances } from "../solver/tolerances.js";
import { RECOVERY, slowestTimeConstant } from "../metrics/restart-watch.js";
import { OrbitApproach } from "../steady/approach.js";
import { largestNode, modeOfPole } from "../steady/growing-mode.js";
import { orbitMetrics, orbitRate, orbitTimes, orbitWaveform } from "../steady/orbit-metrics.js";
import type { PeriodStart } from "../steady/periodic-map.js";
import { mergedGridNote, orbitPointLimit, recordPeriod, refineOrbit, type NumericalError, type RefinedOrbit } from "../steady/refine.js";
import { periodAt, shootOrbit, type Multiplier, type PeriodAt, type ShootingJacobian, type ShootingOptions } from "../steady/shooting.js";
import { multiplierBars, nonTrivialMultipliers, orbitStability, trivialMultiplier, type OrbitStability } from "../steady/stability.js";
import { repeatsWithin } from "../steady/sub-period.js";
import { checkOrbitSeed, checkSeedGrid } from "../steady/seed-check.js";
import { probeFloor } from "../steady/probe-floor.js";
import { COMMON_PERIOD, commonPeriod, MOST_COMMON_MULTIPLE } from "../steady/common-period.js";
import { heldDrives } from "../steady/held-drives.js";
import { fundamentalAbsent, relativeToLargest, sourceToneAt, tonelessWarning } from "../steady/absent-fundamental.js";
import { settledSources } from "../steady/settled-sources.js";
import { bandWarning, noHarmonicInBand } from "./thd-none.js";
import { solveBias } from "./bias.js";
import { defaultWarnings } from "./default-rails.js";
import { DEFAULT_TEMPERATURE, excitationSetup, periodicDrives } from "./excitation.js";
import { ZERO_CELSIUS } from "../devices/thermal-noise.js";
import { budgetOf, isRunLimitError, type RunBudget, type SteppingRun } from "./limits.js";
import { linearize } from "./linearize.js";
import { implausibleOnOrbit } from "./operating-check.js";
import { noiseLevel } from "./noise-level.js";
import { dominantPair, onImaginaryAxis, pencilPoles, startsFrom, type Pole } from "./poles.js";
import { probeReader, probeUnit, probeWeights, type ProbeReader } from "./probes.js";
import { cornersWithin } from "./settled-orbit.js";
import { amplitudeLimit, AUTO_MAX_CYCLES, thdOrder } from "./startup.js";
import { TransientStepper, type StepperStats } from "./stepper.js";
import type { RunOptions } from "./transient.js";

/** Periods of transient before the first shooting, by where it starts (`cycles=` overrides). */
export const DEFAULT_STEADY_CYCLES: Readonly<Record<"startup" | "poles" | "driven", number>> = { startup: 60, poles: 4, driven: 3 };
/** A failed shooting is retried after another batch of transient periods, this many times at most. */
const RETRIES = 4;
/** Steps per guessed period when the file sets no max-step. */
const STEPS_PER_PERIOD = 100;
/**
 * The transient towards the orbit only brings the shooting near it: it steps at most a quarter
 * as finely as the orbit's grid, whose period is recorded at the grid's own steps.
 */
const APPROACH_STEPS_PER_PERIOD = 25;
/**
 * …and its step control is this many times looser than the orbit's (3e-3 relative at the
 * defaults): over a period's 25 steps that stays well within the 10 % per period at which the
 * swing counts as levelled off (`FIRST_LEVEL`), and the shooting corrects what it leaves.
 */
const APPROACH_LOOSENING = 30;
/** The orbit is found to within this fraction of the step control's relative accuracy (as the start-up's settled figures)… */
const ORBIT_SHARE = 1e-2;
/** …and a study's sample on one grid to within this one (its figures carry the grid's own error, some ten times larger). */
const SAMPLE_ORBIT_SHARE = 1e-1;
/**
 * The growing mode starts with its largest node swinging over the amplifiers' half output range
 * (4 V without amplifiers): above the orbit rather than below, since a limiter pulls a large
 * swing down within a few periods while a small one grows only at the poles' slow rate.
 */
const KICK_SHARE = 1;
/**
 * The kick a caller may give (`SteadyOptions.kick`): far below the second start's swing the
 * growth from it outlasts the batches, far above the rails the first steps leave every device's
 * range, and neither start would say anything about the circuit.
 */
const MIN_KICK = 1e-6;
const MAX_KICK = 100;
/** The second start's swing, as a share of the amplifiers' half range, whatever the first kick (see `runSteady`). */
const SMALL_KICK_SHARE = 1e-3;
/**
 * The second start's first batch is lengthened by the periods its swing needs to grow to the
 * first kick's at the poles' growth rate (a slowly undamped resonator gains about 1 % a period:
 * some 500 periods for a thousandfold), at most this many batches of the start-up's default.
 */
const GROWTH_BATCHES = 34;
/** The first shooting waits until the swing changes by less than this fraction per period… */
const FIRST_LEVEL = 0.1;
/** …and each retry, after more transient, until it changes this many times less. */
const LEVEL_RETRY = 10;
/** Shooting iterations (periods) allowed from a neighbouring circuit's orbit. */
const EARLY_ITERATIONS = 10;
/**
 * A shooting before the last retry gives up after this many periods when its mismatch never fell
 * below its first one, or at once when its first step would move the period by more than a fifth
 * (see `ShootingOptions.giveUpAfter`): a start out of Newton's reach costs a period or a few, and
 * one making headway may use all its periods.
 */
const GIVE_UP = 5;
/**
 * The small start's oscillation counts as died out only once its swing has stayed down for
 * `RECOVERY` of the slowest decaying pole's time constants (an amplitude loop's slow state
 * bleeding back after an overshoot, when the swing grows again; the start-up run waits as long)…
 */
/** …and at most this many batches of `cycles=` periods (2040 periods by default). */
const RECOVERY_BATCHES = 34;
/** After a failed shooting, the next waits until the transient has run this many times as many periods (see `solveSteady`). */
const BACK_OFF = 2;
const EARLY_LIMITS = { giveUpAfter: GIVE_UP };
/** A hard start's kick whose first step fails is halved at most this many times (to 1/8). */
const HARD_KICK_HALVINGS = 3;
/** An orbit whose charged states all swing less than this many times their absolute tolerance is the rest point. */
const COLLAPSED = 100;
/** Fraction of the amplitude at which the start-up time is counted (the start-up metric's own). */
const STARTUP_FRACTION = 0.9;

/** The linear prediction at the bias point, beside the orbit. */
export interface SteadyPrediction {
  /** Hz: the dominant pair's imaginary part / 2π, or null without a complex pair. */
  readonly frequency: number | null;
  /** 1/s: the dominant pair's real part. */
  readonly growthRate: number | null;
  readonly starts: boolean;
  /** The bias point grows along a real pole (a latch or a relaxation oscillator; with `starts` false, no orbit is searched from it). */
  readonly realGrowth: boolean;
  /**
   * Predicted start-up time (s): ln(0.9·A / k)/σ, the envelope growing at the poles' rate from
   * k = √2 × the thermal noise at the probe to 90 % of the orbit's amplitude A. It is a linear
   * prediction (saturation slows the last part of the growth); null when it does not apply.
   */
  readonly startupTime: number | null;
}

/** What `runSteady` returns: the periodic steady state's figures on the probe, its stability, or why there is none. */
export interface SteadyResult {
  readonly analysis: "steady";
  readonly probe: string;
  readonly unit: QuantityUnit;
  /** True when a periodic orbit was found; every figure below is null (and the lists empty) otherwise. */
  readonly found: boolean;
  /**
   * True when the orbit is a hard start's: the rest point is stable (the circuit does not start
   * by itself) and a large disturbance in the dominant pair's mode reached this orbit. Studies do
   * not search for one (see `SteadyOptions.hardStart`).
   */
  readonly hardStart: boolean;
  /** One sentence: the orbit and its stability, or why no orbit was found. */
  readonly explanation: string;
  /** `autonomous`: the period is the circuit's own; `driven`: the sources' common period. */
  readonly kind: "autonomous" | "driven";
  /** Where the shooting started. */
  readonly from: "startup" | "poles" | "driven";
  readonly frequency: number | null;
  readonly period: number | null;
  readonly amplitude: number | null;
  readonly peakToPeak: number | null;
  readonly rms: number | null;
  readonly offset: number | null;
  readonly thd: number | null;
  readonly thdOrders: readonly [number, number];
  readonly harmonics: readonly Harmonic[];
  /** Error bars of the figures (absolute, in their own units), from the two grids. */
  readonly numericalError: NumericalError | null;
  /** Newton iterations (periods integrated) of the shooting on the two grids. */
  readonly iterations: readonly [number, number] | null;
  /** Grid points per period on the two grids. */
  readonly points: readonly [number, number] | null;
  /**
   * How the shooting's Newton steps were solved: `dense`, from the map's sensitivities (the
   * multipliers are all n eigenvalues), or `matrix-free`, by GMRES on tangent passes (from 60
   * unknowns; the multipliers are the dominant ones only, Ritz values of an Arnoldi run).
   */
  readonly shooting: "dense" | "matrix-free" | null;
  /**
   * The non-trivial Floquet multipliers, largest magnitude first: the eigenvalues of the map's
   * derivative on the transient's own grid (the coarser; the halved grid's differ by O(h²), in
   * the fourth digit), taken at the orbit or at a period within two tolerances of it.
   */
  readonly multipliers: readonly Multiplier[];
  /**
   * Error bars of `multipliers`, one per entry (absolute, a distance in the complex plane): twice
   * the distance to the halved grid's nearest multiplier (see `multiplierBars`). Null without
   * the halved grid (a study's sample) or without an orbit.
   */
  readonly multiplierError: readonly number[] | null;
  /** An autonomous orbit's trivial multiplier, left out of `multipliers`: 1 up to the grid's error; null when driven or without an orbit. */
  readonly trivialMultiplier: Multiplier | null;
  readonly stability: OrbitStability | null;
  readonly predicted: SteadyPrediction;
  /** The transient before the shooting: periods and simulated time. */
  readonly transient: { readonly periods: number; readonly until: number; readonly maxStep: number; readonly solver: StepperStats };
  readonly warnings: readonly Diagnostic[];
  /** The probe over one period of the orbit (times from the orbit's start); empty without an orbit. */
  readonly waveform: { readonly time: Float64Array; readonly values: Float64Array };
}

/** How `steady` runs inside a study: the predicted start-up time needs the noise analysis, which a study may skip. */
export interface SteadyOptions extends RunOptions {
  /** Compute the predicted start-up time (default true). */
  readonly predictStartup?: boolean;
  /**
   * Shoot on the transient's own grid only, without the halved grid and the extrapolation (no
   * error bars): a study's samples, whose spread dwarfs the grid's error, at less than half the cost.
   */
  readonly singleGrid?: boolean;
  /** Fill in the result's waveform (default true; a study's sample has no use for it). */
  readonly waveform?: boolean;
  /** Check the parts' operating points along the orbit (the `implausible-operation` warnings; default true; a study's sample reports no warnings). */
  readonly operatingCheck?: boolean;
  /**
   * A neighbouring circuit's orbit (a study's nominal, see {@link steadySeed}) to shoot from
   * before anything else: a sample whose parts moved by their tolerances lies a few Newton
   * steps from it, with no transient at all. When the shooting does not converge from it, the
   * run goes on as without it.
   */
  readonly seed?: OrbitSeed;
  /**
   * A seeded shooting's multipliers may be the seed's Newton matrix's own when they leave the
   * verdict beyond doubt (see `ShootingOptions.predictedMultipliers`): a study's sample, which
   * reports only its verdict, then spends no period on sensitivities. Default false.
   */
  readonly predictedMultipliers?: boolean;
  /**
   * The growing mode's first kick: its largest node's swing as a share of the amplifiers' half
   * output range (default 1, see `KICK_SHARE`). The orbit found does not depend on it (a test
   * checks two kicks against each other); it only moves the transient before the shooting.
   * From 1e-6 to 100.
   */
  readonly kick?: number;
  /**
   * Search a circuit whose rest point is stable for an orbit a large disturbance reaches (a hard
   * start; default true). A study's samples and settings do not (false): one that does not start
   * by itself fails whatever orbit surrounds its rest point, and the search would cost a transient.
   */
  readonly hardStart?: boolean;
}

/** A converged orbit handed to a neighbouring circuit's shooting: plain data, so it can be posted to a worker thread. */
export interface OrbitSeed {
  /** The unknowns at the orbit's start, and its period. */
  readonly x: Float64Array;
  readonly period: number;
  /** The orbit's grid (step k is fractions[k]·T) and its states at the grid points. */
  readonly fractions: Float64Array;
  readonly states: readonly Float64Array[];
  /** The shooting's Newton matrix at the orbit ((n + 1)², row-major; empty when it was shot matrix-free, and a shooting seeded from it is matrix-free too) and the unknown its phase condition holds. */
  readonly matrix: Float64Array;
  readonly phase: number;
  /** How much a shooting step from `matrix` is expected to shrink the distance to the orbit, when known (see `ShootingJacobian`). */
  readonly contraction?: number;
}

/**
 * Runs a `steady` analysis: the bias point and its poles; then, for a circuit driven by
 * periodic sources, a few periods of transient and shooting with the sources' common period;
 * for an autonomous circuit whose poles say it starts, a short transient started in the growing
 * mode (so no time is spent growing out of noise) and shooting with the period an unknown and a
 * phase condition (Aprille & Trick 1972). The figures come from the orbit on the transient's
 * own grid and on it halved, extrapolated in the step (as the start-up's settled figures), and
 * the Floquet multipliers tell whether the orbit attracts. A circuit whose poles decay, or
 * whose transient dies out, or whose shooting finds nothing, gets `found: false` and why.
 */
export function runSteady(circuit: Circuit, analysis: SteadyAnalysis, options: SteadyOptions = {}): SteadyResult {
  checkArguments("runSteady", circuit, analysis, options);
  return solveSteady(circuit, analysis, options);
}

/** A public entry's checks at the door: the circuit's shape, the analysis as the statement's options table allows it, the options an object. */
function checkArguments(api: string, circuit: Circuit, analysis: SteadyAnalysis, options: SteadyOptions): void {
  checkCircuit(api, circuit);
  checkAnalysis(api, analysis, "steady");
  checkAnalysisFields(api, analysis as unknown as Readonly<Record<string, unknown>>, steadyOptions);
  checkOptions(api, options);
  if (options.seed !== undefined) checkOrbitSeed(api, options.seed);
  const kick = options.kick ?? KICK_SHARE;
  if (!(kick >= MIN_KICK && kick <= MAX_KICK)) throw badArgument(`${api}: options.kick must be a number from 1e-6 to 100, got ${String(kick)}`);
  if (options.hardStart !== undefined && typeof options.hardStart !== "boolean") throw badArgument(`${api}: options.hardStart must be true or false, got ${String(options.hardStart)}`);
}

/**
 * The orbit of `circuit` (a study's nominal) as a seed for its neighbours' shootings, on the
 * grid a study's samples use (the transient's own); null when it has no orbit (or a driven one,
 * whose samples start from their sources anyway).
 */
export function steadySeed(circuit: Circuit, analysis: SteadyAnalysis, options: SteadyOptions = {}): OrbitSeed | null {
  checkArguments("steadySeed", circuit, analysis, options);
  let seed: OrbitSeed | null = null;
  const result = solveSteady(circuit, analysis, { ...options, predictStartup: false, singleGrid: true, waveform: false, hardStart: false }, (refined) => {
    const { orbit } = refined;
    const { matrix, phase } = orbit.jacobian;
    seed = { x: orbit.start.x, period: orbit.start.period, fractions: orbit.fractions, states: orbit.states, matrix: Float64Array.from(matrix), phase };
  });
  return result.found && result.kind === "autonomous" ? seed : null;
}

/**
 * One period of a neighbouring circuit's map (a study's sample, or the nominal with one value
 * moved) on a seed's grid, from `start` (the seed's own start by default), held as tightly as a
 * seeded sample's shooting: see `periodAt`. Null when the neighbour's unknowns differ.
 */
export function seedPeriod(seed: OrbitSeed, neighbour: Circuit, analysis: SteadyAnalysis, options: RunOptions & { readonly start?: { readonly x: Float64Array; readonly period: number }; readonly matrix?: boolean } = {}): PeriodAt | null {
  const tolerances = resolveTolerances({ ...accuracyTolerances(analysis.accuracy, analysis.accuracyFloor), ...options.tolerances });
  const system = buildSystem(settledSources(neighbour), options.extraParts, { ambient: ambientOf(analysis) });
  if (system.n !== seed.x.length) return null;
  const start = { t0: 0, x: options.start?.x ?? seed.x, period: options.start?.period ?? seed.period };
  return periodAt(system, start, seed.fractions, seed.states, { tolerances, relative: SAMPLE_ORBIT_SHARE * tolerances.lteRelative, ...(options.matrix ? { phase: seed.phase } : {}) });
}

function solveSteady(written: Circuit, analysis: SteadyAnalysis, options: SteadyOptions, onOrbit?: (orbit: RefinedOrbit) => void): SteadyResult {
  const circuit = settledSources(written);
  const kick = options.kick ?? KICK_SHARE;
  const tolerances = resolveTolerances({ ...accuracyTolerances(analysis.accuracy, analysis.accuracyFloor), ...options.tolerances });
  const budget = budgetOf(options);
  const system = buildSystem(circuit, options.extraParts, { ambient: ambientOf(analysis) });
  const bias = solveBias(system, new NewtonSolver(system, tolerances), tolerances);
  budget.refuseDense(system.n, "the steady analysis' start (the bias point's poles and growing mode)", analysis.span);
  let poles: Pole[] = [];
  try {
    poles = pencilPoles(linearize(system, bias.x), () => budget.check("during the bias point's poles", analysis.span));
  } catch (error) {
    if (!isOnsetError(error) || isRunLimitError(error)) throw error;
  }
  budget.check("after the bias point and poles", analysis.span);
  const pole = dominantPair(poles);
  const growing = rightmostGrowing(poles);
  const drives = periodicDrives(circuit);
  const read = probeReader(system, analysis.probe);
  const base = {
    probe: probeName(analysis.probe),
    unit: probeUnit(system, analysis.probe),
    warnings: defaultWarnings(circuit),
  };
  const prediction = { frequency: pole ? pole.imag / (2 * Math.PI) : null, growthRate: pole ? pole.real : null, starts: pole ? startsFrom(pole) : false, realGrowth: poles.some((p) => p.imag === 0 && p.real > 0) };
  const context: Context = { circuit, analysis, system, tolerances, budget, read, singleGrid: options.singleGrid ?? false, waveform: options.waveform ?? true, operatingCheck: options.operatingCheck ?? true, selfOscillating: pole !== null && startsFrom(pole), ...(onOrbit ? { onOrbit } : {}) };

  const noisy = circuit.parts.find((p) => (p.kind === "vsource" || p.kind === "isource") && p.options.wave === "noise" && !Number.isFinite(p.options.stop));
  if (noisy) {
    const kind = drives.length > 0 ? ("driven" as const) : ("autonomous" as const);
    const transient = { periods: 0, until: 0, maxStep: analysis.maxStep ?? 0, solver: emptyStats() };
    return noOrbit(
      { ...base, kind, from: kind === "driven" ? "driven" : (analysis.from ?? "startup"), predicted: { ...prediction, startupTime: null }, transient },
      `no periodic orbit: ${noisy.name} is a noise source that never stops, so nothing in the circuit repeats — a steady state is periodic by definition; run startup or transient for the noisy circuit, or give the source a stop= time`,
    );
  }
  if (drives.length > 0) {
    const period = commonPeriod(drives);
    const from = "driven" as const;
    const predicted = { ...prediction, startupTime: null };
    if (period === null) {
      const transient = { periods: 0, until: 0, maxStep: analysis.maxStep ?? 0, solver: emptyStats() };
      return noOrbit({ ...base, kind: "driven", from, predicted, transient }, `no periodic orbit: the sources' frequencies have no common period within ${MOST_COMMON_MULTIPLE} periods of the lowest`);
    }
    // Steps as fine as for the lowest source's period alone, however many of them the common one spans.
    const maxStep = analysis.maxStep ?? 1 / Math.min(...drives) / STEPS_PER_PERIOD;
    const stepper = new TransientStepper(system, { start: { t: 0, x: bias.x }, maxStep, tolerances });
    let periods = analysis.cycles ?? DEFAULT_STEADY_CYCLES.driven;
    budget.refuseSteps(periods * period, maxStep, "the steady state's transient", analysis.span, "over ");
    budget.watch(stepper, "the steady state's transient", analysis.span);
    stepper.advance(periods * period);
    // A shooting from too far (a rectifier's map bends within a period: a voltage doubler's
    // stayed 100 tolerances off after 25 periods) is retried after the transient has run twice as
    // long, as often as an autonomous one; a circuit oscillating by itself is not retried (more
    // transient does not make its own oscillation repeat with the sources). A retry the run's
    // limits would cut short is not started: the answer stays the shooting's.
    const retries = context.selfOscillating ? 0 : RETRIES;
    const withinLimits = () => {
      const until = BACK_OFF * periods * period;
      return BACK_OFF * stepper.stats.accepted <= budget.maxSteps && Math.ceil(until / maxStep) <= budget.maxSteps && until <= budget.maxSimulatedTime;
    };
    let shot = shoot(context, () => recordedStart(context, stepper, period, maxStep, false), false);
    for (let retry = 1; retry <= retries && typeof shot === "string" && withinLimits(); retry++) {
      periods *= BACK_OFF;
      stepper.advance(periods * period);
      shot = shoot(context, () => recordedStart(context, stepper, period, maxStep, false), false);
    }
    // A circuit that oscillates by itself repeats with the sources only when its oscillation locks to them:
    // an orbit with their period that it leaves (its own oscillation at rest) is not its settled state.
    if (context.selfOscillating && (typeof shot === "string" || shotUnstable(shot, false))) {
      return besideDrives(context, options, drives, period, shot, { ...base, kind: "driven", from, predicted, transient: transientOf(stepper, periods, maxStep) }, bias.x, pole!);
    }
    if (typeof shot === "string") return noOrbit({ ...base, kind: "driven", from, predicted, transient: transientOf(stepper, periods, maxStep) }, `no periodic orbit with the sources' period ${formatQuantity(period, "s")}: ${shot}`);
    return found(context, shot, { ...base, kind: "driven", from, predicted, transient: transientOf(stepper, periods, maxStep) });
  }

  const from = analysis.from ?? "startup";
  const predicted = { ...prediction, startupTime: null };
  const guessPeriod = pole ? (2 * Math.PI) / pole.imag : null;
  const maxStep = analysis.maxStep ?? (guessPeriod ?? 1e-3) / STEPS_PER_PERIOD;
  const idle = () => ({ ...base, kind: "autonomous" as const, from, predicted, transient: { periods: 0, until: 0, maxStep, solver: emptyStats() } });
  if (!growing) {
    const still = `the circuit does not oscillate — ${polesVerdict(pole)}`;
    if (!pole || guessPeriod === null || options.hardStart === false) return noOrbit(idle(), `no periodic orbit: ${still}, so it does not start by itself (an orbit only a large disturbance would reach, a hard start, is not searched${pole ? " in a study" : ""})`);
    // A stable rest point may still be surrounded by an orbit a large disturbance reaches (a hard start): kicked in the dominant pair's mode, the circuit shows it.
    const hard = hardStartSearch(context, bias.x, pole, maxStep, analysis.cycles ?? DEFAULT_STEADY_CYCLES[from], kick);
    if ("orbit" in hard) return found(context, hard.orbit, { ...idle(), transient: hard.transient }, polesVerdict(pole));
    return noOrbit({ ...idle(), transient: hard.transient }, `no periodic orbit: ${still}, so it does not start by itself, and ${hard.why}`);
  }
  if (guessPeriod === null) {
    return noOrbit(idle(), `no periodic orbit searched: the bias point is unstable along a real pole (${formatQuantity(growing.real, "/s")}), with no complex pair to give a period; run startup to see what it does`);
  }
  // The orbit's grid steps at most max-step over a period (the approach is coarser): refused before any work when that is beyond the step limit.
  budget.refuseSteps(guessPeriod, maxStep, "the steady state's recorded period", analysis.span, "of about ");
  const orbitFound = (shot: ShotOrbit, transient: SteadyResult["transient"]) => {
    const startupTime = options.predictStartup === false ? null : predictedStartup(context, bias.x, poles, pole!, shot.amplitude);
    return found(context, shot, { ...idle(), predicted: { ...prediction, startupTime }, transient });
  };
  if (options.seed && options.seed.x.length === system.n) {
    checkSeedGrid("runSteady", options.seed);
    const shot = shoot(context, () => seededStart(options.seed!), true, { maxIterations: EARLY_ITERATIONS, predictedMultipliers: options.predictedMultipliers ?? false });
    if (typeof shot !== "string") return orbitFound(shot, idle().transient);
  }
  const mode = modeOfPole(linearize(system, bias.x), pole!);
  if (!mode) return noOrbit(idle(), "no periodic orbit searched: the growing mode could not be computed (the linearised circuit is singular at its pole)");
  // The approach watches the node the growing mode swings most, not the probe: a probe may
  // swing at a harmonic (a lamp's temperature), or not at all (a supply node), and the orbit
  // found must not depend on where it is measured.
  const swinging = largestNode(mode, system.unknowns);
  const batch = analysis.cycles ?? DEFAULT_STEADY_CYCLES[from];
  let why = "";
  let periods = 0;
  let transient = { periods: 0, until: 0, maxStep, solver: emptyStats() };
  const approachStep = Math.max(maxStep, guessPeriod / APPROACH_STEPS_PER_PERIOD);
  const approachTolerances = loosenedTolerances(tolerances, APPROACH_LOOSENING);
  // A large kick reaches the orbit of most circuits within a few periods; an amplitude loop it
  // overdrives (a peak detector charged far past its orbit) may stop oscillating for a while,
  // so a kick that dies out is tried again small, growing as the circuit would from noise.
  // The bias point's slowest decaying time constants, in periods, that a slow loop is given beyond the batches (see `RECOVERY`).
  const wantedWait = recoveryPeriods(poles, guessPeriod);
  const slowWait = Math.min(wantedWait, RECOVERY_BATCHES * batch);
  const failedWhy = (failure: { readonly why: string; readonly periods: number }) => `no periodic orbit found after ${failure.periods} periods of transient: ${failure.why}${longerWait(wantedWait, slowWait)}`;
  for (const share of [kick, SMALL_KICK_SHARE]) {
    const stepper = new TransientStepper(system, { start: { t: 0, x: kicked(system, bias.x, mode, share) }, maxStep: approachStep, tolerances: approachTolerances });
    budget.watch(stepper, "the steady state's transient", analysis.span);
    const approach = new OrbitApproach(stepper, (x) => x[swinging]!, guessPeriod, Math.expm1(growing.real * guessPeriod), 0);
    const growth = share === SMALL_KICK_SHARE ? growthPeriods(kick / SMALL_KICK_SHARE, growing.real * guessPeriod, GROWTH_BATCHES * Math.max(batch, DEFAULT_STEADY_CYCLES.startup)) : 0;
    // from=poles shoots from the poles' period first, from the measured one once that failed (a clipped swing's period can be far from the poles').
    const periodOf = (measured: number, shots: number) => (from === "startup" || shots > 1 ? measured : guessPeriod);
    const end = shootInBatches(context, stepper, approach, { batch, growth, waitLevel: from === "startup", retry: share !== SMALL_KICK_SHARE, periodOf }, maxStep);
    transient = transientOf(stepper, periods + approach.periods, approachStep);
    if (end.kind === "orbit") return orbitFound(end.orbit, transient);
    if (end.kind === "diverged") return noOrbit({ ...idle(), transient }, divergedWhy(end, context, swinging, pole!));
    let diedOut = end.kind !== "failed";
    let grew = end.kind === "died-out" && end.afterGrowth;
    if (end.kind === "stopped") why = `no periodic orbit: started in its growing mode, the transient stopped (${end.why}), and from a small start`;
    else if (end.kind === "died-out") why = diedOutWhy(end.periods, pole!, wantedWait > slowWait ? wantedWait : 0, end.afterGrowth);
    else why = failedWhy(end.failure);
    // A slow loop's envelope may still bounce when the batches are spent, and the shooting from
    // there fail: it gets one more wait, as long as the patience with a dip, for its swing to
    // level off — shot again each time it has run twice as long, since a swing clipped at the
    // rails looks level long before a slow loop (a lamp of seconds) has brought it off them.
    // from=poles waits too: its short batches shoot an over-correcting loop's bounce, not its orbit.
    if (end.kind === "failed") {
      const after = waitForLevel(context, stepper, approach, end, approach.periods + slowWait, maxStep, 0);
      transient = transientOf(stepper, periods + approach.periods, approachStep);
      if (after.kind === "orbit") return orbitFound(after.orbit, transient);
      if (after.kind === "diverged") return noOrbit({ ...idle(), transient }, divergedWhy(after, context, swinging, pole!));
      if (after.kind === "died-out") {
        diedOut = true;
        grew = after.afterGrowth;
        why = diedOutWhy(after.periods, pole!, wantedWait > slowWait ? wantedWait : 0, after.afterGrowth);
      } else if (after.kind === "failed") why = failedWhy(after.failure);
    }
    periods += approach.periods;
    // Only a start that died out is tried again, small.
    if (!diedOut) break;
    if (share !== SMALL_KICK_SHARE || !grew) continue;
    // The small start grew, overshot and died (an amplitude loop that over-corrects): re-seeded as the circuit's noise would.
    const again = reseeded(context, stepper, { bias: bias.x, seed: kicked(system, bias.x, mode, SMALL_KICK_SHARE), swinging, guessPeriod, linearGrowth: Math.expm1(growing.real * guessPeriod), step: approachStep, tolerances: approachTolerances, batch, maxStep, bound: reseedBound(batch) });
    transient = transientOf(again.stepper, periods + again.periods, approachStep);
    if (again.end.kind === "orbit") return orbitFound(again.end.orbit, transient);
    if (again.end.kind === "diverged") return noOrbit({ ...idle(), transient }, divergedWhy(again.end, context, swinging, pole!));
    why = `${why}; re-seeded in its growing mode at the small start's swing each time the swing died (as the circuit's noise restarts it), ${again.seeds} times over ${again.periods} more periods (at most ${reseedBound(batch)}), ${again.end.kind === "died-out" ? "it never grew back to a swing that levelled off" : `no orbit was found: ${again.end.kind === "failed" ? again.end.failure.why : again.end.why}`}`;
  }
  // from=poles shoots after every few periods whatever the swing does; a slow loop's may still bounce.
  const instead = from === "poles" && why.startsWith("no periodic orbit found") ? `; from=poles shoots every ${batch} periods whether or not the swing has levelled off — from=startup (the default) waits for it` : "";
  return noOrbit({ ...idle(), transient }, startsFrom(pole!) ? `${why}${instead}` : offPairWhy(growing, pole!, transient.periods));
}

/** The orbit's largest non-trivial multiplier lies outside the unit circle: the circuit leaves it. */
function shotUnstable(shot: ShotOrbit, autonomous: boolean): boolean {
  return orbitStability(nonTrivialMultipliers(shot.orbit.multipliers, autonomous), shot.orbit.start.period).verdict === "unstable";
}

/**
 * A circuit that oscillates by itself beside its periodic sources, whose orbit with the sources'
 * period was not found or is one it leaves (its own oscillation at rest, carrying the forced
 * response). Its own oscillation is found with the sources held at their mean level; from that
 * orbit, with the sources on, the transient runs a batch of periods and is shot with the sources'
 * period (the oscillation locked to them), then with the period common to the sources and the
 * oscillation, when their frequencies have one (within the oscillation's error bar). Otherwise
 * the settled state never repeats (quasi-periodic), and the answer says so, never an orbit.
 */
function besideDrives(c: Context, options: SteadyOptions, drives: readonly number[], period: number, first: ShotOrbit | string, common: Common, bias: Float64Array, pole: Pole): SteadyResult {
  const { seed: _seed, ...rest } = options;
  let start: PeriodStart | null = null;
  // Measured at the node the growing mode swings most, whatever the probe: the frequency's error bar, which says whether a common period holds, is that node's.
  const mode = modeOfPole(linearize(c.system, bias), pole);
  const probe = mode ? { kind: "node" as const, node: c.system.unknowns[largestNode(mode, c.system.unknowns)]!.label } : c.analysis.probe;
  const own = solveSteady(heldDrives(c.circuit), { ...c.analysis, probe }, { ...rest, predictStartup: false, waveform: false, operatingCheck: false }, (o) => (start = o.orbit.start));
  const leaves = typeof first === "string" ? `the shooting with the sources' period ${formatQuantity(period, "s")} found none (${first})` : `the only orbit with the sources' period found has that oscillation at rest (${unstableWhy(first)})`;
  const itself = `${polesVerdict(pole)}, so the circuit oscillates by itself`;
  if (!own.found || start === null) return noOrbit({ ...common, transient: own.transient }, `no periodic orbit: ${itself}; ${leaves}; with the sources held at their mean level, ${own.explanation}`);
  const fOsc = own.frequency!;
  const drive = drives.length === 1 ? `its source drives it at ${formatQuantity(drives[0]!, "Hz")}` : `its sources repeat every ${formatQuantity(period, "s")}`;
  const near = `the circuit oscillates by itself near ${formatQuantity(fOsc, "Hz")} (its own orbit with the sources held at their mean level) and ${drive}`;
  const lowest = Math.min(...drives);
  const maxStep = c.analysis.maxStep ?? 1 / Math.max(lowest, fOsc) / STEPS_PER_PERIOD;
  const stepper = new TransientStepper(c.system, { start: { t: 0, x: (start as PeriodStart).x }, maxStep, tolerances: c.tolerances });
  const run = Math.max((c.analysis.cycles ?? DEFAULT_STEADY_CYCLES.startup) / fOsc, DEFAULT_STEADY_CYCLES.driven * period);
  c.budget.refuseSteps(run, maxStep, "the steady state's transient", c.analysis.span, "over ");
  c.budget.watch(stepper, "the steady state's transient", c.analysis.span);
  stepper.advance(run);
  const transient = transientOf(stepper, Math.round(run / period), maxStep);
  const locked = shoot(c, () => recordedStart(c, stepper, period, maxStep, false), false);
  if (typeof locked !== "string" && !shotUnstable(locked, false)) return found(c, locked, { ...common, transient });
  const spread = own.numericalError ? own.numericalError.frequency / fOsc : 0;
  const joint = commonPeriod([...drives, fOsc], Math.max(COMMON_PERIOD, spread));
  const tie = drives.length === 1 ? "its source" : "its sources";
  const unlocked = `the oscillation does not lock to ${tie} (shot with ${drives.length === 1 ? "its" : "their"} period after ${transient.periods} periods of transient from that orbit: ${typeof locked === "string" ? locked : `the orbit found is ${unstableWhy(locked)}`})`;
  if (joint === null) {
    return noOrbit({ ...common, transient }, `no periodic orbit: ${near}; the two share no common period within ${MOST_COMMON_MULTIPLE} periods of the lowest, and ${unlocked}, so the settled state never repeats (quasi-periodic); run startup to see the settled state`);
  }
  const shared = joint > period * (1 + COMMON_PERIOD) ? shoot(c, () => recordedStart(c, stepper, joint, maxStep, false), false) : locked;
  if (typeof shared !== "string" && !shotUnstable(shared, false)) return found(c, shared, { ...common, transient });
  const why = typeof shared === "string" ? shared : `the orbit found is ${unstableWhy(shared)}`;
  const ratio = `within the oscillation's error bar (${formatQuantity(own.numericalError?.frequency ?? 0, "Hz")}) the two share a common period of ${formatQuantity(joint, "s")}, but shooting with it found no orbit the circuit stays on (${why})`;
  return noOrbit({ ...common, transient }, `no periodic orbit: ${near}; ${ratio}, and ${unlocked}: an oscillation that does not lock to its sources repeats with them only when the ratio is exact, closer than the steps can tell; run startup to see the settled state`);
}

/** How fast a disturbance grows on an unstable orbit: its largest multiplier's magnitude. */
function unstableWhy(shot: ShotOrbit): string {
  const largest = orbitStability(nonTrivialMultipliers(shot.orbit.multipliers, false), shot.orbit.start.period).largest!;
  return `unstable: a disturbance grows by ${Math.hypot(largest.re, largest.im).toPrecision(3)} per period, so the circuit leaves it`;
}

/** Periods the re-seeded starts may run in all: the start-up's own bound (see `AUTO_MAX_CYCLES`), or 34 batches of a larger `cycles=`. */
function reseedBound(batch: number): number {
  return Math.max(AUTO_MAX_CYCLES, RECOVERY_BATCHES * batch);
}

interface ReseedPlan {
  /** The bias point, and the small start there (the bias point plus the growing mode at `SMALL_KICK_SHARE`). */
  readonly bias: Float64Array;
  readonly seed: Float64Array;
  readonly swinging: number;
  readonly guessPeriod: number;
  readonly linearGrowth: number;
  readonly step: number;
  readonly tolerances: Tolerances;
  readonly batch: number;
  readonly maxStep: number;
  readonly bound: number;
}

/**
 * An amplitude loop that over-corrected stops its oscillation until its slow state bleeds back;
 * without noise the swing meanwhile sinks below the solver's resolution and may never grow back
 * (or only after as long again), where the circuit's noise restarts it as soon as the gain
 * allows. So each time the swing has died, the growing mode is added again at the small start's
 * swing to the state where it died, and the transient goes on from there (the loop's slow state
 * as it stands), in batches shot as before, until a swing levels off or `bound` periods have run.
 * The seed only moves where the transient goes on from, not the orbit the shooting converges on.
 */
function reseeded(c: Context, from: TransientStepper, plan: ReseedPlan): { end: BatchesEnd; periods: number; seeds: number; stepper: TransientStepper } {
  let stepper = from;
  let periods = 0;
  let seeds = 0;
  let end: BatchesEnd = { kind: "died-out", periods: 0, afterGrowth: true };
  while (end.kind === "died-out" && periods < plan.bound) {
    const x = Float64Array.from(stepper.x);
    for (const j of c.system.stateColumns) x[j] = x[j]! + plan.seed[j]! - plan.bias[j]!;
    stepper = new TransientStepper(c.system, { start: { t: stepper.t, x }, maxStep: plan.step, tolerances: plan.tolerances });
    c.budget.watch(stepper, "the steady state's transient", c.analysis.span);
    const approach = new OrbitApproach(stepper, (y) => y[plan.swinging]!, plan.guessPeriod, plan.linearGrowth);
    seeds++;
    end = shootInBatches(c, stepper, approach, { batch: Math.min(plan.batch, plan.bound - periods), growth: 0, waitLevel: true, retry: false, periodOf: (measured) => measured }, plan.maxStep);
    end = waitForLevel(c, stepper, approach, end, plan.bound - periods, plan.maxStep);
    periods += approach.periods;
  }
  return { end, periods, seeds, stepper };
}

/**
 * After batches whose shootings all failed (a slow loop's envelope still bouncing), the
 * transient goes on until `most` periods in all, shot each time the swing has levelled off and
 * the run has lasted `waited` periods (then twice as long as at each failed shooting).
 */
function waitForLevel(c: Context, stepper: TransientStepper, approach: OrbitApproach, end: BatchesEnd, most: number, maxStep: number, waited = BACK_OFF * approach.periods): BatchesEnd {
  const check = () => c.budget.check("during the steady state's transient", c.analysis.span);
  while (end.kind === "failed" && approach.periods < most) {
    const where = approach.advance(most - approach.periods, FIRST_LEVEL, check, waited);
    if (where.kind !== "oscillating") return where;
    if (!where.levelled) break;
    const more = BACK_OFF * approach.periods < most;
    const shot = shoot(c, () => recordedStart(c, stepper, where.period, maxStep, true), true, more ? EARLY_LIMITS : {});
    if (typeof shot !== "string") return { kind: "orbit", orbit: shot };
    end = { kind: "failed", failure: { why: shot, periods: approach.periods } };
    waited = BACK_OFF * approach.periods;
  }
  return end;
}

/** Periods a swing growing by e^(σT) a period needs to grow `factor`-fold, at most `most`. */
function growthPeriods(factor: number, growthPerPeriod: number, most: number): number {
  const periods = Math.log(factor) / growthPerPeriod;
  return periods > 0 ? Math.min(Math.ceil(periods), most) : 0;
}

/** A shooting that failed: its reason, after how many periods of transient. */
type ShotFailure = { readonly why: string; readonly periods: number };

/** How the batches of `shootInBatches` ended. */
type BatchesEnd =
  | { readonly kind: "orbit"; readonly orbit: ShotOrbit }
  | { readonly kind: "died-out"; readonly periods: number; readonly afterGrowth: boolean }
  /** The swing grew until its arithmetic overflowed; `largest`, its last finite one. */
  | { readonly kind: "diverged"; readonly periods: number; readonly largest: number }
  /** A time step failed (`why`), after the shooting `failure` if any. */
  | { readonly kind: "stopped"; readonly why: string; readonly failure: ShotFailure | null }
  /** Every batch spent, the last shooting failed. */
  | { readonly kind: "failed"; readonly failure: ShotFailure };

interface BatchPlan {
  /** Periods of transient per batch. */
  readonly batch: number;
  /** Periods the first batch runs beyond `batch` (a small start growing). */
  readonly growth: number;
  /** Whether a batch shoots only once the swing has levelled off (from=startup), or whatever it does (from=poles). */
  readonly waitLevel: boolean;
  /** Whether a failed time step ends the batches with its reason (see `stepFailure`) rather than an error. */
  readonly retry: boolean;
  /** The period the `shots`-th shooting (from 1) starts from, given the one measured. */
  readonly periodOf: (measured: number, shots: number) => number;
}

/**
 * Batches of transient from a kicked start, each ending in a shooting (see `plan`); after a
 * failed one, the next waits for a swing levelled ten times finer, and until the transient has
 * run as long again: a failed shooting's start was out of Newton's reach, and a slowly
 * attracting orbit's distance shrinks geometrically with the periods run, so a swing that passes
 * the finer level at once (clipped at the rails, steady while the loop's slow state still moves)
 * costs no string of failed shootings.
 */
function shootInBatches(c: Context, stepper: TransientStepper, approach: OrbitApproach, plan: BatchPlan, maxStep: number): BatchesEnd {
  const check = () => c.budget.check("during the steady state's transient", c.analysis.span);
  let failure: ShotFailure | null = null;
  let shots = 0;
  let earliest = 0;
  for (let attempt = 0; attempt <= RETRIES; attempt++) {
    const where = stepFailure(() => approach.advance(plan.batch + (attempt === 0 ? plan.growth : 0), plan.waitLevel ? FIRST_LEVEL / LEVEL_RETRY ** shots : undefined, check, earliest), plan.retry, c.analysis);
    if (typeof where === "string") return { kind: "stopped", why: where, failure };
    if (where.kind !== "oscillating") return where;
    if (plan.waitLevel && !where.levelled && attempt < RETRIES) continue;
    shots++;
    const shot = shoot(c, () => recordedStart(c, stepper, plan.periodOf(where.period, shots), maxStep, true), true, attempt < RETRIES ? EARLY_LIMITS : {});
    if (typeof shot !== "string") return { kind: "orbit", orbit: shot };
    failure = { why: shot, periods: approach.periods };
    earliest = BACK_OFF * approach.periods;
  }
  return { kind: "failed", failure: failure! };
}

/**
 * The orbit a circuit whose rest point is stable reaches from a large disturbance (a hard
 * start): started at `kick` of the amplifiers' half range in its dominant pair's mode, the
 * transient either dies out (no orbit within that reach) or levels off on a swing the shooting
 * then converges on, as the search of a circuit that starts by itself does.
 */
function hardStartSearch(c: Context, bias: Float64Array, pole: Pole, maxStep: number, batch: number, kick: number): { orbit: ShotOrbit; transient: SteadyResult["transient"] } | { why: string; transient: SteadyResult["transient"] } {
  const period = (2 * Math.PI) / pole.imag;
  const step = Math.max(maxStep, period / APPROACH_STEPS_PER_PERIOD);
  const mode = modeOfPole(linearize(c.system, bias), pole);
  if (!mode) return { why: "the dominant pair's mode could not be computed to search for a hard start", transient: { periods: 0, until: 0, maxStep: step, solver: emptyStats() } };
  const swinging = largestNode(mode, c.system.unknowns);
  let stopped = "";
  // A kick far out on an ideal diode's exponential can stop the first step: halved, it may still reach the orbit.
  for (let share = kick, halvings = 0; halvings <= HARD_KICK_HALVINGS; share /= 2, halvings++) {
    const stepper = new TransientStepper(c.system, { start: { t: 0, x: kicked(c.system, bias, mode, share) }, maxStep: step, tolerances: loosenedTolerances(c.tolerances, APPROACH_LOOSENING) });
    c.budget.watch(stepper, "the steady state's transient", c.analysis.span);
    // Levelled means changing by much less per period than the pair's own decay.
    const approach = new OrbitApproach(stepper, (x) => x[swinging]!, period, -Math.expm1(pole.real * period));
    const reach = `a disturbance of ${formatQuantity(kickLevel(c.system, bias, share), "V")} at ${c.system.unknowns[swinging]!.label} in that pair's mode`;
    const end = shootInBatches(c, stepper, approach, { batch, growth: 0, waitLevel: true, retry: true, periodOf: (measured) => measured }, maxStep);
    const transient = transientOf(stepper, approach.periods, step);
    if (end.kind === "orbit") return { orbit: end.orbit, transient };
    if (end.kind === "died-out") return { why: `${reach} died out within ${end.periods} periods: no orbit lies within that reach`, transient };
    if (end.kind === "diverged") return { why: `${reach} grew without bound (past ${formatQuantity(end.largest, c.system.unknowns[swinging]!.unit)} within ${end.periods} periods): nothing limits the swing`, transient };
    if (end.kind === "stopped" && !end.failure) {
      stopped = `${reach} stopped the transient (${end.why})`;
      continue;
    }
    return { why: `after ${reach}, no periodic orbit was found in ${end.failure!.periods} periods of transient: ${end.failure!.why}`, transient };
  }
  return { why: stopped, transient: { periods: 0, until: 0, maxStep: step, solver: emptyStats() } };
}

/**
 * Why no orbit was found when the bias point grows only along a real pole while its dominant pair
 * decays (a double-scroll circuit's saddle-focus): the search started in the pair's mode, which
 * does not grow, so what it saw says little about what the circuit does from noise.
 */
function offPairWhy(growing: Pole, pair: Pole, periods: number): string {
  return `no periodic orbit: the bias point grows along a real pole (${formatQuantity(growing.real, "/s")}) while its dominant pair at ${formatQuantity(pair.imag / (2 * Math.PI), "Hz")} decays; started in that pair's mode, the search found no orbit within ${periods} periods of transient. Such a circuit may latch, relax or never repeat (chaos): run startup or transient to see what it does`;
}

/**
 * Runs a stretch of the approach. The large kick puts the charged unknowns where the circuit
 * never goes by itself (a slew-limited follower's pole node far from its input), and the time
 * step can fail there at once: `retry` then gives the reason, so the small start is tried. A
 * failure otherwise is placed at the analysis, as the transient it stopped belongs to it.
 */
function stepFailure<T>(run: () => T, retry: boolean, analysis: SteadyAnalysis): T | string {
  try {
    return run();
  } catch (error) {
    if (!isOnsetError(error) || error.diagnostic.stage !== "simulation" || isRunLimitError(error)) throw error;
    if (retry) return error.message;
    const { span = analysis.span, hint, notes } = error.diagnostic;
    throw simulationError(error.diagnostic.code, `${error.message} during the steady state's transient`, { ...(span ? { span } : {}), ...(hint ? { hint } : {}), ...(notes ? { notes } : {}) });
  }
}

interface Context {
  readonly circuit: Circuit;
  readonly analysis: SteadyAnalysis;
  readonly system: MnaSystem;
  readonly tolerances: Tolerances;
  readonly budget: RunBudget;
  readonly read: ProbeReader;
  readonly singleGrid: boolean;
  readonly waveform: boolean;
  readonly operatingCheck: boolean;
  /** The bias point's dominant pair grows: the circuit oscillates by itself. */
  readonly selfOscillating: boolean;
  /** Told of the orbit a result is built from. */
  readonly onOrbit?: (orbit: RefinedOrbit) => void;
}

type Common = Pick<SteadyResult, "probe" | "unit" | "warnings" | "kind" | "from" | "predicted" | "transient">;

/**
 * Periods the small start's swing may look died out before it counts as died out: `RECOVERY`
 * times the slowest decaying pole's time constant (a peak detector bleeding back down; the caller
 * bounds it by `RECOVERY_BATCHES` batches).
 */
function recoveryPeriods(poles: readonly Pole[], period: number): number {
  return Math.ceil((RECOVERY * slowestTimeConstant(poles.map((p) => p.real))) / period);
}

/**
 * Why a start died out; when the wait for a dip was cut short by its bound (`wanted` > 0 periods
 * of the slowest time constant's patience), how to wait longer: an amplitude loop that
 * over-corrected may come back once its detector has bled down. A swing that grew first and then
 * died (`afterGrowth`) is such a loop; without noise it may never come back (see the sentence).
 */
function diedOutWhy(periods: number, pole: Pole, wanted: number, afterGrowth: boolean): string {
  const why = `no periodic orbit: started in its growing mode, the oscillation ${afterGrowth ? "grew, then " : ""}died out within ${periods} periods (${polesVerdict(pole)})`;
  const wait = wanted === 0 ? "" : `; the bias point's slowest time constant would have it wait ${wanted} periods for an over-corrected amplitude loop to come back, beyond the ${RECOVERY_BATCHES} × cycles= periods allowed: raise cycles= to wait longer (cycles=${cyclesFor(wanted)} waits that long; a start-up run shows whether it comes back)`;
  const noise = afterGrowth
    ? "; an amplitude loop that over-corrects can stop the oscillation after its first overshoot, and the steady analysis runs without noise, so an oscillation sunk below the solver's resolution does not grow back, while in the circuit its noise restarts it once the loop has bled back: run startup, which starts from the circuit's thermal noise"
    : "";
  return `${why}${wait}${noise}`;
}

/** Why there is no orbit when the swing grew without bound: nothing in the circuit limits it. */
function divergedWhy(where: { readonly periods: number; readonly largest: number }, c: Context, swinging: number, pole: Pole): string {
  const past = formatQuantity(where.largest, c.system.unknowns[swinging]!.unit);
  return `no periodic orbit: started in its growing mode, the swing grew without bound (past ${past} at ${c.system.unknowns[swinging]!.label} within ${where.periods} periods; ${polesVerdict(pole)}): nothing in the circuit limits it — an oscillator needs a limiter (diodes, an amplifier's rails, an amplitude loop)`;
}

/** The cycles= whose batches allow a wait of `periods`. */
function cyclesFor(periods: number): number {
  return Math.ceil(periods / RECOVERY_BATCHES);
}

/** When the slowest time constant wants a longer wait than the batches allow, how to give it one (a slow loop's envelope may bounce that long). */
function longerWait(wanted: number, allowed: number): string {
  return wanted > allowed ? `; the bias point's slowest time constant would have an amplitude loop's envelope settle over some ${wanted} periods, beyond the ${RECOVERY_BATCHES} × cycles= periods allowed: raise cycles= to wait longer (cycles=${cyclesFor(wanted)} waits that long)` : "";
}

/** The rightmost pole in the right half-plane (real or complex), or null. */
function rightmostGrowing(poles: readonly Pole[]): Pole | null {
  for (const p of poles) if (p.imag >= 0 && (p.imag > 0 ? startsFrom(p) : p.real > 0)) return p;
  return null;
}

/** What the poles say about a circuit that does not start. */
function polesVerdict(pole: Pole | null): string {
  if (!pole) return "the poles at the bias point are all real and none grows";
  const f = formatQuantity(pole.imag / (2 * Math.PI), "Hz");
  if (startsFrom(pole)) return `the poles' dominant pair at ${f} grows at ${pole.real.toPrecision(4)} /s`;
  if (onImaginaryAxis(pole)) return `the poles' dominant pair at ${f} lies on the imaginary axis (to rounding): it neither grows nor decays`;
  return `the poles' dominant pair at ${f} decays at ${(-pole.real).toPrecision(4)} /s (left half-plane)`;
}

/**
 * bias + k·mode on the charged unknowns, with k so that the mode's largest node voltage swings
 * by `share` of the amplifiers' half range (or of 4 V). The algebraic unknowns start at the bias point and
 * the first step solves them: the mode's values there can lie far out on a diode's exponential,
 * where Newton would not find its way back.
 */
function kicked(system: MnaSystem, bias: Float64Array, mode: Float64Array, share: number): Float64Array {
  let peak = Math.abs(mode[largestNode(mode, system.unknowns)]!);
  if (!(peak > 0)) for (let i = 0; i < system.n; i++) peak = Math.max(peak, Math.abs(mode[i]!));
  const level = kickLevel(system, bias, share);
  const x = Float64Array.from(bias);
  for (const j of system.stateColumns) x[j] = bias[j]! + (level / peak) * mode[j]!;
  return x;
}

/** The swing a kick of `share` gives the mode's largest node: that share of the amplifiers' half range, or of 4 V without amplifiers. */
function kickLevel(system: MnaSystem, bias: Float64Array, share: number): number {
  return share * (amplitudeLimit(system, bias) ?? 4);
}

/** Where a shooting starts: a guessed period start, its grid, the states along it, and a Newton matrix when one is known. */
interface ShootingStart {
  readonly guess: PeriodStart;
  readonly fractions: Float64Array;
  readonly trajectory: readonly Float64Array[];
  readonly jacobian?: ShootingJacobian;
  /** The run's steps merged into each point of the grid (see `recordPeriod`); 1 when none are. */
  readonly merged?: number;
}

/** A shooting's orbit, with how many of the run's steps each point of its grid merges. */
type ShotOrbit = RefinedOrbit & { readonly merged: number };

/** One period recorded from the stepper's state (see `recordPeriod`; its points bounded by stored-points), `autonomous` retimed. */
function recordedStart(c: Context, stepper: TransientStepper, period: number, maxStep: number, autonomous: boolean): ShootingStart {
  const what = "the steady state's recorded period";
  c.budget.refuseSteps(period, maxStep, what, c.analysis.span, "of ");
  const watch = (run: SteppingRun) => c.budget.watch(run, what, c.analysis.span);
  return recordPeriod(c.system, stepper.snapshot(), period, maxStep, c.tolerances, orbitPointLimit(c.budget.maxStoredPoints, c.system.n), autonomous, !autonomous, watch);
}

/** One turn of an orbit shot over `repeats` turns: a period of T/repeats recorded from its start. */
function oneTurn(c: Context, start: PeriodStart, repeats: number): ShootingStart {
  const period = start.period / repeats;
  const maxStep = c.analysis.maxStep ?? period / STEPS_PER_PERIOD;
  const stepper = new TransientStepper(c.system, { start: { t: start.t0, x: start.x }, maxStep, tolerances: c.tolerances });
  return recordedStart(c, stepper, period, maxStep, true);
}

/** A seed's orbit as the start of a shooting. */
function seededStart(seed: OrbitSeed): ShootingStart {
  return { guess: { t0: 0, x: seed.x, period: seed.period }, fractions: seed.fractions, trajectory: seed.states, jacobian: { matrix: seed.matrix, phase: seed.phase, ...(seed.contraction === undefined ? {} : { contraction: seed.contraction }) } };
}

/**
 * The orbit refined by shooting from `start` (see `refineOrbit`), with the Floquet multipliers;
 * the reason when no orbit is found, or when the shooting only found the rest point.
 */
function shoot(c: Context, start: () => ShootingStart, autonomous: boolean, limits: Pick<ShootingOptions, "maxIterations" | "giveUpAfter" | "predictedMultipliers"> = {}, reshot = false): ShotOrbit | string {
  try {
    const { guess, fractions, trajectory, jacobian, merged = 1 } = start();
    const period = guess.period;
    const settings = {
      tolerances: c.tolerances,
      autonomous,
      relative: (c.singleGrid ? SAMPLE_ORBIT_SHARE : ORBIT_SHARE) * c.tolerances.lteRelative,
      corners: autonomous ? [] : cornersWithin(c.system, guess.t0, period),
      multipliers: true,
      ...limits,
      ...(jacobian ? { jacobian } : {}),
      check: () => c.budget.check("during the steady state's shooting", c.analysis.span),
    };
    const orders = thdOrder(c.analysis, 1 / period);
    const refined = c.singleGrid ? singleGridOrbit(c.system, guess, fractions, trajectory, c.read, orders, settings) : refineOrbit(c.system, guess, fractions, trajectory, c.read, orders, settings);
    // A driven orbit is the sources' forced response, however small its swing; it is the rest
    // point only in a circuit that oscillates by itself (its bias point, unstable, carrying the forced ripple).
    if ((autonomous || c.selfOscillating) && collapsed(c.system, c.tolerances, refined)) return "the shooting converged to the rest point";
    // Converged on k turns of the orbit (x(kT) = x(0) holds too): shoot one turn instead.
    const repeats = autonomous && !reshot ? repeatsWithin(refined.orbit, c.system.stateColumns, absoluteTolerances(c.system.unknowns, c.tolerances, "lte")) : 1;
    if (repeats > 1) return shoot(c, () => oneTurn(c, refined.orbit.start, repeats), autonomous, limits, true);
    return { ...refined, merged };
  } catch (error) {
    if (!isOnsetError(error) || isRunLimitError(error)) throw error;
    return error.diagnostic.message;
  }
}

/** The orbit on the transient's own grid only, as a refined orbit without error bars (`numericalError` zero, both grids the same). */
function singleGridOrbit(
  system: MnaSystem,
  guess: PeriodStart,
  fractions: Float64Array,
  trajectory: readonly Float64Array[],
  read: ProbeReader,
  orders: number,
  settings: ShootingOptions & { readonly corners: readonly number[] },
): RefinedOrbit {
  const orbit = shootOrbit(system, guess, fractions, trajectory, settings);
  const metrics = orbitMetrics(orbit, read, orders, settings.corners);
  return { ...metrics, numericalError: { frequency: 0, amplitude: 0, rms: 0, thd: 0 }, orbit, points: [fractions.length, fractions.length], iterations: [orbit.iterations, 0], finerMultipliers: [] };
}

/** True when every charged state of the orbit swings by less than a few hundred times its tolerance. */
function collapsed(system: MnaSystem, tolerances: Tolerances, refined: RefinedOrbit): boolean {
  const floor = absoluteTolerances(system.unknowns, tolerances, "lte");
  for (const j of system.stateColumns) {
    let lo = Infinity;
    let hi = -Infinity;
    for (const x of refined.orbit.states) {
      lo = Math.min(lo, x[j]!);
      hi = Math.max(hi, x[j]!);
    }
    if (hi - lo > COLLAPSED * floor[j]!) return false;
  }
  return true;
}

/** The ambient (K) of the analysis' self-heated parts: its `temperature=`, else 27 °C. */
function ambientOf(analysis: SteadyAnalysis): number {
  return (analysis.temperature ?? DEFAULT_TEMPERATURE) + ZERO_CELSIUS;
}

/** ln(0.9·A/k)/σ from the thermal noise's level k at the probe (√2 × its r.m.s.). */
function predictedStartup(c: Context, x: Float64Array, poles: readonly Pole[], pole: Pole, amplitude: number): number | null {
  if (!(pole.real > 0)) return null;
  const thermal: StartupAnalysis = { kind: "startup", probe: c.analysis.probe, until: "auto", kick: "thermal", ...(c.analysis.temperature === undefined ? {} : { temperature: c.analysis.temperature }) };
  const setup = excitationSetup(c.circuit, c.system, thermal, "thermal", pole.imag / (2 * Math.PI));
  if (setup.generators.length === 0) return null;
  const check = () => c.budget.check("during the predicted start-up's noise level", c.analysis.span);
  const rms = noiseLevel(linearize(c.system, x), probeWeights(c.system, c.analysis.probe, x), setup.generators, setup.bank.corner, poles, check);
  const k = Math.SQRT2 * rms;
  return k > 0 && STARTUP_FRACTION * amplitude > k ? Math.log((STARTUP_FRACTION * amplitude) / k) / pole.real : null;
}

function transientOf(stepper: TransientStepper, periods: number, maxStep: number): SteadyResult["transient"] {
  return { periods, until: stepper.t, maxStep, solver: { ...stepper.stats } };
}

function emptyStats(): StepperStats {
  return { accepted: 0, rejected: 0, newtonFailures: 0, newtonIterations: 0, factorizations: 0, breakpoints: 0 };
}

function noOrbit(common: Common, explanation: string): SteadyResult {
  return {
    analysis: "steady",
    ...common,
    found: false,
    hardStart: false,
    explanation,
    frequency: null,
    period: null,
    amplitude: null,
    peakToPeak: null,
    rms: null,
    offset: null,
    thd: null,
    thdOrders: [2, 2],
    harmonics: [],
    numericalError: null,
    iterations: null,
    points: null,
    shooting: null,
    multipliers: [],
    multiplierError: null,
    trivialMultiplier: null,
    stability: null,
    waveform: { time: new Float64Array(0), values: new Float64Array(0) },
  };
}

/**
 * The result of a converged orbit. `hardStart`, for an orbit of a circuit whose rest point is
 * stable: what the poles say there (the circuit does not start by itself; only a disturbance
 * beyond the orbit's threshold takes it there).
 */
function found(c: Context, orbit: ShotOrbit, common: Common, hardStart?: string): SteadyResult {
  const period = orbit.orbit.start.period;
  const multipliers = nonTrivialMultipliers(orbit.orbit.multipliers, common.kind === "autonomous");
  const stability = orbitStability(multipliers, period);
  const unit = common.unit;
  const what = `${common.kind === "driven" ? "driven orbit" : "oscillates"} at ${formatQuantity(orbit.frequency, "Hz")}, ${formatQuantity(orbit.amplitude, unit)} peak`;
  const how =
    stability.verdict === "stable"
      ? stability.largest
        ? `stable: a disturbance shrinks by ${Math.hypot(stability.largest.re, stability.largest.im).toPrecision(3)} per period`
        : "stable"
      : stability.verdict === "unstable"
        ? `unstable: a disturbance grows by ${Math.hypot(stability.largest!.re, stability.largest!.im).toPrecision(3)} per period, so the circuit leaves this orbit`
        : "marginal: its largest multiplier lies on the unit circle";
  if (!(orbit.frequency > 0)) throw simulationError("orbit-period", "the orbit's period is not positive");
  c.onOrbit?.(orbit);
  const implausible = c.operatingCheck ? implausibleWarnings(c.system, orbit.orbit) : [];
  const drives = common.kind === "driven" ? periodicDrives(c.circuit) : [];
  // A driven orbit whose sources have no tone at its period has no fundamental, whatever the
  // spectrum holds there (50 Hz and 60 Hz through a clipper give 10 Hz at 9th order: THD 14757 %).
  const toneless = fundamentalAbsent(orbit.harmonics) || (drives.length > 0 && !sourceToneAt(drives, orbit.frequency));
  const bandless = !toneless && noHarmonicInBand(c.analysis.bandwidth, orbit.frequency);
  return {
    analysis: "steady",
    ...common,
    warnings: [
      ...common.warnings,
      ...implausible,
      ...(orbit.merged > 1 ? [mergedWarning(c, orbit.merged)] : []),
      ...(bandless ? [bandWarning(c.analysis.bandwidth!, orbit.frequency, c.analysis.span)] : []),
      ...(toneless ? [tonelessWarning(probeName(c.analysis.probe), orbit.frequency, drives, c.analysis.span)] : []),
      ...(orbit.peakToPeak < probeFloor(unit, c.tolerances) ? [belowFloorWarning(c, orbit.peakToPeak, unit)] : []),
    ],
    found: true,
    hardStart: hardStart !== undefined,
    explanation: hardStart === undefined ? `${what}; ${how}` : `${what}; ${how}; a hard start: ${hardStart}, so it does not start by itself, and only a disturbance large enough reaches this orbit`,
    frequency: orbit.frequency,
    period: 1 / orbit.frequency,
    amplitude: orbit.amplitude,
    peakToPeak: orbit.peakToPeak,
    rms: orbit.rms,
    offset: orbit.offset,
    thd: toneless || bandless ? null : orbit.thd,
    thdOrders: [2, orbit.harmonics.length],
    harmonics: toneless ? relativeToLargest(orbit.harmonics) : orbit.harmonics,
    numericalError: c.singleGrid ? null : toneless || bandless ? { ...orbit.numericalError, thd: NaN } : orbit.numericalError,
    iterations: orbit.iterations,
    points: orbit.points,
    shooting: orbit.orbit.jacobian.matrix.length === 0 ? "matrix-free" : "dense",
    multipliers,
    multiplierError: c.singleGrid ? null : multiplierBars(multipliers, orbit.finerMultipliers),
    trivialMultiplier: trivialMultiplier(orbit.orbit.multipliers, common.kind === "autonomous"),
    stability,
    waveform: c.waveform ? orbitWaveform(orbit.orbit, c.read) : { time: new Float64Array(0), values: new Float64Array(0) },
  };
}

/** The `implausible-operation` warnings of the parts along the orbit (every point, at the sources' time). */
function implausibleWarnings(system: MnaSystem, orbit: RefinedOrbit["orbit"]): Diagnostic[] {
  const times = orbitTimes(orbit);
  const { states, start } = orbit;
  const at = times.map((t) => start.t0 + t);
  return implausibleOnOrbit(system, at, states, (k, out) => orbitRate(times, states, k, out)).map((w) => w.diagnostic);
}

/**
 * The note of an orbit the probe barely sees: it swings by less than the step control's absolute
 * tolerance on it (a node the oscillation does not reach, a supply, a forced response far down a
 * filter's slope). The orbit is the circuit's; the probe's figures lie below what the steps hold.
 */
function belowFloorWarning(c: Context, peakToPeak: number, unit: QuantityUnit): Diagnostic {
  const floor = formatQuantity(probeFloor(unit, c.tolerances), unit);
  return {
    severity: "warning",
    stage: "simulation",
    code: "probe-below-floor",
    message: `the probe ${probeName(c.analysis.probe)} swings by ${formatQuantity(peakToPeak, unit)} over the orbit, less than the accuracy floor of ${floor}: the orbit is the circuit's, but the steps hold this probe's figures only to that floor`,
    ...(c.analysis.span ? { span: c.analysis.span } : {}),
    hint: "probe a node the oscillation swings, or lower accuracy-floor= to hold a small swing",
  };
}

/** The warning of a steady analysis whose orbit grid merges the run's steps (a max-step far below the period). */
function mergedWarning(c: Context, merged: number): Diagnostic {
  return {
    severity: "warning",
    stage: "simulation",
    code: "orbit-grid-merged",
    message: mergedGridNote(merged, c.budget.maxStoredPoints),
    ...(c.analysis.span ? { span: c.analysis.span } : {}),
    hint: "the figures and their error bars are those of the merged grid",
  };
}

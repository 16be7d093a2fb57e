import { inputError, OnsetError, type Diagnostic, type SourceSpan } from "../circuit/diagnostic.js";

/**
 * Bounds on the work of one call, for a service that runs circuits it did not write. Every
 * analysis, `runCircuit`, `runSweep` and `runToleranceStudy` accept them (`options.limits`);
 * a limit that runs out stops the call with a {@link RunLimitError} naming it.
 *
 * @remarks
 * `maxSteps` and `maxSimulatedTime` bound each time-domain run on its own (a transient, a
 * start-up run, each sweep setting, each Monte Carlo sample); `maxWallTime` and `signal`
 * bound the whole call, a study with all its samples included. The wall clock and the signal
 * are looked at every 8 accepted time steps and between the stages of an analysis (bias
 * point, poles, each frequency of a response, each sweep setting or sample). A synchronous
 * call holds the thread, so an `AbortSignal` aborted by a timer or a request fires only in
 * the asynchronous study (`runToleranceStudy`, between samples, and at once on worker
 * threads); inside a synchronous call it can be aborted by the call's own callbacks
 * (`onProgress`, a step observer). The wall time and the simulated time are off unless given;
 * the step budget and the sizes of studies have defaults ({@link RUN_LIMITS}), so a file cannot
 * ask for work without end; `Infinity` lifts any of them.
 */
export interface RunLimits {
  /**
   * Accepted time steps of one time-domain run. A run whose `until` and `max-step` need more
   * steps than this is refused before it starts; any other run stops when the budget is spent.
   * @defaultValue 10 000 000
   */
  readonly maxSteps?: number;
  /**
   * Simulated time (s) of one time-domain run. A run with a fixed `until` longer than this is
   * refused before it starts; `until=auto` stops when it passes it.
   * @defaultValue no limit
   */
  readonly maxSimulatedTime?: number;
  /**
   * Wall-clock time (s) of the whole call, from its start.
   * @defaultValue no limit
   */
  readonly maxWallTime?: number;
  /** Stops the call when aborted (see the remarks for when it is looked at). */
  readonly signal?: AbortSignal;
  /**
   * Settings one sweep visits (`steps=`, or what `step=` leads to).
   * @defaultValue 10 000
   */
  readonly maxSweepPoints?: number;
  /**
   * Samples of one tolerance study (`runs=`).
   * @defaultValue 100 000
   */
  readonly maxRuns?: number;
  /**
   * Samples of a sweep with a tolerance study at each setting (settings × runs).
   * @defaultValue 1 000 000
   */
  readonly maxStudyRuns?: number;
  /**
   * Values a transient or a start-up run keeps of its waveforms (time points × (probes + 1)); a
   * longer run keeps every 2nd, 4th, … accepted step (a start-up run: before its last quarter of
   * them), so memory stays within this whatever the run's length. A start-up run whose thinned
   * points would fall below 32 per period stops with `stored-points-limit` (its cycles could no
   * longer be measured): refused up front past about stored-points / 85 predicted periods, and
   * stopped where thinning crosses that line, from about stored-points / 170 periods on. It also
   * bounds a settled orbit's grid (the start-up run's and the steady analysis'): at most
   * stored-points / (8 × unknowns) points per period, at least 256; a finer run's steps are merged
   * in twos, fours, … (the start-up result's settled note says so).
   * @defaultValue 2 000 000 (16 MB)
   */
  readonly maxStoredPoints?: number;
  /**
   * Unknowns of a circuit whose analyses at the bias point are dense (n × n matrices: the poles,
   * and with them every start-up, steady and poles analysis; a response's 2n × 2n real form; memory grows as n², about 1.8 GB at
   * 6000 unknowns, and time as n³): above it such an analysis is refused before it allocates them.
   * A transient is sparse and has no such limit.
   * @defaultValue 4000
   */
  readonly maxDenseUnknowns?: number;
}

/** The default of each counted limit (the others are off unless given). */
export const RUN_LIMITS = {
  maxSteps: 10_000_000,
  maxSweepPoints: 10_000,
  maxRuns: 100_000,
  maxStudyRuns: 1_000_000,
  maxStoredPoints: 2_000_000,
  maxDenseUnknowns: 4000,
} as const;

/** The command-line name of each limit (`--limit NAME=VALUE`; the wall time is `--time-limit`). */
export const RUN_LIMIT_FLAGS = {
  maxSteps: "steps",
  maxSimulatedTime: "simulated-time",
  maxSweepPoints: "sweep-points",
  maxRuns: "runs",
  maxStudyRuns: "study-runs",
  maxStoredPoints: "stored-points",
  maxDenseUnknowns: "dense-unknowns",
} as const;

/** The name of a limit in {@link RunLimits}. */
export type LimitName = keyof RunLimits;

/** The error code of each limit, as documented (`docs/language.md`, "Limits"). */
export const LIMIT_CODES: Readonly<Record<LimitName, string>> = {
  maxSteps: "step-limit",
  maxSimulatedTime: "simulated-time-limit",
  maxWallTime: "wall-time-limit",
  signal: "aborted",
  maxSweepPoints: "sweep-limit",
  maxRuns: "runs-limit",
  maxStudyRuns: "study-limit",
  maxStoredPoints: "stored-points-limit",
  maxDenseUnknowns: "dense-limit",
};

/**
 * A run stopped because a limit of {@link RunLimits} ran out (or its signal was aborted). It
 * is an {@link OnsetError} whose code names the limit (`step-limit`, `simulated-time-limit`,
 * `wall-time-limit`, `aborted`), with what was met and how to raise it.
 */
export class RunLimitError extends OnsetError {
  /** Which limit ran out. */
  readonly limit: LimitName;
  /** The limit's value (steps, s); null for an aborted signal. */
  readonly value: number | null;
  /** What the run had reached when it stopped (steps, s of simulated or wall time). */
  readonly reached: number;
  constructor(diagnostic: Diagnostic, limit: LimitName, value: number | null, reached: number) {
    super(diagnostic);
    this.name = "RunLimitError";
    this.limit = limit;
    this.value = value;
    this.reached = reached;
  }
}

/** The plain data of a {@link RunLimitError}, to carry it across a worker boundary. */
export interface RunLimitRecord {
  readonly diagnostic: Diagnostic;
  readonly limit: LimitName;
  readonly value: number | null;
  readonly reached: number;
}

/** Rebuilds a {@link RunLimitError} from its plain data. */
export function runLimitError(record: RunLimitRecord): RunLimitError {
  return new RunLimitError(record.diagnostic, record.limit, record.value, record.reached);
}

/** How to raise each limit, from the API and from the command line. */
const RAISE: Readonly<Record<LimitName, string>> = {
  maxSteps: "raise the limit with --limit steps=N (API: limits.maxSteps), or give the analysis a larger max-step or a shorter run (until=; cycles= on steady)",
  maxSimulatedTime: "raise the limit with --limit simulated-time=T (API: limits.maxSimulatedTime), or shorten the run (until=; cycles= on steady)",
  maxWallTime: "raise the limit with --time-limit SECONDS (API: limits.maxWallTime)",
  signal: "the caller aborted the run",
  maxSweepPoints: "raise the limit with --limit sweep-points=N (API: limits.maxSweepPoints), or sweep with fewer steps",
  maxRuns: "raise the limit with --limit runs=N (API: limits.maxRuns), or run the study in shards (--shard k/n) of fewer runs each",
  maxStudyRuns: "raise the limit with --limit study-runs=N (API: limits.maxStudyRuns), or sweep fewer settings or draw fewer runs",
  maxStoredPoints: "raise the limit with --limit stored-points=N (API: limits.maxStoredPoints)",
  maxDenseUnknowns: "raise the limit with --limit dense-unknowns=N (API: limits.maxDenseUnknowns): memory grows as the square of the unknowns, time as the cube; a transient analysis has no such limit",
};

/** A count as people read it: `10 000 000`, `1e+12`. */
function count(value: number): string {
  return value < 1e15 ? Math.round(value).toLocaleString("en-US").replace(/,/g, " ") : value.toPrecision(3);
}

function seconds(value: number): string {
  return `${Number(value.toPrecision(4))} s`;
}

function limitError(limit: LimitName, value: number | null, reached: number, message: string, span?: SourceSpan): RunLimitError {
  const diagnostic: Diagnostic = { severity: "error", stage: "simulation", code: LIMIT_CODES[limit], message, hint: RAISE[limit], ...(span ? { span } : {}) };
  return new RunLimitError(diagnostic, limit, value, reached);
}

/**
 * The error of a run whose stored waveform would be thinned below what its measurement needs
 * (`stored-points-limit`): `value` the limit, `reached` what it would have needed.
 */
export function storedPointsError(value: number, reached: number, message: string, span?: SourceSpan): RunLimitError {
  return limitError("maxStoredPoints", value, reached, message, span);
}

/** A limit counted in whole numbers. */
type CountLimit = keyof typeof RUN_LIMITS;

function checked(limits: RunLimits, name: CountLimit | "maxSimulatedTime" | "maxWallTime"): number {
  const value = limits[name];
  if (value === undefined) return name in RUN_LIMITS ? RUN_LIMITS[name as CountLimit] : Infinity;
  const whole = name in RUN_LIMITS;
  if (typeof value !== "number" || !(value > 0) || (whole && value !== Infinity && !Number.isSafeInteger(value))) {
    throw inputError("bad-limit", `limits.${name} must be ${whole ? "a whole number" : "a number of seconds"} above 0, got ${String(value)}`, {
      hint: "leave it out (or give Infinity) for no limit",
    });
  }
  return value;
}

/** Milliseconds on this thread's monotonic clock. */
function clockMs(): number {
  return performance.now();
}

/** The limits of a {@link RunBudget} as plain data for a worker thread (no signal: it cannot be posted). */
export interface WorkerLimits {
  readonly maxSteps: number;
  readonly maxStoredPoints: number;
  readonly maxDenseUnknowns: number;
  readonly maxSimulatedTime: number;
  /** What was left of the wall time when the job was sent (s). */
  readonly maxWallTime: number;
}

/** Anything that reports its accepted time steps (the transient stepper). */
export interface SteppingRun {
  observe(observer: (t: number) => void): void;
}

/**
 * The {@link RunLimits} of one call, with its clock started: analyses, sweeps and studies
 * hand one budget down (`options.budget`) so the wall time counts from the outermost call.
 * A service may also create one and share it between several calls.
 */
export class RunBudget {
  /** The limits, checked. */
  readonly maxSteps: number;
  readonly maxSimulatedTime: number;
  readonly maxWallTime: number;
  readonly maxSweepPoints: number;
  readonly maxRuns: number;
  readonly maxStudyRuns: number;
  readonly maxStoredPoints: number;
  readonly maxDenseUnknowns: number;
  readonly signal: AbortSignal | undefined;
  /** When the wall time runs out (ms on this thread's clock; another thread gets what is left). */
  private readonly deadline: number;
  private readonly started: number;

  /** Starts the clock of `limits` now. */
  constructor(limits: RunLimits = {}) {
    if (typeof limits !== "object" || limits === null) throw inputError("bad-limit", "limits must be an object such as { maxWallTime: 10 }");
    this.maxSteps = checked(limits, "maxSteps");
    this.maxSimulatedTime = checked(limits, "maxSimulatedTime");
    this.maxWallTime = checked(limits, "maxWallTime");
    this.maxSweepPoints = checked(limits, "maxSweepPoints");
    this.maxRuns = checked(limits, "maxRuns");
    this.maxStudyRuns = checked(limits, "maxStudyRuns");
    this.maxStoredPoints = checked(limits, "maxStoredPoints");
    this.maxDenseUnknowns = checked(limits, "maxDenseUnknowns");
    if (limits.signal !== undefined && !(typeof limits.signal === "object" && limits.signal !== null && "aborted" in limits.signal)) {
      throw inputError("bad-limit", "limits.signal must be an AbortSignal");
    }
    this.signal = limits.signal;
    this.started = clockMs();
    this.deadline = this.started + this.maxWallTime * 1000;
  }

  /** Wall time left (s); Infinity without a limit. */
  remaining(): number {
    return this.maxWallTime === Infinity ? Infinity : (this.deadline - clockMs()) / 1000;
  }

  /** The limits as plain data for another thread, the wall time as what is left of it now. */
  forWorker(): WorkerLimits {
    return { maxSteps: this.maxSteps, maxStoredPoints: this.maxStoredPoints, maxDenseUnknowns: this.maxDenseUnknowns, maxSimulatedTime: this.maxSimulatedTime, maxWallTime: Math.max(this.remaining(), 1e-9) };
  }

  /** True when the signal is aborted or the wall time has run out (cheap: no message is made). */
  spent(): boolean {
    return this.signal?.aborted === true || (this.maxWallTime !== Infinity && clockMs() >= this.deadline);
  }

  /**
   * Throws a {@link RunLimitError} when the signal is aborted or the wall time has run out;
   * `where` ends its message ("between samples"), `span` places it (the analysis's line).
   */
  check(where?: string, span?: SourceSpan): void {
    const at = where === undefined ? "" : ` ${where}`;
    if (this.signal?.aborted) throw limitError("signal", null, (clockMs() - this.started) / 1000, `the run was aborted${at}`, span);
    if (this.maxWallTime === Infinity) return;
    const now = clockMs();
    if (now >= this.deadline) {
      const spent = (now - this.started) / 1000;
      throw limitError("maxWallTime", this.maxWallTime, spent, `the wall-time limit of ${seconds(this.maxWallTime)} ran out${at} (${seconds(spent)} spent)`, span);
    }
  }

  /** Refuses up front a time-domain run of fixed length `until` (s) longer than the simulated-time limit. */
  refuseLength(until: number, what: string, span?: SourceSpan): void {
    if (until > this.maxSimulatedTime) {
      throw limitError(
        "maxSimulatedTime",
        this.maxSimulatedTime,
        until,
        `${what} until=${seconds(until)} is longer than the simulated-time limit of ${seconds(this.maxSimulatedTime)}; it was not started`,
        span,
      );
    }
  }

  /**
   * Refuses up front a run of fixed length that cannot finish within the step budget: no step
   * is longer than `maxStep`, so it needs at least `until / maxStep` steps. `length` names the
   * run's length in the message (`until=`, or `over` for a length the analysis chose: a period).
   */
  refuseSteps(until: number, maxStep: number, what: string, span?: SourceSpan, length = "until="): void {
    const needed = Math.ceil(until / maxStep);
    if (needed > this.maxSteps) {
      throw limitError(
        "maxSteps",
        this.maxSteps,
        needed,
        `${what} ${length}${seconds(until)} with max-step=${seconds(maxStep)} needs at least ${count(needed)} steps, more than the step limit of ${count(this.maxSteps)}; it was not started`,
        span,
      );
    }
  }

  /**
   * Refuses up front an analysis of a circuit of `unknowns` whose matrices are dense, `order` ×
   * `order` (the bias point's poles: n × n; a response's real form: 2n × 2n), above the
   * dense-unknowns limit; `what` names it ("the poles").
   */
  refuseDense(unknowns: number, what: string, span?: SourceSpan, order = unknowns): void {
    if (unknowns > this.maxDenseUnknowns) {
      const megabytes = (8 * order * order) / 1e6;
      throw limitError(
        "maxDenseUnknowns",
        this.maxDenseUnknowns,
        unknowns,
        `${what} for a circuit of ${count(unknowns)} unknowns would need dense ${count(order)} × ${count(order)} matrices (${megabytes < 1 ? "under 1" : count(megabytes)} MB each), more than the dense-unknowns limit of ${count(this.maxDenseUnknowns)}; not started`,
        span,
      );
    }
  }

  /**
   * Refuses a study of `size` settings or samples above its limit before anything is
   * allocated; `what` says what was counted ("the sweep visits 1e12 settings").
   */
  refuseStudy(limit: "maxSweepPoints" | "maxRuns" | "maxStudyRuns", size: number, what: string, span?: SourceSpan): void {
    const max = this[limit];
    if (!(size <= max)) {
      const name = { maxSweepPoints: "sweep-points", maxRuns: "runs", maxStudyRuns: "study-runs" }[limit];
      throw limitError(limit, max, size, `${what}, more than the ${name} limit of ${count(max)}`, span);
    }
  }

  /**
   * Watches a time-domain run: after every accepted step, the step count and the simulated
   * time; every 8 steps, the wall clock and the signal. `what` names the run in messages ("the transient"), `span`
   * places them (the analysis's line in the file).
   */
  watch(run: SteppingRun, what: string, span?: SourceSpan): void {
    let steps = -1;
    const { maxSteps, maxSimulatedTime } = this;
    const clocked = this.maxWallTime !== Infinity || this.signal !== undefined;
    run.observe((t) => {
      // The first call is the starting point, not a step.
      if (++steps > maxSteps) {
        throw limitError("maxSteps", maxSteps, steps, `${what} reached the step limit of ${maxSteps} accepted steps at t = ${seconds(t)}`, span);
      }
      if (t > maxSimulatedTime) {
        throw limitError("maxSimulatedTime", maxSimulatedTime, t, `${what} passed the simulated-time limit of ${seconds(maxSimulatedTime)} (at t = ${seconds(t)})`, span);
      }
      // The clock every 8th step (a step is microseconds; reading the clock costs ~60 ns).
      if (clocked && (steps & 7) === 0 && this.spent()) this.check(`during ${what} at t = ${seconds(t)}`, span);
    });
  }
}

/** What an analysis needs to find its budget: the caller's shared one, or limits to start one from. */
export interface BudgetOptions {
  readonly limits?: RunLimits;
  readonly budget?: RunBudget;
}

/** The budget of a call: the one handed down, or a new one started from `limits`. */
export function budgetOf(options: BudgetOptions): RunBudget {
  return options.budget ?? new RunBudget(options.limits);
}

/** True for a {@link RunLimitError}. */
export function isRunLimitError(value: unknown): value is RunLimitError {
  return value instanceof RunLimitError;
}

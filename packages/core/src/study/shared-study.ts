import type { ToleranceAnalysis, ToleranceSpec } from "../circuit/circuit.js";
import { isRunLimitError, RunBudget, type RunLimitRecord, type WorkerLimits } from "../analyses/limits.js";
import { builtSample, runBuilt, sampleHere, type BuiltSample, type CircuitBuilder, type SampleSource, type StudyPlan } from "./study-plan.js";
import type { ToleranceSample } from "./summary.js";

/**
 * A circuit builder that a worker thread can make for itself: `(await import(module))[name](data)`
 * is the builder, `data` plain (structured-cloneable) data. It must build the same circuits as the
 * study's `build` (checked on the nominal); `programBuilder` of `@onset/netlist-parser` is one.
 */
export interface PortableBuilder {
  /** A URL (`file:` or a package specifier the worker can resolve) of an ES module. */
  readonly module: string;
  /** Its export: a function from `data` to a {@link CircuitBuilder}. */
  readonly name: string;
  readonly data: unknown;
}

/**
 * A study whose samples worker threads draw, build and run themselves, taking the next index from
 * a counter they share with the calling thread: plain data, posted once to each worker (its
 * {@link SharedPlan} follows when the calling thread has it).
 */
export interface SharedStudy {
  readonly builder: PortableBuilder;
  readonly tolerances: readonly ToleranceSpec[];
  readonly analysis: ToleranceAnalysis;
  readonly fixed?: Readonly<Record<string, number>>;
  /** The threads taking samples: the workers and the calling thread. */
  readonly jobs: number;
  /** The sample indices to run, in the order they are taken. */
  readonly indices: readonly number[];
  /** One Int32: the position in `indices` of the next sample to take (Atomics.add). */
  readonly next: SharedArrayBuffer;
}

/** What the calling thread plans once for every sample (see `studyPlan`), posted to each worker. */
export type SharedPlan = Pick<StudyPlan, "settings" | "predictor">;

/** What a worker tells of a shared study, in this order: its nominal, then samples (or indices it hands back), then the end. */
export type SharedStudyReport =
  | { readonly nominal: string }
  | { readonly sample: ToleranceSample }
  /** A sample the worker could not build: the calling thread runs it (and reports the builder's error itself). */
  | { readonly returned: number }
  /** The worker took no (more) samples: it could not make the builder. */
  | { readonly unavailable: string }
  | { readonly limit: RunLimitRecord }
  | { readonly done: true };

/**
 * `import(specifier)` as Node runs it: written so that the CommonJS build keeps it an import
 * (the bundler turns a plain one into `require`, which cannot load an ES module or a URL). Made
 * when a worker needs it, not when the library is imported (a page's policy may refuse it).
 */
function importModule(specifier: string): Promise<unknown> {
  return (new Function("specifier", "return import(specifier)") as (specifier: string) => Promise<unknown>)(specifier);
}

/** The nominal circuit as the calling thread compares it with a worker's (the same builder gives the same text). */
export function nominalKey(build: CircuitBuilder, fixed: Readonly<Record<string, number>> | undefined): string {
  return JSON.stringify(build({ ...fixed }));
}

/** Takes the next position in the study's indices, or −1 when none is left. */
export function takeNext(counter: Int32Array, count: number): number {
  const k = Atomics.add(counter, 0, 1);
  return k < count ? k : -1;
}

/** Stops every thread taking samples (after a limit or an error). */
export function takeNoMore(counter: Int32Array, count: number): void {
  Atomics.store(counter, 0, count);
}

/**
 * A worker's part of a shared study: makes the builder and its nominal, and builds samples ahead,
 * while the calling thread plans; then runs samples with the plan it is sent until none is left,
 * reporting each as it ends.
 */
export async function runSharedStudy(study: SharedStudy, limits: WorkerLimits, planned: Promise<SharedPlan>, report: (r: SharedStudyReport) => void): Promise<void> {
  const counter = new Int32Array(study.next);
  const count = study.indices.length;
  const budget = new RunBudget(limits);
  let build: CircuitBuilder;
  try {
    const made = ((await importModule(study.builder.module)) as Record<string, unknown>)[study.builder.name];
    if (typeof made !== "function") throw new Error(`${study.builder.module} has no function ${study.builder.name}`);
    build = (made as (data: unknown) => CircuitBuilder)(study.builder.data);
    report({ nominal: nominalKey(build, study.fixed) });
  } catch (error) {
    report({ unavailable: error instanceof Error ? error.message : String(error) });
    return;
  }
  const source: SampleSource = { tolerances: study.tolerances, analysis: study.analysis, ...(study.fixed ? { fixed: study.fixed } : {}) };
  // While the calling thread plans, build samples ahead (taken from the counter as any other):
  // time this thread would spend waiting, which warms its builder. At most half the share it
  // would take anyway, so a small study is not left to a cold thread.
  let posted: SharedPlan | undefined;
  void planned.then((p) => (posted = p));
  const ahead: Array<{ readonly index: number; readonly built: BuiltSample }> = [];
  const most = Math.floor(count / (2 * study.jobs));
  while (posted === undefined && ahead.length < most) {
    const k = takeNext(counter, count);
    if (k < 0) break;
    const index = study.indices[k]!;
    try {
      ahead.push({ index, built: builtSample(source, build, index) });
    } catch {
      report({ returned: index });
    }
    await new Promise((resolve) => setImmediate(resolve));
  }
  const plan: StudyPlan = { ...source, ...(posted ?? (await planned)) };
  /** Runs one sample and reports it; false when a limit ran out (reported). */
  const run = (index: number, built?: BuiltSample): boolean => {
    try {
      budget.check("between samples");
      report({ sample: built ? runBuilt(plan, index, built, budget) : sampleHere(plan, build, index, budget) });
    } catch (error) {
      if (isRunLimitError(error)) {
        report({ limit: limitRecord(error) });
        return false;
      }
      report({ returned: index });
    }
    return true;
  };
  for (const { index, built } of ahead) if (!run(index, built)) return;
  for (let k = takeNext(counter, count); k >= 0; k = takeNext(counter, count)) if (!run(study.indices[k]!)) return;
  report({ done: true });
}

/** A limit error as plain data (the calling thread throws it again). */
export function limitRecord(error: RunLimitRecord): RunLimitRecord {
  return { diagnostic: error.diagnostic, limit: error.limit, value: error.value, reached: error.reached };
}

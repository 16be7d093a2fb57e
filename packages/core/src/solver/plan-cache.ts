import { compileElimination, type CompiledElimination } from "./compiled-elimination.js";
import { EliminationSchedule } from "./elimination-schedule.js";

/** A pivot order with its schedule and, for small circuits, its generated code (all read-only). */
export interface Plan {
  readonly rowOrder: Int32Array;
  readonly colOrder: Int32Array;
  readonly schedule: EliminationSchedule;
  readonly compiled: CompiledElimination | undefined;
}

/**
 * Patterns up to this many entries keep their plans: a small circuit orders afresh a few times
 * per run, and building the schedule and its code cost as much as the run's first steps; every
 * run and Monte Carlo sample of one topology meets the same few orders. Larger patterns plan
 * rarely and would make the keys and the kept schedules large.
 */
const CACHED_ENTRIES = 1000;
/** Distinct plans kept; beyond it the cache starts over (as generated-code.ts). */
const CACHE_LIMIT = 256;
const cache = new Map<string, Plan>();

/**
 * The plan of a pattern (`rows[e]`, `cols[e]`) eliminated in the given order: a pure function of
 * its arguments, so a kept one is the same as a new one.
 */
export function planOf(n: number, rows: Int32Array, cols: Int32Array, rowOrder: Int32Array, colOrder: Int32Array, compile: boolean): Plan {
  const cached = rows.length <= CACHED_ENTRIES;
  const key = cached ? `${compile ? 1 : 0};${n};${rows.join(",")};${cols.join(",")};${rowOrder.join(",")};${colOrder.join(",")}` : "";
  const known = cached ? cache.get(key) : undefined;
  if (known) return known;
  const schedule = new EliminationSchedule(n, rows, cols, rowOrder, colOrder);
  const compiled = compile ? compileElimination(schedule, n, rowOrder, colOrder) : undefined;
  const plan: Plan = { rowOrder, colOrder, schedule, compiled };
  if (cached) {
    if (cache.size >= CACHE_LIMIT) cache.clear();
    cache.set(key, plan);
  }
  return plan;
}

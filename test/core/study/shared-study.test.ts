// Given a portable builder and two workers or more, each worker thread builds and runs its own
// samples, taking them from a counter shared with this thread; every sample is deterministic,
// so the samples are the same whatever the number of jobs, whichever thread takes which sample,
// and whether the circuits are posted or built by the workers. Node cannot start a worker from a .ts file, so the pool is
// tested through the built package (packages/core/dist).
import { existsSync, readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { elaborate, loadProgram } from "@onset/netlist-parser";

// The worker threads start with this process's flags; the test runner's `--conditions
// onset-source` would have them import the packages' TypeScript sources, which Node cannot load.
process.execArgv = process.execArgv.filter((a, i, all) => a !== "--conditions" && all[i - 1] !== "--conditions");

const here = dirname(fileURLToPath(import.meta.url));
const repo = resolve(here, "../../..");
const dist = join(repo, "packages", "core", "dist");
if (!existsSync(join(dist, "worker.js"))) throw new Error("packages/core/dist is missing: build first (pnpm build)");
const core = await import(join(dist, "index.js"));
const { workerPool } = await import(join(dist, "node.js"));
const { steadyBuilder } = await import(join(here, "steady-builder.mjs"));

const file = join(repo, "examples", "bridge-excitation.onset");
const program = loadProgram(file, readFileSync(file, "utf8")).program;
const steady = { kind: "steady", probe: { kind: "node", node: "o" } };
const data = { program, analysis: steady };
const module = pathToFileURL(join(here, "steady-builder.mjs")).href;
const portable = { module, name: "steadyBuilder", data };
const nominal = elaborate(program).circuit!;
const criteria = core.specCriteria(nominal);

/** A study of the bridge source measured by its steady state; `built` counts the circuits this thread builds. */
async function study(options: { pool?: unknown; portable?: unknown; runs?: number; seed?: number; fixed?: Record<string, number>; limits?: object; lib?: typeof core; pools?: { workerPool: typeof workerPool } }) {
  const lib = options.lib ?? core;
  const make = (options.pools ?? { workerPool }).workerPool;
  const build = steadyBuilder(data);
  let built = 0;
  const counted = (values: Record<string, number>) => {
    built++;
    return build(values);
  };
  const samples = await lib.runToleranceStudy(counted, nominal.tolerances, { kind: "tolerance", runs: options.runs ?? 12, seed: options.seed ?? 7, dist: "normal", measure: "steady" }, criteria, {
    pool: typeof options.pool === "number" ? make(options.pool) : lib.inThreadPool,
    ...(options.portable ? { portable: options.portable } : {}),
    ...(options.fixed ? { fixed: options.fixed } : {}),
    ...(options.limits ? { limits: options.limits } : {}),
  });
  return { text: JSON.stringify(samples), count: samples.length, built };
}

describe("shared study (portable builder)", () => {
  test("the same samples on 1, 2 and 3 jobs, with the circuits posted or built by the workers, whatever the seed and the number of runs", async () => {
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 2, max: 60 }), fc.integer({ min: 1, max: 1e6 }), async (runs, seed) => {
        const inThread = (await study({ runs, seed })).text;
        expect((await study({ runs, seed, pool: 2, portable })).text).toBe(inThread);
        expect((await study({ runs, seed, pool: 3, portable })).text).toBe(inThread);
        expect((await study({ runs, seed, pool: 2 })).text).toBe(inThread);
      }),
      { numRuns: 3 },
    );
  }, 180_000);

  test("the workers build their own samples' circuits: this thread builds fewer than the posted study does", async () => {
    // Enough samples that the worker, which starts some hundred ms after this thread, takes some.
    const runs = 120;
    const shared = await study({ runs, pool: 3, portable });
    const posted = await study({ runs, pool: 3 });
    expect(shared.text).toBe(posted.text);
    // Posted: the plan's circuits and every sample's are built here; shared: the plan's, the
    // nominal once more (to compare it with the worker's) and this thread's own samples.
    expect(posted.built).toBeGreaterThan(runs);
    expect(shared.built).toBeLessThan(posted.built);
  }, 120_000);

  test("with one worker the circuits are posted (this thread builds every sample's), the same samples", async () => {
    const runs = 40;
    const one = await study({ runs, pool: 2, portable });
    const posted = await study({ runs, pool: 2 });
    expect(one.text).toBe(posted.text);
    expect(one.built).toBe(posted.built);
  }, 120_000);

  test("around a sweep value (fixed), the same samples in this thread and on the workers", async () => {
    const fixed = { "P1.at": 0.6 };
    expect((await study({ runs: 6, pool: 3, portable, fixed })).text).toBe((await study({ runs: 6, fixed })).text);
  }, 120_000);

  test("a module without the named builder: this thread runs every sample, the same samples", async () => {
    const missing = { ...portable, name: "noSuchBuilder" };
    const r = await study({ runs: 6, pool: 3, portable: missing });
    expect(r.text).toBe((await study({ runs: 6 })).text);
    expect(r.built).toBeGreaterThanOrEqual(6);
  }, 120_000);

  test("a portable builder that builds another nominal circuit is refused", async () => {
    const other = { ...portable, data: { ...data, analysis: { ...steady, probe: { kind: "node", node: "p" } } } };
    await expect(study({ runs: 6, pool: 3, portable: other })).rejects.toThrow(/another nominal circuit/);
  }, 120_000);

  test("a run limit that runs out stops a shared study with a RunLimitError", async () => {
    await expect(study({ runs: 6, pool: 3, portable, limits: { maxSteps: 5 } })).rejects.toBeInstanceOf(core.RunLimitError);
  }, 120_000);

  test("a wall time that runs out while the threads take samples stops the study with a RunLimitError, before all samples ran", async () => {
    let finished = 0;
    const build = steadyBuilder(data);
    const running = core.runToleranceStudy(build, nominal.tolerances, { kind: "tolerance", runs: 5000, seed: 3, dist: "normal", measure: "steady" }, criteria, {
      pool: workerPool(3),
      portable,
      limits: { maxWallTime: 1 },
      onSample: () => finished++,
    });
    await expect(running).rejects.toBeInstanceOf(core.RunLimitError);
    expect(finished).toBeLessThan(5000);
  }, 120_000);

  test("an onSample that throws stops the study with its error (whichever thread ran the sample)", async () => {
    let heard = 0;
    const running = core.runToleranceStudy(steadyBuilder(data), nominal.tolerances, { kind: "tolerance", runs: 200, seed: 5, dist: "normal", measure: "steady" }, criteria, {
      pool: workerPool(3),
      portable,
      onSample: () => {
        if (++heard === 60) throw new Error("the caller's callback failed");
      },
    });
    await expect(running).rejects.toThrow("the caller's callback failed");
  }, 120_000);

  test("the CommonJS build's workers import the ES module builder too", async () => {
    const require = createRequire(import.meta.url);
    const cjs = require(join(dist, "index.cjs"));
    const pools = require(join(dist, "node.cjs"));
    const inThread = await study({ runs: 120 });
    const r = await study({ runs: 120, pool: 3, portable, lib: cjs, pools });
    expect(r.text).toBe(inThread.text);
    expect(r.built).toBeLessThan(inThread.built);
  }, 120_000);

  test("options.portable must name a module and an export", async () => {
    await expect(study({ runs: 2, portable: { module: 3 } })).rejects.toThrow(/options.portable must be/);
  });
});

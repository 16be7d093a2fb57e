// The worker pool runs a study's samples on worker threads and this thread; every sample is
// deterministic, so the samples are the same whatever the number of jobs. Node cannot start a
// worker from a .ts file, so the pool is tested through the built package (packages/core/dist).
import { existsSync, readFileSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, test } from "vitest";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const repo = resolve(dirname(fileURLToPath(import.meta.url)), "../../..");
const dist = join(repo, "packages", "core", "dist");
if (!existsSync(join(dist, "worker.js"))) throw new Error("packages/core/dist is missing: build first (pnpm build)");
const core = await import(join(dist, "index.js"));
const { workerPool } = await import(join(dist, "node.js"));

const file = join(repo, "examples", "bridge-excitation.onset");
const program = loadProgram(file, readFileSync(file, "utf8")).program;
const nominal = elaborate(program).circuit!;
const steady = { kind: "steady", probe: { kind: "node", node: "o" } };
const build = (overrides: Record<string, number>) => ({ ...elaborate(program, { overrides }).circuit!, analyses: [steady] });
const study = (pool: unknown, limits?: object) =>
  core.runToleranceStudy(build, nominal.tolerances, { kind: "tolerance", runs: 12, seed: 7, dist: "normal", measure: "steady" }, core.specCriteria(nominal), {
    pool,
    ...(limits ? { limits } : {}),
  });

describe("workerPool", () => {
  test("two jobs: one worker and this thread, the worker handed the next job ahead", async () => {
    const pool = workerPool(2)({ count: 10, budget: new core.RunBudget() });
    expect(pool.jobs).toBe(2);
    expect(pool.lanes).toBe(3);
    await pool.close();
  });

  test("a steady study gives the same samples on 1, 2 and 3 jobs", async () => {
    const inThread = JSON.stringify(await study(core.inThreadPool));
    expect(JSON.stringify(await study(workerPool(2)))).toBe(inThread);
    expect(JSON.stringify(await study(workerPool(3)))).toBe(inThread);
  }, 60_000);

  test("a run limit that runs out stops the study with a RunLimitError", async () => {
    await expect(study(workerPool(2), { maxSteps: 5 })).rejects.toBeInstanceOf(core.RunLimitError);
  }, 60_000);
});

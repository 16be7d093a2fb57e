import { spawnSync, type SpawnSyncReturns } from "node:child_process";
import { existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, test } from "vitest";

// The packages as a user gets them: packed to tarballs (pnpm pack, which writes the
// publishConfig exports and real versions of workspace dependencies), checked with publint and
// a types-resolution checker, installed with npm into a project outside the workspace, then
// used from ESM, CommonJS, TypeScript (node16 resolution, both module kinds), the command line
// and a browser bundler. Needs the built packages (the test command builds first).

const repo = resolve(dirname(fileURLToPath(import.meta.url)), "../..");
const bin = (name: string) => join(repo, "node_modules/.bin", name);
const PACKAGES = ["core", "netlist-parser", "cli"] as const;
const work = mkdtempSync(join(tmpdir(), "onset-packed-"));
const packs = join(work, "packs");
const app = join(work, "app");
const tarballs: Record<string, string> = {};

function run(command: string, args: readonly string[], cwd: string, timeout = 180_000): SpawnSyncReturns<string> {
  const r = spawnSync(command, args, { cwd, encoding: "utf8", timeout, env: { ...process.env, npm_config_update_notifier: "false" } });
  if (r.error) throw r.error;
  return r;
}

function ok(r: SpawnSyncReturns<string>, what: string): string {
  if (r.status !== 0) throw new Error(`${what} failed (status ${r.status}):\n${r.stdout}\n${r.stderr}`);
  return r.stdout;
}

/** A Wien bridge of our own with a tolerance study (f₀ = 1/(2πRC) ≈ 1.59 kHz), its resistor value in an include. */
const STUDY = `title "Packed-install check"
include "values.onset"
resistor  R1 o s (R)±1%
capacitor C1 s p 10n±5%
resistor  R2 p gnd (R)±1%
capacitor C2 p gnd 10n±5%
resistor  Rf o n 22k
resistor  Rg n gnd 10k
opamp     U1 p n o preset=general
startup probe=o until=auto
tolerance runs=4 seed=5
`;

const ESM = `import { analysisOf, runStartup, runToleranceStudy, inThreadPool, RunBudget, RunLimitError, OnsetError } from "@onset/core";
import { workerPool } from "@onset/core/node";
import { LuSolver } from "@onset/core/engine";
import { buildCircuit } from "@onset/netlist-parser";
import { readSource } from "@onset/netlist-parser/node";
import { runCli } from "@onset/cli";

const source = readSource("study.onset");
const { circuit } = buildCircuit(source);
const startup = runStartup(circuit, analysisOf(circuit, "startup"), { limits: { maxWallTime: 60 } });
const build = (overrides) => buildCircuit(source, { overrides }).circuit;
const study = (pool, limits) => runToleranceStudy(build, circuit.tolerances, analysisOf(circuit, "tolerance"), [], { pool, limits });
const pool = workerPool(2)({ count: 4, budget: new RunBudget() });
const jobs = pool.jobs;
await pool.close();
const onWorkers = await study(workerPool(2));
const inThread = await study(inThreadPool);
let limited = null;
try {
  await study(workerPool(2), { maxSteps: 50 });
} catch (error) {
  limited = { isLimit: error instanceof RunLimitError, isOnset: error instanceof OnsetError, code: error.diagnostic.code };
}
console.log(JSON.stringify({
  files: [...source.sources.keys()],
  verdict: startup.verdict,
  frequency: startup.frequency,
  jobs,
  samples: onWorkers.map((s) => s.metrics?.frequency),
  sameAsInThread: JSON.stringify(onWorkers) === JSON.stringify(inThread),
  limited,
  lu: typeof LuSolver,
  cli: typeof runCli,
}));
`;

const CJS = `const core = require("@onset/core");
const engine = require("@onset/core/engine");
const { workerPool } = require("@onset/core/node");
const parser = require("@onset/netlist-parser");
const { readSource } = require("@onset/netlist-parser/node");
const cli = require("@onset/cli");
const { circuit } = parser.buildCircuit(readSource("study.onset"));
const r = core.runStartup(circuit, core.analysisOf(circuit, "startup"));
let parseError = null;
try { parser.loadSource("x.onset", "resistor R1 a 0 1k\\n"); } catch (e) { parseError = { source: e instanceof parser.SourceError, onset: e instanceof core.OnsetError, code: e.diagnostic.code }; }
console.log(JSON.stringify({ verdict: r.verdict, parseError, kinds: [typeof engine.TransientStepper, typeof workerPool, typeof cli.runCli] }));
`;

/** A typed consumer: compiles only if the declarations resolve and say what the code uses. */
const TYPED = `import { analysisOf, runStartup, RunLimitError, type RunLimits, type StartupResult } from "@onset/core";
import type { MnaSystem } from "@onset/core/engine";
import { workerPool } from "@onset/core/node";
import { buildCircuit, loadSource, SourceError, type CircuitSource } from "@onset/netlist-parser";
import { readSource } from "@onset/netlist-parser/node";
import { runCli, type CliIo } from "@onset/cli";

const limits: RunLimits = { maxSteps: 1e6, maxWallTime: 5 };
const source: CircuitSource = readSource("study.onset");
const { circuit } = buildCircuit(source, { overrides: { R: 10e3 } });
const result: StartupResult = runStartup(circuit, analysisOf(circuit, "startup"), { limits });
const frequency: number | null = result.frequency;
const size: number | undefined = (undefined as MnaSystem | undefined)?.n;
const pool = workerPool(2);
const error: unknown = null;
const limited: boolean = error instanceof RunLimitError && error.limit === "maxSteps";
const parsed: boolean = error instanceof SourceError && error.diagnostics.length > 0;
const io: Partial<CliIo> = { cwd: "." };
export const all = [frequency, size, pool, limited, parsed, io, runCli, loadSource];
`;

beforeAll(() => {
  for (const p of PACKAGES) {
    if (!existsSync(join(repo, "packages", p, "dist"))) throw new Error(`packages/${p}/dist is missing: build first (pnpm build)`);
  }
  mkdirSync(packs);
  for (const p of PACKAGES) ok(run("npx", ["-y", "pnpm@12.4.2", "pack", "--pack-destination", packs], join(repo, "packages", p)), `pnpm pack of ${p}`);
  for (const file of readdirSync(packs)) tarballs[file.replace(/-\d+\.\d+\.\d+\.tgz$/, "")] = join(packs, file);
  mkdirSync(app);
  writeFileSync(join(app, "package.json"), JSON.stringify({ name: "onset-consumer", private: true, version: "1.0.0" }));
  const install = ["install", "--no-audit", "--no-fund", "--prefer-offline", "--no-package-lock", ...Object.values(tarballs), "@types/node@20.19.43"];
  ok(run("npm", install, app), "npm install of the tarballs");
  writeFileSync(join(app, "values.onset"), "param R = 10k\n");
  writeFileSync(join(app, "study.onset"), STUDY);
}, 300_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe("the packed packages", () => {
  test("each tarball holds README, LICENSE, package.json and the built files only, no source maps", () => {
    for (const p of PACKAGES) {
      const listing = ok(run("tar", ["-tzf", tarballs[`onset-${p}`]!], work), "tar").trim().split("\n");
      expect(listing).toEqual(expect.arrayContaining(["package/README.md", "package/LICENSE", "package/package.json"]));
      expect(listing.filter((f) => !/^package\/(README\.md|LICENSE|package\.json|dist\/.+\.(js|cjs|d\.ts|d\.cts))$/.test(f))).toEqual([]);
    }
    // The figures of the closing note: a few hundred kB for all three before (source maps, a CJS copy of the command).
    // The core's bound has room for its growth (352 kB at stop 25, with the shared study and the trust-region
    // shooting; 424 kB at stop 31, with the projected and Arnoldi multipliers and the search beside
    // periodic sources); source maps would double it.
    const sizes = Object.fromEntries(Object.entries(tarballs).map(([name, file]) => [name, statSync(file).size]));
    expect(sizes["onset-core"]).toBeLessThan(460_000);
    expect(sizes["onset-cli"]).toBeLessThan(200_000);
  });

  test("publint finds nothing, in strict mode", () => {
    for (const p of PACKAGES) expect(ok(run(bin("publint"), ["--strict", tarballs[`onset-${p}`]!], repo), `publint ${p}`)).toContain("All good!");
  });

  test("the types resolve for every entry under node16 (ESM and CommonJS) and bundlers", () => {
    for (const p of PACKAGES) {
      const r = run(bin("attw"), ["--profile", "node16", "--format", "json", tarballs[`onset-${p}`]!], repo);
      const analysis = JSON.parse(r.stdout) as { problems?: unknown[] };
      expect([p, r.status, analysis.problems?.length ?? 0]).toEqual([p, 0, 0]);
    }
  });
});

describe("installed outside the workspace", () => {
  test("ESM: the front door reads includes, runs with limits, and a 2-worker study matches the in-thread one", () => {
    writeFileSync(join(app, "esm.mjs"), ESM);
    const r = JSON.parse(ok(run(process.execPath, ["esm.mjs"], app), "node esm.mjs"));
    expect(r.files).toEqual(["study.onset", "values.onset"]);
    expect(r.verdict).toBe("settled");
    // f₀ = 1/(2πRC) = 1.59 kHz for R = 10 kΩ, C = 10 nF (the op-amp's phase pulls it a little).
    expect(Math.abs(r.frequency / (1 / (2 * Math.PI * 10e3 * 10e-9)) - 1)).toBeLessThan(0.05);
    expect(r.jobs).toBe(2);
    expect(r.samples).toHaveLength(4);
    expect(r.sameAsInThread).toBe(true);
    expect(r.limited).toEqual({ isLimit: true, isOnset: true, code: "step-limit" });
    expect([r.lu, r.cli]).toEqual(["function", "function"]);
  });

  test("CommonJS: every entry requires, and errors are the packages' own classes", () => {
    writeFileSync(join(app, "cjs.cjs"), CJS);
    expect(JSON.parse(ok(run(process.execPath, ["cjs.cjs"], app), "node cjs.cjs"))).toEqual({
      verdict: "settled",
      parseError: { source: true, onset: true, code: "node-zero" },
      kinds: ["function", "function", "function"],
    });
  });

  test("tsc --noEmit accepts a typed consumer under node16 resolution, as ESM and as CommonJS", () => {
    for (const [ext, kind] of [
      ["mts", "esm"],
      ["cts", "cjs"],
    ] as const) {
      writeFileSync(join(app, `typed.${ext}`), TYPED);
      const config = { compilerOptions: { module: "node16", moduleResolution: "node16", target: "ES2022", strict: true, noEmit: true, skipLibCheck: false, types: ["node"] }, files: [`typed.${ext}`] };
      writeFileSync(join(app, `tsconfig.${kind}.json`), JSON.stringify(config));
      ok(run(process.execPath, [join(repo, "node_modules/typescript/bin/tsc"), "-p", `tsconfig.${kind}.json`], app), `tsc (${kind})`);
    }
    // Two full type-checks of the installed declarations: ~20 s on a quiet machine, several times that on a busy one.
  }, 240_000);

  test("npx onset --help, and a 2-worker tolerance study from the installed command", () => {
    expect(ok(run("npx", ["--no-install", "onset", "--help"], app), "npx onset --help")).toContain("usage: onset COMMAND [options]");
    const r = run("npx", ["--no-install", "onset", "run", "study.onset", "--jobs", "2", "--json", "--quiet"], app);
    expect(r.status).toBe(0);
    const study = JSON.parse(r.stdout).results[0];
    expect([study.analysis, study.runs, study.samples.length, study.missing]).toEqual(["tolerance", 4, 4, []]);
  });

  test("the installed core bundles for a browser with no Node built-in, and one function bundles alone", async () => {
    const { build } = await import("esbuild");
    writeFileSync(join(app, "browser.mjs"), 'import * as core from "@onset/core";\nimport * as parser from "@onset/netlist-parser";\nglobalThis.onset = { core, parser };\n');
    const whole = await build({ entryPoints: [join(app, "browser.mjs")], bundle: true, platform: "browser", format: "esm", write: false, metafile: true, absWorkingDir: app, logLevel: "silent" });
    const inputs = Object.keys(whole.metafile!.inputs);
    expect(inputs.filter((f) => f.startsWith("node:") || !f.includes("node_modules/") && !f.endsWith("browser.mjs"))).toEqual([]);
    writeFileSync(join(app, "one.mjs"), 'import { wilsonInterval } from "@onset/core";\nconsole.log(wilsonInterval(3, 10));\n');
    const one = await build({ entryPoints: [join(app, "one.mjs")], bundle: true, platform: "browser", format: "esm", minify: true, write: false, absWorkingDir: app, logLevel: "silent" });
    // sideEffects: false lets the bundler drop every module the function does not need (26 kB
    // before; under 1 kB once it did). The function checks its arguments, so the typed error,
    // the argument check and their messages come along (about 0.6 kB of the 1.2 kB): they have a
    // chunk of their own (tsup.config.ts), without the engine and fft.js (39 kB while they shared one).
    expect(one.outputFiles[0]!.contents.length).toBeLessThan(1500);
  });
});

import { describe, expect, test } from "vitest";
import fc from "fast-check";
import {
  analysisOf,
  inThreadPool,
  isOnsetError,
  RunBudget,
  RunLimitError,
  runCircuit,
  runCircuitInParallel,
  runPoles,
  runResponse,
  runStartup,
  runSteady,
  runSweep,
  runToleranceStudy,
  runTransient,
  type Circuit,
  type JobPoolContext,
  type JobPoolFactory,
  type RunLimits,
  type StartupResult,
} from "@onset/core";
import { buildSystem } from "@onset/core/engine";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { thrownBy } from "../../support/thrown.js";
import { DIODE_WIEN_SOURCE } from "../../support/circuits.js";

/** RC charging from rest (τ = 1 ms), 100 µs largest step: 100 steps per ms at most. */
const RC = `vsource V1 in gnd 5
resistor R1 in o 10k
capacitor C1 o gnd 100n
transient until=20m max-step=10u start=rest probes=(o)
`;

/** A Wien bridge above its start threshold (gain 3.3), diode-limited; f₀ ≈ 1.59 kHz. */
const WIEN = `${DIODE_WIEN_SOURCE}startup probe=o until=auto
sweep Rf from=15k to=30k steps=4
tolerance runs=6 seed=3
`;

const build = (text: string, overrides: Record<string, number> = {}): Circuit => buildCircuit(loadSource("t.onset", text), { overrides }).circuit;

/** The RunLimitError `f` throws. */
const limitOf = (f: () => unknown): RunLimitError => thrownBy(RunLimitError, f);

describe("maxSteps", () => {
  test("a transient whose until= and max-step= need more steps than the limit is refused before it starts, naming the count", () => {
    const circuit = build(RC);
    // until / max-step = 20 ms / 10 µs = 2000 steps at the least.
    const e = limitOf(() => runTransient(circuit, analysisOf(circuit, "transient"), { limits: { maxSteps: 1999 } }));
    expect([e.diagnostic.code, e.limit, e.value, e.reached]).toEqual(["step-limit", "maxSteps", 1999, 2000]);
    expect(e.message).toBe("the transient until=0.02 s with max-step=0.00001 s needs at least 2 000 steps, more than the step limit of 1 999; it was not started");
  });

  test("the default step budget is 10 000 000 steps: a 10⁸-step transient is refused up front", () => {
    const circuit = build(RC.replace("until=20m max-step=10u", "until=100 max-step=1u"));
    const e = limitOf(() => runTransient(circuit, analysisOf(circuit, "transient")));
    expect([e.limit, e.value, e.reached]).toEqual(["maxSteps", 10_000_000, 100_000_000]);
  });

  test("a transient stops after exactly maxSteps accepted steps, with step-limit naming the limit and the hint", () => {
    // Without max-step= the largest step is until/100: 100 steps at the least, more where the start needs small steps.
    const text = RC.replace(" max-step=10u", "");
    const circuit = build(text);
    const full = runTransient(circuit, analysisOf(circuit, "transient"));
    expect(full.stats.accepted).toBeGreaterThan(110);
    const e = limitOf(() => runTransient(circuit, analysisOf(circuit, "transient"), { limits: { maxSteps: 110 } }));
    expect([e.diagnostic.code, e.limit, e.value, e.reached, e.diagnostic.stage]).toEqual(["step-limit", "maxSteps", 110, 111, "simulation"]);
    // The step that broke the limit is the 111th: its time is that of the unlimited run's 111th point.
    expect(e.message).toBe(`the transient reached the step limit of 110 accepted steps at t = ${Number(full.time[111]!.toPrecision(4))} s`);
    expect(e.diagnostic.hint).toBe("raise the limit with --limit steps=N (API: limits.maxSteps), or give the analysis a larger max-step or a shorter run (until=; cycles= on steady)");
    expect(e.diagnostic.span).toEqual({ file: "t.onset", start: text.indexOf("transient"), end: text.indexOf("\n", text.indexOf("transient")) });
    expect(isOnsetError(e)).toBe(true);
  });

  test("a run within the limit is unchanged by it", () => {
    const circuit = build(RC);
    const free = runTransient(circuit, analysisOf(circuit, "transient"));
    const bounded = runTransient(circuit, analysisOf(circuit, "transient"), { limits: { maxSteps: free.stats.accepted } });
    expect(bounded.time).toEqual(free.time);
  });

  test("a start-up run with until=auto stops at the limit too", () => {
    const circuit = build(WIEN);
    const e = limitOf(() => runStartup(circuit, analysisOf(circuit, "startup"), { limits: { maxSteps: 2000 } }));
    expect([e.diagnostic.code, e.reached]).toEqual(["step-limit", 2001]);
    expect(e.message).toMatch(/^the start-up run reached the step limit of 2000 accepted steps at t = /);
  });
});

describe("maxSimulatedTime", () => {
  test("a fixed until longer than the limit is refused before it starts", () => {
    const circuit = build(RC);
    let steps = 0;
    const e = limitOf(() => runTransient(circuit, analysisOf(circuit, "transient"), { limits: { maxSimulatedTime: 0.01 }, onProgress: () => steps++ }));
    expect([e.diagnostic.code, e.value, e.reached, steps]).toEqual(["simulated-time-limit", 0.01, 0.02, 0]);
    expect(e.message).toBe("the transient until=0.02 s is longer than the simulated-time limit of 0.01 s; it was not started");
  });

  test("until=auto stops within one largest step (here 1 % of a period) past the limit", () => {
    const circuit = build(WIEN);
    const limit = 3e-3;
    const e = limitOf(() => runStartup(circuit, analysisOf(circuit, "startup"), { limits: { maxSimulatedTime: limit } }));
    expect(e.limit).toBe("maxSimulatedTime");
    expect(e.reached).toBeGreaterThan(limit);
    // The start-up run's largest step is T₀/100 with T₀ ≈ 0.63 ms (f₀ = 1/(2πRC)).
    expect(e.reached - limit).toBeLessThanOrEqual(0.01 / 1.5e3);
  });
});

describe("maxWallTime and the abort signal", () => {
  test("a wall time already spent stops the call at its first check", () => {
    const circuit = build(RC);
    const e = limitOf(() => runCircuit(circuit, { limits: { maxWallTime: 1e-12 } }));
    expect([e.diagnostic.code, e.limit, e.value]).toEqual(["wall-time-limit", "maxWallTime", 1e-12]);
    expect(e.reached).toBeGreaterThanOrEqual(1e-12);
    expect(e.diagnostic.hint).toBe("raise the limit with --time-limit SECONDS (API: limits.maxWallTime)");
  });

  test("an abort from the run's own progress callback stops it within 8 steps", () => {
    const circuit = build(`${RC.replace("until=20m", "until=2")}`);
    const controller = new AbortController();
    let calls = 0;
    const e = limitOf(() =>
      runTransient(circuit, analysisOf(circuit, "transient"), {
        limits: { signal: controller.signal },
        onProgress: (t) => {
          calls++;
          if (t > 0) controller.abort();
        },
      }),
    );
    expect([e.diagnostic.code, e.limit, e.value, calls]).toEqual(["aborted", "signal", null, 1]);
    // Progress comes every 4096 steps; the budget looks at the signal every 8 steps.
    expect(e.message).toMatch(/^the run was aborted during the transient at t = /);
  });

  test("an aborted signal stops every analysis before any work", () => {
    const controller = new AbortController();
    controller.abort();
    const circuit = build(`${RC}bias\npoles\n`);
    for (const analysis of circuit.analyses) {
      if (analysis.kind === "spec" || analysis.kind === "sweep" || analysis.kind === "tolerance") continue;
      const e = limitOf(() => runCircuit({ ...circuit, analyses: [analysis] }, { limits: { signal: controller.signal } }));
      expect(e.diagnostic.code).toBe("aborted");
    }
  });
});

describe("studies honour the limits", () => {
  test("a sweep aborted after its first setting runs no other", () => {
    const controller = new AbortController();
    const settings: number[] = [];
    const circuit = build(WIEN);
    const sweep = analysisOf(circuit, "sweep");
    const e = limitOf(() =>
      runSweep((o) => build(WIEN, o), sweep, {
        limits: { signal: controller.signal, maxSimulatedTime: 0.2 },
        onPoint: (point) => {
          settings.push(point.value);
          controller.abort();
        },
      }),
    );
    expect(e.diagnostic.code).toBe("aborted");
    expect(e.message).toBe("the run was aborted before the sweep setting Rf = 20000");
    expect(settings).toEqual([15e3]);
  });

  test("a sweep whose settings each need more steps than allowed stops at the first", () => {
    const circuit = build(WIEN);
    const e = limitOf(() => runSweep((o) => build(WIEN, o), analysisOf(circuit, "sweep"), { limits: { maxSteps: 100 } }));
    expect([e.diagnostic.code, e.reached]).toEqual(["step-limit", 101]);
  });

  test("a tolerance study aborted after two samples stops with them handed over", async () => {
    const circuit = build(WIEN);
    const controller = new AbortController();
    const seen: number[] = [];
    const study = runToleranceStudy((o) => build(WIEN, o), circuit.tolerances, analysisOf(circuit, "tolerance"), [], {
      pool: inThreadPool,
      limits: { signal: controller.signal },
      onSample: (s) => {
        seen.push(s.index);
        if (seen.length === 2) controller.abort();
      },
    });
    await expect(study).rejects.toMatchObject({ limit: "signal", diagnostic: { code: "aborted", message: "the run was aborted between samples" } });
    expect(seen).toEqual([0, 1]);
  });

  test("a limit inside a sample stops the study instead of failing the sample", async () => {
    const circuit = build(WIEN);
    const seen: number[] = [];
    const study = runToleranceStudy((o) => build(WIEN, o), circuit.tolerances, analysisOf(circuit, "tolerance"), [], {
      limits: { maxSteps: 100 },
      onSample: (s) => seen.push(s.index),
    });
    await expect(study).rejects.toBeInstanceOf(RunLimitError);
    expect(seen).toEqual([]);
  });

  test("one budget shared by several calls counts the wall time from its creation", () => {
    const budget = new RunBudget({ maxWallTime: 1e-12 });
    const circuit = build(RC);
    expect(limitOf(() => runTransient(circuit, analysisOf(circuit, "transient"), { budget })).limit).toBe("maxWallTime");
    expect(budget.remaining()).toBeLessThan(0);
  });
});

describe("start-up seeds and excitations honour the limits", () => {
  const SEEDED = WIEN.replace("startup probe=o until=auto", "startup probe=o until=auto seeds=3");

  test("seeds=N run in this thread: an abort after the first seed stops the further seeds with the call's error, not as failed seeds", () => {
    const circuit = build(SEEDED);
    const controller = new AbortController();
    let ends = 0;
    const e = limitOf(() =>
      runCircuit(circuit, {
        limits: { signal: controller.signal },
        // The first run's last progress call has time = until: abort there, after its settled
        // orbit was refined (until=auto refines it as soon as the run looks settled) and before
        // the further seeds.
        onProgress: (t, until) => {
          if (t === until) {
            ends++;
            controller.abort();
          }
        },
      }),
    );
    expect([e.diagnostic.code, ends]).toEqual(["aborted", 1]);
    // (The second seed's run stops at its first check, its bias point's poles.)
    expect(e.message).toBe("the run was aborted during the bias point's poles");
  });

  test("seeds=N on a pool: the pool is made with the call's budget and one job per further seed, and gives the same spread as runCircuit", async () => {
    const circuit = build(SEEDED);
    const made: JobPoolContext[] = [];
    const recording: JobPoolFactory = (context) => {
      made.push(context);
      return inThreadPool(context);
    };
    const budget = new RunBudget({ maxSteps: 1e6 });
    const pooled = await runCircuitInParallel(circuit, { budget, pool: recording });
    expect(made.map((c) => [c.count, c.budget === budget])).toEqual([[2, true]]);
    const spread = (pooled.results[0] as StartupResult).startupTimeSpread!;
    expect(spread.seeds).toEqual([1, 2, 3]);
    expect(spread).toEqual((runCircuit(circuit).results[0] as StartupResult).startupTimeSpread);
  });

  test("seeds=N on a pool: a limit in a further seed rejects the call", async () => {
    const circuit = build(SEEDED);
    const controller = new AbortController();
    // Aborted once the first seed is done, as the pool is made for the others.
    const aborting: JobPoolFactory = (context) => {
      controller.abort();
      return inThreadPool(context);
    };
    await expect(runCircuitInParallel(circuit, { limits: { signal: controller.signal }, pool: aborting })).rejects.toMatchObject({
      limit: "signal",
      diagnostic: { code: "aborted", message: "the run was aborted during the bias point's poles" },
    });
  });

  test.each(["power-on", "thermal", "noise", "none"])("kick=%s: the start-up run stops at the step limit", (kick) => {
    const circuit = build(WIEN.replace("startup probe=o until=auto", `startup probe=o until=auto kick=${kick}`));
    const e = limitOf(() => runStartup(circuit, analysisOf(circuit, "startup"), { limits: { maxSteps: 500 } }));
    expect([e.diagnostic.code, e.reached]).toEqual(["step-limit", 501]);
  });
});

describe("limits are checked at the door", () => {
  test("anything but a positive number (a whole one for maxSteps) is bad-limit; Infinity is no limit", () => {
    const bad: RunLimits[] = [{ maxSteps: 0 }, { maxSteps: 1.5 }, { maxSteps: -3 }, { maxSimulatedTime: NaN }, { maxWallTime: -1 }, { maxWallTime: 0 }];
    for (const limits of bad) {
      expect(() => new RunBudget(limits), JSON.stringify(limits)).toThrow(expect.objectContaining({ diagnostic: expect.objectContaining({ code: "bad-limit" }) }));
    }
    expect(new RunBudget({ maxSteps: Infinity, maxWallTime: Infinity }).remaining()).toBe(Infinity);
  });

  test("any value of any type either makes a budget or is refused with bad-limit (never another error)", () => {
    fc.assert(
      fc.property(fc.constantFrom("maxSteps", "maxSimulatedTime", "maxWallTime", "signal"), fc.anything(), (key, value) => {
        try {
          new RunBudget({ [key]: value } as RunLimits);
        } catch (error) {
          expect(isOnsetError(error) && error.diagnostic.code).toBe("bad-limit");
        }
      }),
    );
  });
});

describe("maxDenseUnknowns", () => {
  const wien = build(WIEN);
  const n = 4;
  test("a start-up, steady or poles analysis of more unknowns than the limit is refused before its poles, naming the unknowns and the matrices' size", () => {
    const unknowns = buildSystem(wien).n;
    expect(unknowns).toBeGreaterThan(n);
    const limits = { maxDenseUnknowns: n };
    const probe = { kind: "node", node: "o" } as const;
    for (const run of [
      () => runStartup(wien, { kind: "startup", probe, until: "auto" }, { limits }),
      () => runSteady(wien, { kind: "steady", probe }, { limits }),
      () => runPoles(wien, { kind: "poles" }, { limits }),
    ]) {
      const e = limitOf(run);
      expect(e.diagnostic.code).toBe("dense-limit");
      expect(e.limit).toBe("maxDenseUnknowns");
      expect(e.value).toBe(n);
      expect(e.reached).toBe(unknowns);
      expect(e.diagnostic.message).toMatch(new RegExp(`for a circuit of ${unknowns} unknowns would need dense ${unknowns} × ${unknowns} matrices \\(under 1 MB each\\), more than the dense-unknowns limit of ${n}; not started`));
      expect(e.diagnostic.hint).toMatch(/--limit dense-unknowns=N/);
    }
    // A response's real form is 2n × 2n.
    const e = limitOf(() => runResponse(wien, { kind: "response", from: "Vx", to: probe }, { limits }));
    expect(e.diagnostic.message).toMatch(new RegExp(`^the response for a circuit of ${unknowns} unknowns would need dense ${2 * unknowns} × ${2 * unknowns} matrices`));
  });
  test("at the limit the analysis runs (the default, 4000, is far above the examples)", () => {
    const r = runStartup(wien, { kind: "startup", probe: { kind: "node", node: "o" }, until: "auto" }, { limits: { maxDenseUnknowns: 1000 } });
    expect(r.verdict).toBe("settled");
    expect(new RunBudget().maxDenseUnknowns).toBe(4000);
  });
});

import { describe, expect, test } from "vitest";
import fc from "fast-check";
import {
  drawSample,
  measureStartup,
  OnsetError,
  percentileOfSorted,
  risingCrossings,
  runBias,
  runCircuit,
  runPoles,
  runResponse,
  runStartup,
  runSteady,
  runSweep,
  runSweepInParallel,
  runToleranceStudy,
  runTransient,
  steadySeed,
  summarize,
  sweepValues,
  wilsonInterval,
} from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { onlyTypedErrors } from "../support/door.js";

// The library validates at the door: whatever a caller passes (NaN, ±∞, negatives, wrong
// shapes, huge counts), a public function returns or throws an OnsetError with a code, in
// bounded time: never a TypeError or RangeError from deep inside.

/** Values a careless or hostile caller might pass. */
const hostile = fc.oneof(
  fc.constantFrom(NaN, Infinity, -Infinity, -1, 0, 1e308, -1e-320, 2 ** 53, 1e12, "", "x", null, undefined, true, [], {}, [NaN], { kind: "transient" }),
  fc.anything(),
  fc.record({ kind: fc.constantFrom("transient", "startup", "steady", "sweep", "tolerance", "response"), until: fc.oneof(fc.double(), fc.constant("auto")), maxStep: fc.double(), runs: fc.double(), steps: fc.double(), from: fc.double(), to: fc.double(), target: fc.string() }, { requiredKeys: ["kind"] }),
  fc.record({ parts: fc.oneof(fc.constant([]), fc.array(fc.anything(), { maxLength: 3 })), analyses: fc.oneof(fc.constant([]), fc.anything()), tolerances: fc.anything() }, { requiredKeys: [] }),
);

const entries: Record<string, (a: unknown, b: unknown, c: unknown) => unknown> = {
  runTransient: (a, b, c) => runTransient(a as never, b as never, c as never),
  runStartup: (a, b, c) => runStartup(a as never, b as never, c as never),
  runBias: (a, b, c) => runBias(a as never, b as never, c as never),
  runPoles: (a, b, c) => runPoles(a as never, b as never, c as never),
  runSteady: (a, b, c) => runSteady(a as never, b as never, c as never),
  steadySeed: (a, b, c) => steadySeed(a as never, b as never, c as never),
  runResponse: (a, b, c) => runResponse(a as never, b as never, c as never),
  runCircuit: (a, b) => runCircuit(a as never, b as never),
  runSweep: (a, b, c) => runSweep(a as never, b as never, c as never),
  sweepValues: (a) => sweepValues(a as never),
  drawSample: (a, b, c) => drawSample(a as never, b as never, c as never, "normal"),
  wilsonInterval: (a, b, c) => wilsonInterval(a as never, b as never, c as never),
  percentileOfSorted: (a, b) => percentileOfSorted(a as never, b as never),
  summarize: (a) => summarize(a as never),
  measureStartup: (a, b, c) => measureStartup(a as never, b as never, c as never),
  risingCrossings: (a, b, c) => risingCrossings(a as never, b as never, c as never, 0),
};

describe("the public API validates at the door", () => {
  test.each(Object.keys(entries))("%s: hostile arguments give a result or an OnsetError, in bounded time", (name) => {
    fc.assert(
      fc.property(hostile, hostile, hostile, (a, b, c) => {
        onlyTypedErrors(() => entries[name]!(a, b, c));
      }),
      { numRuns: 300 },
    );
  });

  test("runToleranceStudy rejects hostile arguments with an OnsetError", async () => {
    await fc.assert(
      fc.asyncProperty(hostile, hostile, hostile, async (a, b, c) => {
        try {
          await runToleranceStudy(a as never, b as never, c as never, [] as never);
        } catch (e) {
          if (!(e instanceof OnsetError)) throw new Error(`not a typed error: ${String(e)}`);
        }
      }),
      { numRuns: 200 },
    );
  });

  test("runSweepInParallel rejects hostile arguments with an OnsetError", async () => {
    await fc.assert(
      fc.asyncProperty(hostile, hostile, hostile, async (a, b, c) => {
        try {
          await runSweepInParallel(a as never, b as never, c as never);
        } catch (e) {
          if (!(e instanceof OnsetError)) throw new Error(`not a typed error: ${String(e)}`);
        }
      }),
      { numRuns: 200 },
    );
  });

  test("the code is bad-argument and the message names the function", () => {
    let thrown: unknown;
    try {
      runTransient({ parts: [], analyses: [] } as never, { kind: "transient", until: NaN, start: "bias", probes: [] });
    } catch (e) {
      thrown = e;
    }
    expect(thrown).toBeInstanceOf(OnsetError);
    expect([(thrown as OnsetError).diagnostic.code, (thrown as OnsetError).message]).toEqual(["bad-argument", "runTransient: until must be a finite time above 0 s, got NaN"]);
  });
});

describe("the analyses' fields at the door, against each statement's options table", () => {
  // A real circuit, so that the fields, not the circuit, are what the door sees. Before: a missing
  // or malformed probe, kick "boom", transient start "x" or probes "o", response from 5 or a missing
  // to were TypeErrors from inside; seeds 0, harmonics 1, accuracy 5, temperature −300 °C were taken.
  const circuit = buildCircuit(loadSource("rc.onset", "vsource V1 a gnd 1\nresistor R1 a o 1k\ncapacitor C1 o gnd 1u\n")).circuit;
  const o = { kind: "node", node: "o" } as const;
  const field = fc.oneof(
    fc.constantFrom(NaN, Infinity, -Infinity, -1, 0, 0.5, 1, 2.5, 3, 1e-3, 1e-12, 1e308, 2 ** 53, "", "auto", "bias", "rest", "noise", "o", null, true, [], {}),
    fc.anything(),
  );
  const probe = fc.oneof(
    fc.constantFrom(o, { kind: "node" }, { kind: "node", node: 5 }, { kind: "current", part: "R1" }, { kind: "state", part: "R1" }, { kind: "difference", plus: "o" }, { kind: "weird" }, "o"),
    fc.record({ kind: fc.constantFrom("node", "difference", "current", "state", "x"), node: field, plus: field, minus: field, part: field, state: field }, { requiredKeys: [] }),
    fc.anything(),
  );
  /** An analysis of `kind` with any of `fields` set to hostile values (and its probes sometimes sound). */
  const analysis = (kind: string, fields: readonly string[], probes: Readonly<Record<string, fc.Arbitrary<unknown>>> = {}) =>
    fc.record({ kind: fc.constant(kind), ...Object.fromEntries(fields.map((f) => [f, field])), ...probes }, { requiredKeys: ["kind"] });
  const limits = { limits: { maxSteps: 20_000, maxWallTime: 2 } };
  const cases: Record<string, [fc.Arbitrary<Record<string, unknown>>, (a: unknown) => unknown]> = {
    runStartup: [
      analysis("startup", ["until", "settleWithin", "maxStep", "kick", "temperature", "ramp", "level", "seed", "seeds", "harmonics", "bandwidth", "accuracy", "accuracyFloor"], { probe }),
      (a) => runStartup(circuit, a as never, limits),
    ],
    runTransient: [analysis("transient", ["until", "maxStep", "start", "accuracy", "accuracyFloor"], { probes: fc.oneof(fc.array(probe, { maxLength: 2 }), field) }), (a) => runTransient(circuit, a as never, limits)],
    runResponse: [analysis("response", ["from", "start", "stop", "perDecade"], { to: probe }), (a) => runResponse(circuit, a as never, limits)],
    runSteady: [analysis("steady", ["from", "cycles", "maxStep", "harmonics", "bandwidth", "accuracy", "accuracyFloor"], { probe }), (a) => runSteady(circuit, a as never, limits)],
    runPoles: [fc.oneof(analysis("poles", []), field as fc.Arbitrary<Record<string, unknown>>), (a) => runPoles(circuit, a as never, limits)],
  };

  test.each(Object.keys(cases))("%s: hostile fields on a sound circuit give a result or an OnsetError, in bounded time", (name) => {
    const [arbitrary, run] = cases[name]!;
    fc.assert(
      fc.property(arbitrary, (a) => {
        onlyTypedErrors(() => run(a));
      }),
      { numRuns: 150 },
    );
  });

  /** The code and message of what `f` throws. */
  const thrown = (f: () => unknown): [string, string] => {
    try {
      f();
    } catch (e) {
      if (!(e instanceof OnsetError)) throw e;
      return [e.diagnostic.code, e.message];
    }
    throw new Error("nothing thrown");
  };
  const startup = { kind: "startup", probe: o, until: 1e-3 };
  test.each([
    ["runStartup, no probe", () => runStartup(circuit, { kind: "startup", until: "auto" } as never), /^runStartup: analysis\.probe is required/],
    ["runStartup, until −1", () => runStartup(circuit, { ...startup, until: -1 } as never), /^runStartup: until must be a finite time above 0 s, got -1$/],
    ["runStartup, a probe as a bare name", () => runStartup(circuit, { ...startup, probe: "o" } as never), /^runStartup: analysis\.probe must be a probe \(\{ kind: "node", node \}/],
    ["runStartup, a node probe without its node", () => runStartup(circuit, { ...startup, probe: { kind: "node" } } as never), /^runStartup: analysis\.probe must be a probe/],
    ["runStartup, kick boom", () => runStartup(circuit, { ...startup, kick: "boom" } as never), /^runStartup: analysis\.kick must be one of "thermal", "power-on", "noise", "none", got "boom"$/],
    ["runStartup, seeds 0", () => runStartup(circuit, { ...startup, seeds: 0 } as never), /^runStartup: analysis\.seeds must be a whole number from 1 to 10000, got 0$/],
    ["runStartup, harmonics 1", () => runStartup(circuit, { ...startup, harmonics: 1 } as never), /^runStartup: analysis\.harmonics must be a whole number from 2 to 1000, got 1$/],
    ["runStartup, accuracy 5", () => runStartup(circuit, { ...startup, accuracy: 5 } as never), /^runStartup: analysis\.accuracy must be a finite number from 1e-10 to 0\.1, got 5$/],
    ["runStartup, −300 °C", () => runStartup(circuit, { ...startup, temperature: -300 } as never), /^runStartup: analysis\.temperature must be a finite number above -273\.15 up to 1000, got -300$/],
    ["runStartup, −273.15 °C (absolute zero, excluded)", () => runStartup(circuit, { ...startup, temperature: -273.15 } as never), /^runStartup: analysis\.temperature must be a finite number above -273\.15 up to 1000, got -273\.15$/],
    ["runStartup, settleWithin −1", () => runStartup(circuit, { ...startup, until: "auto", settleWithin: -1 } as never), /^runStartup: analysis\.settleWithin must be a finite number above 0, got -1$/],
    ["runTransient, start x", () => runTransient(circuit, { kind: "transient", until: 1e-3, start: "x", probes: [] } as never), /^runTransient: analysis\.start must be one of "bias", "rest", got "x"$/],
    ["runTransient, probes as a name", () => runTransient(circuit, { kind: "transient", until: 1e-3, start: "bias", probes: "o" } as never), /^runTransient: analysis\.probes must be an array of probes/],
    ["runTransient, accuracy −1", () => runTransient(circuit, { kind: "transient", until: 1e-3, start: "bias", probes: [], accuracy: -1 } as never), /^runTransient: analysis\.accuracy must be a finite number from 1e-10 to 0\.1, got -1$/],
    ["runResponse, no source", () => runResponse(circuit, { kind: "response", to: o } as never), /^runResponse: analysis\.from is required/],
    ["runResponse, no probe", () => runResponse(circuit, { kind: "response", from: "V1" } as never), /^runResponse: analysis\.to is required/],
    ["runResponse, a source as a number", () => runResponse(circuit, { kind: "response", from: 5, to: o } as never), /^runResponse: analysis\.from must be the name of an independent source, got 5$/],
    ["runResponse, perDecade 0.5", () => runResponse(circuit, { kind: "response", from: "V1", to: o, perDecade: 0.5 } as never), /^runResponse: analysis\.perDecade must be a whole number of at least 1, got 0\.5$/],
    ["runPoles, a transient", () => runPoles(circuit, { kind: "transient" } as never), /^runPoles: analysis must be a poles analysis/],
  ])("%s: bad-argument naming the field and its rule", (_, f, message) => {
    const [code, text] = thrown(f);
    expect(code).toBe("bad-argument");
    expect(text).toMatch(message);
  });

  test("runResponse with more frequency points than the stored-points limit is refused before the bias point (it ran out of memory)", () => {
    const [code, text] = thrown(() => runResponse(circuit, { kind: "response", from: "V1", to: o, perDecade: 1e9 }));
    expect(code).toBe("stored-points-limit");
    expect(text).toMatch(/has 4000000001 frequency points \(4 values each\), more than the stored-points limit of 2000000; it was not started$/);
    expect(runResponse(circuit, { kind: "response", from: "V1", to: o, perDecade: 1e5 }, { limits: { maxStoredPoints: 4e6 } }).points).toHaveLength(400_001);
  });

  test("runTransient without start or probes takes the statement's defaults (the bias point, every node)", () => {
    const r = runTransient(circuit, { kind: "transient", until: 1e-3 } as never);
    expect(r.signals.map((s) => s.name)).toEqual(expect.arrayContaining(["a", "o"]));
    expect(r.signals.find((s) => s.name === "o")!.values[0]).toBeCloseTo(1, 9);
  });
});

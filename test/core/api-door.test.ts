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

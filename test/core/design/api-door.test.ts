import { describe, expect, test } from "vitest";
import fc from "fast-check";
import {
  chooseCapacitor,
  designOscillator,
  isSeriesName,
  lampWienAmplitude,
  OnsetError,
  snapToSeries,
  thermistorWienAmplitude,
  twinTCrossing,
  writeValue,
} from "@onset/core";
import { onlyTypedErrors } from "../../support/door.js";
import { thrownBy } from "../../support/thrown.js";

// Core's design entries validate at the door like its analyses (test/core/api-door.test.ts):
// whatever a caller passes, including callbacks that misbehave, a result or an OnsetError with a
// code comes out, in bounded time, and a number that comes out is not NaN.

const hostile = fc.oneof(
  fc.constantFrom(NaN, Infinity, -Infinity, -1, 0, 1e308, -1e-320, 2 ** 53, 1e-300, "", "x", "E24", "wien", null, undefined, true, [], {}, [NaN], [-12, 12], [12, -12]),
  fc.anything(),
  fc.double(),
  fc.record(
    {
      topology: fc.oneof(fc.constantFrom("wien", "twin-t", "phase-shift"), fc.anything()),
      frequency: fc.oneof(fc.double(), fc.constantFrom(1e3, 1e-300, 1e300)),
      capacitor: fc.oneof(fc.double(), fc.constant(10e-9)),
      series: fc.oneof(fc.constantFrom("E6", "E12", "E24", "E96", "E3"), fc.anything()),
      preset: fc.oneof(fc.constant("general"), fc.anything()),
      startupTime: fc.double(),
      rails: fc.oneof(fc.tuple(fc.double(), fc.double()), fc.anything()),
      limit: fc.oneof(fc.constantFrom("diodes", "lamp", "thermistor"), fc.anything()),
    },
    { requiredKeys: ["topology", "frequency"] },
  ),
);

/** Callbacks that misbehave: throw a typed error, return NaN, a string, an object, nothing. */
const callback = fc.oneof(
  fc.constantFrom<unknown>(
    () => NaN,
    () => "1k",
    () => ({}),
    () => undefined,
    () => -1,
    () => Infinity,
    (c: number) => 1 / (2 * Math.PI * 1e3 * c),
    () => ({ verdict: 3, frequency: "1k", amplitude: {}, thd: NaN, startupTime: -1 }),
    () => ({ verdict: "settled", frequency: 1e3, amplitude: 1, thd: 0.01, startupTime: 0.01 }),
  ),
  hostile,
);

const entries: Record<string, [fc.Arbitrary<unknown>, (a: unknown, b: unknown, c: unknown) => unknown]> = {
  designOscillator: [hostile, (a, b) => designOscillator(a as never, b as never)],
  "designOscillator (simulate)": [callback, (a, b) => designOscillator({ topology: "wien", frequency: 1e3, ...(typeof b === "object" && b !== null ? b : {}) } as never, { simulate: a as never })],
  snapToSeries: [hostile, (a, b) => snapToSeries(a as never, b as never)],
  isSeriesName: [hostile, (a) => isSeriesName(a as never)],
  chooseCapacitor: [callback, (a, b, c) => chooseCapacitor(a as never, b as never, c as never, "E24")],
  "chooseCapacitor (target, series)": [hostile, (a, b) => chooseCapacitor((c: number) => 1 / (2 * Math.PI * 1e3 * c), (r: number, c: number) => 1 / (2 * Math.PI * r * c), a as never, b as never)],
  writeValue: [hostile, (a) => writeValue(a as never)],
  twinTCrossing: [hostile, (a) => twinTCrossing(a as never)],
  lampWienAmplitude: [hostile, (a, b) => lampWienAmplitude(a as never, b as never)],
  thermistorWienAmplitude: [hostile, (a, b) => thermistorWienAmplitude(a as never, b as never)],
};

describe("the design entries validate at the door", () => {
  test.each(Object.keys(entries))("%s: hostile arguments give a result or an OnsetError, in bounded time", (name) => {
    const [first, call] = entries[name]!;
    fc.assert(
      fc.property(first, callback, hostile, (a, b, c) => {
        onlyTypedErrors(() => call(a, b, c), true);
      }),
      { numRuns: 200 },
    );
  });
});

describe("the design door's errors", () => {
  const thrown = (f: () => unknown): OnsetError => thrownBy(OnsetError, f);

  test("designOscillator names itself and what it got; ranges keep their own codes", () => {
    const e = thrown(() => designOscillator({ topology: "ring" as never, frequency: 1e3 }));
    expect([e.diagnostic.code, e.message]).toEqual(["bad-argument", 'designOscillator: topology must be one of wien, twin-t, phase-shift, got "ring"']);
    expect(thrown(() => designOscillator({ topology: "wien", frequency: -1 })).diagnostic.code).toBe("out-of-range");
    expect(thrown(() => designOscillator({ topology: "wien", frequency: 1e3, capacitor: Infinity })).diagnostic.code).toBe("out-of-range");
  });

  test("a simulate callback that returns the wrong shape is bad-argument, not a wrong header", () => {
    const e = thrown(() => designOscillator({ topology: "wien", frequency: 1e3 }, { simulate: () => ({ verdict: "settled", frequency: "1k" }) as never }));
    expect(e.message).toMatch(/^designOscillator: options\.simulate must return \{ verdict, frequency, amplitude, thd, startupTime \}/);
  });

  test("a lamp bridge whose Rf is below twice the lamp's cold resistance has no settled amplitude: refused, not NaN", () => {
    expect(thrown(() => lampWienAmplitude(1e-300)).message).toMatch(/^lampWienAmplitude: rf = 1e-300 Ω and ambient = [\d.]+ K are outside the range the formula can evaluate/);
    expect(lampWienAmplitude(1e3)).toBeGreaterThan(0);
  });

  test("chooseCapacitor refuses a callback that returns something other than a positive number", () => {
    const e = thrown(() => chooseCapacitor(() => "10k" as never, (r, c) => 1 / (r * c), 1e3, "E24"));
    expect(e.message).toBe('chooseCapacitor: resistanceFor must return a finite number above 0, returned "10k"');
  });
});

// The transient towards the orbit keeps only what its level criterion and its period measurement
// read: the probe's samples over the last few periods, however many periods it runs.
import { describe, expect, test } from "vitest";
import { buildSystem, OrbitApproach, probeReader, TransientStepper } from "@onset/core/engine";
import { clippedWien } from "./support.js";

describe("OrbitApproach", () => {
  // R = 1 k, C = 100 nF Wien bridge: f = 1/(2πRC) ≈ 1.59 kHz (closed form), a little lower once the clip bites.
  const period = 2 * Math.PI * 1e3 * 100e-9;
  const start = () => {
    const system = buildSystem(clippedWien(3.3));
    const rest = new TransientStepper(system, { start: "bias", maxStep: period / 100 });
    const x = Float64Array.from(rest.x);
    x[system.nodeIndex.get("p")!] += 1;
    const stepper = new TransientStepper(system, { start: { t: 0, x }, maxStep: period / 100 });
    return new OrbitApproach(stepper, probeReader(system, { kind: "node", node: "o" }), period, 1);
  };

  test("its memory does not grow with the periods run: as many samples held after 400 periods as after 20", () => {
    const approach = start();
    const check = () => {};
    approach.advance(20, undefined, check);
    const early = approach.samplesHeld;
    const where = approach.advance(380, undefined, check);
    expect(where.kind).toBe("oscillating");
    expect(approach.periods).toBe(400);
    // Five periods of samples at most (the last four and the one that started them), at about 100 steps each.
    expect(early).toBeLessThan(6 * 100);
    expect(approach.samplesHeld).toBeLessThan(early + 20);
  });

  test("the period it measures from the probe's crossings lies within 10 % of the closed form's 1/(2πRC)", () => {
    const where = start().advance(60, 1e-3, () => {});
    expect(where.kind).toBe("oscillating");
    if (where.kind === "oscillating") expect(Math.abs(where.period / period - 1)).toBeLessThan(0.1);
  });
});

/**
 * A stand-in for the stepper: the probe is a 1 s sine whose swing follows `envelope(t)`
 * (the approach reads only t, observe and advance).
 */
function sineWith(envelope: (t: number) => number): TransientStepper {
  const observers: ((t: number, x: Float64Array, dxdt: Float64Array) => void)[] = [];
  const x = new Float64Array(1);
  const fake = {
    t: 0,
    observe(o: (t: number, x: Float64Array, dxdt: Float64Array) => void) {
      observers.push(o);
      x[0] = 0;
      o(fake.t, x, x);
    },
    advance(to: number) {
      while (fake.t < to - 1e-12) {
        fake.t = Math.min(to, fake.t + 0.01);
        x[0] = 0.5 * envelope(fake.t) * Math.sin(2 * Math.PI * fake.t);
        for (const o of observers) o(fake.t, x, x);
      }
    },
  };
  return fake as unknown as TransientStepper;
}
const readFirst = (x: Float64Array) => x[0]!;

describe("OrbitApproach's level criterion", () => {
  test("a swing settling steadily (e^(−t/2) towards 1) levels off within a few periods at the level asked", () => {
    const approach = new OrbitApproach(sineWith((t) => 1 + Math.exp(-t / 2)), readFirst, 1, 1);
    const where = approach.advance(100, 0.1, () => {});
    expect(where.kind === "oscillating" && where.levelled).toBe(true);
    expect(approach.periods).toBeLessThan(10);
  });

  test("a bouncing envelope is not levelled at its dip, where the swing lingers, but only once the bounce is within the level", () => {
    // The swing doubles each period up to an overshoot at t = 10, then bounces as
    // 1 + 0.9·e^(−t/150)·cos(2π(t − 10)/100): around its first dip (t ≈ 60, swing ≈ 0.4) it
    // changes by less than 10 % per period for some twenty periods; the bounce's span falls
    // below 10 % of the swing only once 2·0.9·e^(−t/150) < 0.1, t > 150·ln 18 ≈ 434.
    const bounce = (t: number) => 1 + 0.9 * Math.exp(-t / 150) * Math.cos((2 * Math.PI * (t - 10)) / 100);
    const envelope = (t: number) => (t < 10 ? bounce(10) * 2 ** (t - 10) : bounce(t));
    const approach = new OrbitApproach(sineWith(envelope), readFirst, 1, 1);
    const levelled: number[] = [];
    for (let k = 0; k < 600; k++) {
      const where = approach.advance(1, 0.1, () => {});
      if (where.kind === "oscillating" && where.levelled) levelled.push(approach.periods);
    }
    expect(levelled.filter((p) => p > 40 && p < 80)).toEqual([]);
    expect(levelled.filter((p) => p > 40 && p < 400)).toEqual([]);
    expect(levelled).toContain(600);
  });

  test("advance(most, level, check, earliest) does not stop for a levelled swing before `earliest` periods in all (a failed shooting's back-off)", () => {
    // The same steadily settling swing as above levels off within ten periods; held back to 20, it stops at 20 exactly.
    const approach = new OrbitApproach(sineWith((t) => 1 + Math.exp(-t / 2)), readFirst, 1, 1);
    const where = approach.advance(100, 0.1, () => {}, 20);
    expect(where.kind === "oscillating" && where.levelled).toBe(true);
    expect(approach.periods).toBe(20);
  });

  test("a swing that dips far below its peak and grows again is died out without patience, oscillating with it", () => {
    // Grows to 1 by t = 5, falls by half per period to about 1e-6 at t = 25, stays there until
    // t = 60 (a peak detector bleeding back), then grows fourfold per period back to 1.
    const envelope = (t: number) => (t < 5 ? 2 ** (t - 5) : t < 25 ? 0.5 ** (t - 5) : t < 60 ? 1e-6 : Math.min(1, 1e-6 * 4 ** (t - 60)));
    const hasty = new OrbitApproach(sineWith(envelope), readFirst, 1, 1);
    expect(hasty.advance(100, undefined, () => {}).kind).toBe("died-out");
    const patient = new OrbitApproach(sineWith(envelope), readFirst, 1, 1, 60);
    const where = patient.advance(30, undefined, () => {});
    expect(where.kind).toBe("oscillating");
    // The quiet periods (from about t = 12 on) do not count towards the thirty asked for.
    expect(patient.periods).toBeGreaterThan(70);
  });
});

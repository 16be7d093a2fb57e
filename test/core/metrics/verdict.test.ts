import { describe, expect, test } from "vitest";
import { measureStartup } from "../../../packages/core/src/metrics/startup.js";
import { jitteredTimes, sampled } from "./signals.js";

const f = 1000;
const period = 1 / f;
const omega = 2 * Math.PI * f;
const times = (cycles: number, seed: number): Float64Array => jitteredTimes(0, cycles * period, period / 60, seed);

describe("measureStartup verdicts on synthetic records", () => {
  // 0.9 of the 1.47 V peak of 1.5·sin θ + 0.03·sin 3θ is first reached at θ ≈ 1.0852 rad.
  test("settled: a steady sine with harmonics", () => {
    const t = times(30, 51);
    const metrics = measureStartup(t, sampled(t, (x) => 1.5 * Math.sin(omega * x) + 0.03 * Math.sin(3 * omega * x)));
    expect(metrics.verdict).toBe("settled");
    expect(metrics.explanation).toBe(
      "settled at 1.47 V peak and 1 kHz, 90 % reached at 172.7 µs; envelope steady within 0.1 %/cycle over the last 10 cycles",
    );
    expect(metrics.thd).toBeCloseTo(0.02, 5);
    expect(metrics.harmonics).toHaveLength(10);
    expect(metrics.harmonics[2].frequency).toBe(3 * metrics.frequency!);
    expect(metrics.suggestedExtraTime).toBeUndefined();
  });

  test("the explanation quotes the swing in the probe's unit: the same record probed as a current or a temperature", () => {
    const t = times(30, 51);
    const record = sampled(t, (x) => 1.5 * Math.sin(omega * x) + 0.03 * Math.sin(3 * omega * x));
    expect(measureStartup(t, record, { unit: "A" }).explanation).toMatch(/^settled at 1\.47 A peak and 1 kHz/);
    expect(measureStartup(t, record, { unit: "K" }).explanation).toMatch(/^settled at 1\.47 K peak and 1 kHz/);
    const ripple = sampled(times(40, 7), (x) => 1.5e-6 * Math.sin(omega * x));
    expect(measureStartup(times(40, 7), ripple, { unit: "A", noiseFloor: 1e-6 }).explanation).toBe(
      "no oscillation: the envelope never exceeded 2× the noise floor (largest 1.5 µA peak against 1 µA)",
    );
  });

  test("settled: a hard-clipped sine whose first sample on each plateau overshoots by up to 2 % (numerical corner overshoot)", () => {
    // clip(1.3·sin θ, ±1); the sample that lands first on each flat top or bottom is pushed
    // 0–2 % past the limit, a different amount every cycle (seeded), as an integrator that
    // rounds a clip corner coarsely would leave it. The peaks then wander by up to 2 % per
    // cycle, the power of each cycle by far less than the settling tolerance.
    const t = jitteredTimes(0, 40 * period, period / 200, 53);
    const clipped = (x: number) => Math.max(-1, Math.min(1, 1.3 * Math.sin(omega * x)));
    const v = sampled(t, clipped);
    let state = 12345;
    for (let i = 1; i < v.length; i++) {
      if (Math.abs(v[i]!) === 1 && Math.abs(v[i - 1]!) < 1) {
        state = (Math.imul(state, 1103515245) + 12345) >>> 0;
        v[i] = v[i]! * (1 + 0.02 * (state / 2 ** 32));
      }
    }
    const metrics = measureStartup(t, v);
    expect(metrics.verdict).toBe("settled");
    expect(Math.abs(metrics.frequency! / f - 1)).toBeLessThan(1e-4);
  });

  test("growing: pure exponential growth, with the extra run time from σ and the amplitude limit", () => {
    const sigma = 200;
    const t = times(30, 52);
    const v = sampled(t, (x) => 1e-3 * Math.exp(sigma * x) * Math.sin(omega * x));
    const plain = measureStartup(t, v);
    expect(plain.verdict).toBe("growing");
    expect(Math.abs(plain.growthRate! / sigma - 1)).toBeLessThan(1e-3);
    expect(plain.thd).toBeNull();
    expect(plain.startupTime).toBeNull();
    expect(plain.amplitude).toBe(plain.envelope.value[plain.cycles - 1]);
    // Exponential growth, no limit given: one more decade, then 10 cycles to confirm.
    expect(plain.suggestedExtraTime!).toBeCloseTo(Math.LN10 / sigma + 10 * period, 6);
    const limited = measureStartup(t, v, { amplitudeLimit: 5 });
    expect(limited.suggestedExtraTime!).toBeCloseTo(Math.log(5 / limited.amplitude!) / sigma + 10 * period, 6);
    expect(plain.explanation).toBe("still growing at the end: envelope +22.1 %/cycle (σ ≈ 200 /s); run about 21.51 ms longer");
  });

  test("growing, then settled once run for the suggested extra time (a slowing logistic envelope)", () => {
    const rate = omega / 20;
    const t0 = 0.02;
    const signal = (x: number): number => (2 / (1 + Math.exp(-rate * (x - t0)))) * Math.sin(omega * x);
    // Cut where the envelope is at 88 % and still climbing several percent per cycle.
    const cut = t0 + 2 / rate;
    const short = jitteredTimes(0, cut, period / 60, 53);
    const first = measureStartup(short, sampled(short, signal));
    expect(first.verdict).toBe("growing");
    const longer = jitteredTimes(0, cut + first.suggestedExtraTime!, period / 60, 53);
    expect(measureStartup(longer, sampled(longer, signal)).verdict).toBe("settled");
  });

  test("decaying: a ring-down e^{−σt}·sin ωt, σ recovered within 1 %", () => {
    const sigma = 150;
    const t = times(40, 54);
    const metrics = measureStartup(t, sampled(t, (x) => 0.8 * Math.exp(-sigma * x) * Math.sin(omega * x)));
    expect(metrics.verdict).toBe("decaying");
    expect(Math.abs(metrics.growthRate! / -sigma - 1)).toBeLessThan(0.01);
    expect(Math.abs(metrics.frequency! / f - 1)).toBeLessThan(1e-5);
    expect(metrics.explanation).toBe("no oscillation: the envelope dies away, -13.9 %/cycle (σ ≈ -150 /s)");
  });

  // Above the hysteresis band (the noise floor) there are cycles, and they shrink: the ring-down
  // rule comes before the "never above twice the floor" rule.
  test("decaying, not silent: a kick that rings down from 1.8× the noise floor", () => {
    const t = times(40, 55);
    const metrics = measureStartup(t, sampled(t, (x) => 1.8e-3 * Math.exp(-10 * x) * Math.sin(omega * x)), { noiseFloor: 1e-3 });
    expect(metrics.verdict).toBe("decaying");
  });

  test("decaying: a slow decay at 0.5 %/cycle that never grew", () => {
    const t = times(40, 56);
    const metrics = measureStartup(t, sampled(t, (x) => 0.3 * Math.exp(-5 * x) * Math.sin(omega * x)));
    expect(metrics.verdict).toBe("decaying");
    expect(Math.abs(metrics.growthRate! / -5 - 1)).toBeLessThan(0.01);
  });

  test("silent: a constant level has no crossings at all", () => {
    const t = times(20, 57);
    const metrics = measureStartup(t, sampled(t, () => 2.5));
    expect(metrics.verdict).toBe("silent");
    expect(metrics.explanation).toBe("no oscillation: the probe makes no complete cycle through its mean");
    expect(metrics.cycles).toBe(0);
    expect(metrics.offset).toBeCloseTo(2.5, 12);
    expect(metrics.frequency).toBeNull();
    expect(metrics.amplitude).toBeNull();
  });

  test("silent: an exponential settling with no swing and two cycles of record are not oscillations", () => {
    const t = times(20, 58);
    expect(measureStartup(t, sampled(t, (x) => 1 - Math.exp(-x / 3e-3))).verdict).toBe("silent");
    // The detector arms on the first half-wave below the band, so crossings are at P, 2P, 3P.
    const short = jitteredTimes(0, 3.6 * period, period / 60, 58);
    const metrics = measureStartup(short, sampled(short, (x) => Math.sin(omega * x)));
    expect(metrics.verdict).toBe("silent");
    expect(metrics.explanation).toBe("no oscillation: only 2 complete cycles in the record (at least 3 needed)");
  });

  test("silent: a steady ripple that never exceeds twice the given noise floor", () => {
    const t = times(30, 59);
    const metrics = measureStartup(t, sampled(t, (x) => 1.5e-3 * Math.sin(omega * x)), { noiseFloor: 1e-3 });
    expect(metrics.verdict).toBe("silent");
    expect(metrics.explanation).toBe(
      "no oscillation: the envelope never exceeded 2× the noise floor (largest 1.5 mV peak against 1 mV)",
    );
  });

  test("bouncing: a 5 % envelope modulation over 15 cycles that does not die away", () => {
    const t = times(60, 60);
    const metrics = measureStartup(t, sampled(t, (x) => (1 + 0.05 * Math.sin((omega * x) / 15)) * Math.sin(omega * x)));
    expect(metrics.verdict).toBe("bouncing");
    expect(metrics.thd).toBeNull();
    // The envelope's own oscillation is at f/15 = 66.7 Hz, undamped (mathematics).
    expect(Math.abs(metrics.envelope.bounceFrequency! / (f / 15) - 1)).toBeLessThan(2e-3);
    expect(Math.abs(metrics.envelope.dampingRatio!)).toBeLessThan(5e-3);
    expect(metrics.explanation).toBe("the amplitude loop is unstable: the envelope bounces at 66.67 Hz (damping ratio 0.000) and does not die away");
  });

  test("unsettled: the amplitude keeps wandering (5 % envelope modulation over 60 cycles, less than one bounce seen)", () => {
    const t = times(50, 60);
    const metrics = measureStartup(t, sampled(t, (x) => (1 + 0.05 * Math.sin((omega * x) / 60)) * Math.sin(omega * x)));
    expect(metrics.verdict).toBe("unsettled");
    expect(metrics.thd).toBeNull();
    // The change per cycle is at most 0.05·2π/60 = 0.52 % (mathematics); 0.32 % over the last ten.
    expect(metrics.explanation).toBe(
      "amplitude still wandering: envelope changes up to 0.32 %/cycle over the last 10 cycles (settled needs under 0.1 %)",
    );
  });

  test("unsettled: an overshoot still relaxing towards its level is neither decaying nor settled", () => {
    const t = times(60, 63);
    // Up to 1.2 within a few cycles, then back towards 1 with a 30-cycle time constant.
    const envelope = (x: number): number => (1 + 0.2 * Math.exp(-x / (30 * period))) * (1 - Math.exp(-x / (2 * period)));
    const metrics = measureStartup(t, sampled(t, (x) => envelope(x) * Math.sin(omega * x)));
    expect(metrics.verdict).toBe("unsettled");
    expect(metrics.explanation).toMatch(
      /^amplitude still relaxing after its peak: envelope -0\.\d+ %\/cycle over the last 10 cycles \(settled needs under 0\.1 %\); run longer$/,
    );
  });

  test("unsettled: a steady sine of only 6 cycles is too short to judge", () => {
    const t = times(7.5, 61);
    const metrics = measureStartup(t, sampled(t, (x) => Math.sin(omega * x)));
    expect(metrics.verdict).toBe("unsettled");
    expect(metrics.explanation).toBe("only 6 cycles: too few to judge settling (need 11); run longer");
  });

  test("a hard-clipped steady oscillation is settled: the cubic is not trusted past a plateau's edge", () => {
    const t = times(30, 62);
    const metrics = measureStartup(t, sampled(t, (x) => Math.max(-1, Math.min(1, 1.4 * Math.sin(omega * x)))));
    expect(metrics.verdict).toBe("settled");
    expect(metrics.amplitude).toBe(1);
  });
});

describe("measureStartup option checks", () => {
  const t = Float64Array.from([0, 1, 2, 3, 4]);
  const v = new Float64Array(5);
  test.each([
    [{ noiseFloor: -1 }, "measureStartup: noiseFloor must be a finite number >= 0 (got -1)"],
    [{ maxOrder: 0 }, "measureStartup: maxOrder must be a whole number >= 1 (got 0)"],
    [{ settleCycles: 1 }, "measureStartup: settleCycles must be a whole number >= 2 (got 1)"],
    [{ settleTolerance: 0 }, "measureStartup: settleTolerance must lie between 0 and 1 (got 0)"],
    [{ amplitudeLimit: Number.NaN }, "measureStartup: amplitudeLimit must be a positive voltage (got NaN)"],
  ])("%o is refused", (options, message) => {
    expect(() => measureStartup(t, v, options)).toThrow(message);
  });
});

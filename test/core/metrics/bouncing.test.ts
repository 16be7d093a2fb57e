// The `bouncing` verdict on synthetic envelopes that collapse and restart (an amplitude loop whose
// filter lags so far that each overshoot kills the oscillation, which then grows again from
// what is left), and the cases that must not be called bouncing.
import { describe, expect, test } from "vitest";
import { collapsesAndRestarts } from "../../../packages/core/src/metrics/collapses.js";
import { measureStartup } from "../../../packages/core/src/metrics/startup.js";
import { jitteredTimes, sampled } from "./signals.js";

const f = 1000;
const period = 1 / f;
const omega = 2 * Math.PI * f;
const times = (cycles: number, seed: number): Float64Array => jitteredTimes(0, cycles * period, period / 60, seed);

/** A squegging envelope: every `every` cycles it grows from `from` to 1 in 15 cycles, holds 5, and falls back to `from` in 10. */
function squegging(every: number, from: number): (t: number) => number {
  return (t) => {
    const c = (t / period) % every;
    const grow = Math.log(1 / from);
    if (c < 15) return from * Math.exp((grow * c) / 15);
    if (c < 20) return 1;
    if (c < 30) return Math.exp((-grow * (c - 20)) / 10);
    return from;
  };
}

describe("bouncing: the envelope collapses and restarts", () => {
  test("collapses to 1 % every 40 cycles, four restarts within 170 cycles (the last caught once it has risen fivefold): bouncing, with the count", () => {
    const t = times(170, 71);
    const envelope = squegging(40, 0.01);
    const metrics = measureStartup(t, sampled(t, (x) => envelope(x) * Math.sin(omega * x)));
    expect(metrics.verdict).toBe("bouncing");
    expect(metrics.thd).toBeNull();
    expect(metrics.explanation).toMatch(/^the amplitude loop is unstable: the envelope collapsed and restarted 4 times/);
  });

  test("three restarts alike within 130 cycles: bouncing, but not yet a repeating cycle (three collapses can agree by chance)", () => {
    const t = times(130, 71);
    const envelope = squegging(40, 0.01);
    const metrics = measureStartup(t, sampled(t, (x) => envelope(x) * Math.sin(omega * x)));
    expect(metrics.verdict).toBe("bouncing");
    expect(metrics.explanation).toMatch(/^the amplitude loop has not settled: the envelope collapsed and restarted 3 times \(peaks [^)]*\), neither dying away nor yet repeating a cycle \(4 collapses alike, or 3 each deeper\)/);
  });

  test("collapses below the crossing hysteresis (the cycles stop, a gap) count as well", () => {
    const t = times(130, 72);
    const envelope = squegging(40, 1e-7);
    const metrics = measureStartup(t, sampled(t, (x) => envelope(x) * Math.sin(omega * x)));
    expect(metrics.verdict).toBe("bouncing");
    expect(metrics.explanation).toMatch(/collapsed and restarted 2 times/);
  });

  test("one collapse and restart, then a steady amplitude: settled, not bouncing", () => {
    const t = times(120, 73);
    const once = squegging(1e9, 0.01);
    const envelope = (x: number) => (x < 40 * period ? squegging(40, 0.01)(x) : once(x - 40 * period) > 0.999 || x > 55 * period ? 1 : once(x - 40 * period));
    const metrics = measureStartup(t, sampled(t, (x) => envelope(x) * Math.sin(omega * x)));
    expect(metrics.verdict).toBe("settled");
  });

  test("a wild first overshoot does not hide the collapses after it (each deep valley counts)", () => {
    // 20 at first, then collapses to 0.2 % and restarts to about 2, three times
    const envelope = Float64Array.from([1, 5, 20, 8, 2, 0.04, 0.3, 2, 2.5, 0.5, 0.03, 0.4, 2, 0.2, 0.01, 1.5, 1.6]);
    const start = Float64Array.from({ length: envelope.length + 1 }, (_, k) => k * period);
    const cycles = { count: envelope.length, start, envelope } as Parameters<typeof collapsesAndRestarts>[0];
    expect(collapsesAndRestarts(cycles)).toBe(3);
    // a restart must rise above the floor given: 0.4 and 1.5, 1.6 do not
    expect(collapsesAndRestarts(cycles, 1.8)).toBe(2);
  });

  test("a ring-down to nothing is no restart, and a dip to 60 % is no collapse", () => {
    const t = times(80, 74);
    const ringDown = measureStartup(t, sampled(t, (x) => Math.exp(-x / (10 * period)) * Math.sin(omega * x)));
    expect(ringDown.verdict).toBe("decaying");
    const dip = (x: number) => 1 - 0.4 * Math.exp(-(((x / period - 30) / 5) ** 2));
    const dipped = measureStartup(t, sampled(t, (x) => dip(x) * Math.sin(omega * x)));
    expect(dipped.verdict).not.toBe("bouncing");
  });
});

describe("collapsesAndRestarts(cycles)", () => {
  test("counts falls below 20 % of the largest since the last restart followed by rises to 5× the collapse's lowest", () => {
    const envelope = Float64Array.from([0.1, 0.6, 1, 0.5, 0.15, 0.3, 0.55, 1, 0.1, 0.9, 0.05, 0.02]);
    const start = Float64Array.from({ length: envelope.length + 1 }, (_, k) => k * period);
    const cycles = { count: envelope.length, start, envelope } as Parameters<typeof collapsesAndRestarts>[0];
    // 1 → 0.15 (collapse) → 1 (restart: 0.55 is under 5 × 0.15); 1 → 0.1 → 0.9 (restart); the last fall does not restart.
    expect(collapsesAndRestarts(cycles)).toBe(2);
  });
});

import type { PeriodicOrbit } from "@onset/core/engine";

/** One period T of `wave` on a grid of N steps whose lengths vary by up to ±30 % (`jitter`), as a one-unknown orbit. */
export function jitteredOrbit(wave: (t: number) => number, T: number, N: number, jitter: number[]): PeriodicOrbit {
  const raw = Array.from({ length: N }, (_, k) => 1 + 0.3 * jitter[k % jitter.length]!);
  const sum = raw.reduce((a, b) => a + b, 0);
  const fractions = Float64Array.from(raw, (r) => r / sum);
  let t = 0;
  const states = [Float64Array.of(wave(0))];
  for (let k = 0; k < N; k++) {
    t += fractions[k]! * T;
    states.push(Float64Array.of(wave(k === N - 1 ? T : t)));
  }
  return { start: { t0: 0, x: states[0]!, period: T }, fractions, states, iterations: 0, mismatch: 0, multipliers: [] };
}

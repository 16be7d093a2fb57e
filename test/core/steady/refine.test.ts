// The amplitude's error bar where an extremum sits on a corner: a half-wave rectifier's capacitor
// voltage, whose minimum is where the diode starts conducting.
import { createRequire } from "node:module";
import { describe, expect, test } from "vitest";
import { runSteady, THERMAL_VOLTAGE, type SteadyResult } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const { Solver } = createRequire(import.meta.url)("odex") as typeof import("odex");

const rectifier = (freq: number, c: string, rl: string) => `vsource V1 in gnd wave=sine amp=9 freq=${freq}\ndiode D1 in o\ncapacitor C1 o gnd ${c}\nresistor RL o gnd ${rl}`;
const steadyOf = (text: string, options = ""): SteadyResult => {
  const circuit = elaborate(loadProgram("corners.onset", `${text}\nsteady probe=o${options}\n`).program, {}).circuit!;
  return runSteady(circuit, circuit.analyses[0] as Parameters<typeof runSteady>[1]);
};

/**
 * Half the peak-to-peak of the capacitor voltage on the periodic orbit of C·v' = i_D(vₛ − v) − v/R_L,
 * the diode the engine's default (Iₛ 2.5 nA, n 1.8, 0.5 Ω in series, 1 pS across), by the odex ODE
 * integrator: the orbit by iterating periods from the drive's peak, its extremes from 200 000 samples.
 */
function rectifierAmplitude(freq: number, c: number, rl: number): number {
  const is = 2.5e-9;
  const nvt = 1.8 * THERMAL_VOLTAGE;
  const current = (vd: number) => {
    // The junction voltage vj with vj + 0.5·i(vj) = vd, by bisection.
    let [lo, hi] = [Math.min(-50, vd - 1), Math.min(vd, 2) + 1e-9];
    for (let i = 0; i < 100; i++) {
      const vj = 0.5 * (lo + hi);
      if (vj + 0.5 * (is * Math.expm1(vj / nvt) + 1e-12 * vj) > vd) hi = vj;
      else lo = vj;
    }
    const vj = 0.5 * (lo + hi);
    return is * Math.expm1(vj / nvt) + 1e-12 * vj;
  };
  const T = 1 / freq;
  const solver = new Solver(1);
  solver.relativeTolerance = 1e-12;
  solver.absoluteTolerance = 1e-13;
  solver.maxSteps = 1e7;
  solver.denseOutput = true;
  const rate = (t: number, y: number[]) => [(current(9 * Math.sin(2 * Math.PI * freq * t) - y[0]!) - y[0]! / rl) / c];
  let v = 8;
  for (let turn = 0; turn < 400; turn++) {
    const next = solver.solve(rate, 0, [v], T, () => undefined).y[0]!;
    const done = Math.abs(next - v) < 1e-13;
    v = next;
    if (done) break;
  }
  const n = 200_000;
  let [max, min] = [-Infinity, Infinity];
  let k = 0;
  solver.solve(rate, 0, [v], T, (_i, _a, x, y, dense) => {
    for (; k <= n && (k * T) / n <= x; k++) {
      const value = dense ? dense(0, (k * T) / n) : y[0]!;
      [max, min] = [Math.max(max, value), Math.min(min, value)];
    }
  });
  return (max - min) / 2;
}

describe("the amplitude's bar when an extremum sits on a corner", () => {
  test("a 60 Hz half-wave rectifier into 47 µF ∥ 1.5 kΩ (its two grids' swings agreed by chance: bar 1.3e-5 V, error 1.3e-4 V): the amplitude lies within its bar of the odex ODE integrator's, the bar under 2 mV", () => {
    const reference = rectifierAmplitude(60, 47e-6, 1.5e3);
    const r = steadyOf(rectifier(60, "47u", "1.5k"));
    expect(Math.abs(r.amplitude! - reference)).toBeLessThan(r.numericalError!.amplitude);
    expect(r.numericalError!.amplitude).toBeLessThan(2e-3);
  }, 60_000);

  test("27 rectifiers (50, 60, 400 Hz; 10, 47, 220 µF; 470 Ω, 1.5 kΩ, 10 kΩ): amplitude, rms and THD within their bars of the same circuit at accuracy=1e-8 (cross-check)", () => {
    const outside: string[] = [];
    for (const f of [50, 60, 400])
      for (const c of ["10u", "47u", "220u"])
        for (const rl of ["470", "1.5k", "10k"]) {
          const usual = steadyOf(rectifier(f, c, rl));
          const tight = steadyOf(rectifier(f, c, rl), " accuracy=1e-8");
          for (const figure of ["amplitude", "rms", "thd"] as const) {
            if (!(Math.abs(usual[figure]! - tight[figure]!) <= usual.numericalError![figure])) outside.push(`${f} Hz ${c} ${rl}: ${figure}`);
          }
        }
    expect(outside).toEqual([]);
  }, 120_000);
});

import { describe, expect, test } from "vitest";
import { Solver } from "odex";
import { runTransient, THERMAL_VOLTAGE } from "@onset/core";
import { circuit, part, sampleAt } from "../../support/circuits.js";

// A 10 kΩ resistor charging the 10 nF (zero-bias) depletion capacitance of a reverse-biased
// junction: the node's only charge is the diode's nonlinear one.
const R = 10e3;
const CJ0 = 10e-9;
const IS = 2.5e-9;
const NVT = 1.8 * THERMAL_VOLTAGE;
const drive = { amp: 2, offset: 3, freq: 1e3 };
const rc = circuit([
  part("vsource", "V1", ["in", "gnd"], undefined, { wave: "sine", ...drive, phase: 0 }),
  part("resistor", "R1", ["in", "a"], R),
  part("diode", "D1", ["gnd", "a"], undefined, { junction: CJ0, series: 0 }),
]);
const until = 2e-3;

function run(lteRelative?: number) {
  return runTransient(rc, { kind: "transient", until, start: "bias", probes: [{ kind: "node", node: "a" }] }, lteRelative ? { tolerances: { lteRelative } } : {});
}

/**
 * The same circuit as one state equation, integrated by odex (Gragg–Bulirsch–Stoer): with the
 * junction voltage vd = −v(a), C(vd)·dv/dt = (vin − v)/R + i(vd), where C(vd) = Cj0/√(1 − vd/0.7)
 * is the abrupt junction's depletion capacitance and i(vd) = Is·(e^(vd/nVt) − 1) + 1 pS·vd.
 */
function reference(times: readonly number[]): number[] {
  const rhs = (t: number, y: number[]) => {
    const v = y[0]!;
    const vd = -v;
    const vin = drive.offset + drive.amp * Math.sin(2 * Math.PI * drive.freq * t);
    const i = IS * (Math.exp(vd / NVT) - 1) + 1e-12 * vd;
    const c = CJ0 / Math.sqrt(1 - vd / 0.7);
    return [((vin - v) / R + i) / c];
  };
  const solver = new Solver(1);
  solver.relativeTolerance = 1e-12;
  solver.absoluteTolerance = 1e-14;
  solver.maxSteps = 1e6;
  // The bias point: (3 V − v)/R = Is + 1 pS·v, the reverse current's drop in R.
  const v0 = (drive.offset - R * IS) / (1 + R * 1e-12);
  return times.map((t) => solver.solve(rhs, 0, [v0], t).y[0]!);
}

describe("step control on a node whose only charge is nonlinear (a junction capacitance)", () => {
  const probeTimes = [0.13e-3, 0.41e-3, 0.77e-3, 1.02e-3, 1.37e-3, 1.66e-3, 1.93e-3];
  const ref = reference(probeTimes);
  const worst = (r: ReturnType<typeof run>) => Math.max(...probeTimes.map((t, k) => Math.abs(sampleAt(r.time, r.signals[0]!.values, t) - ref[k]!)));

  test("the step count follows the tolerance", () => {
    const loose = run(1e-3).stats.accepted;
    const tight = run(1e-6).stats.accepted;
    expect(tight).toBeGreaterThan(2.5 * loose);
  });

  test("the waveform agrees with odex, and more closely at a tighter tolerance", () => {
    const atDefault = worst(run());
    const atTight = worst(run(1e-6));
    // 5 V peak: within 0.05 % of the peak at the default 1e-4, within 0.004 % at 1e-6.
    expect(atDefault).toBeLessThan(2.5e-3);
    expect(atTight).toBeLessThan(2e-4);
    expect(atTight).toBeLessThan(atDefault / 5);
  });
});

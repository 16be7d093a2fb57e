import { describe, expect, test } from "vitest";
import { Solver } from "odex";
import { runBias, runTransient, type PartSpec } from "@onset/core";
import { DEFAULT_AMBIENT, lampNetwork, TUNGSTEN_EXPONENT } from "@onset/core/engine";
import { circuit, part, sampleAt } from "../../support/circuits.js";

// A small indicator-style filament: 40 Ω cold, 400 Ω at 12 V, 50 ms (values of our own).
const LAMP = { cold: 40, hot: 400, rated: 12, tau: 0.05 };
const lampPart = (a = "a", b = "gnd") => part("lamp", "L1", [a, b], LAMP.cold, { hot: LAMP.hot, rated: LAMP.rated, tau: LAMP.tau });

/** The lamp's resistance at DC with `volts` across it, from the bias point's current. */
function resistanceAt(volts: number): number {
  const bias = runBias(circuit([part("vsource", "V1", ["a", "gnd"], volts), lampPart()]), { kind: "bias" });
  const i = -bias.sources.find((s) => s.part === "V1")!.current;
  return volts / i;
}

describe("lamp", () => {
  test("cold point: at a millivolt the resistance is the cold value (defining equation R = COLD·(T/T_amb)^1.2 at T ≈ T_amb)", () => {
    expect(resistanceAt(1e-3) / LAMP.cold - 1).toBeLessThan(1e-5);
    expect(resistanceAt(1e-3) / LAMP.cold - 1).toBeGreaterThanOrEqual(0);
  });

  test("hot point: at the rated voltage the resistance is hot= (the defining point of the thermal network)", () => {
    expect(resistanceAt(LAMP.rated) / LAMP.hot).toBeCloseTo(1, 7);
  });

  test("the filament temperature is an unknown of the system, probed as L1.temperature in K", () => {
    const r = runTransient(circuit([part("vsource", "V1", ["a", "gnd"], LAMP.rated), lampPart()]), {
      kind: "transient",
      until: 1e-3,
      start: "bias",
      probes: [{ kind: "state", part: "L1", state: "temperature" }],
    });
    expect(r.signals[0]!.unit).toBe("K");
    // θ_hot = θ_amb·(hot/cold)^(1/1.2) (the tungsten law solved for θ)
    expect(r.signals[0]!.values[0]! / (DEFAULT_AMBIENT * Math.pow(LAMP.hot / LAMP.cold, 1 / TUNGSTEN_EXPONENT))).toBeCloseTo(1, 7);
  });

  test("switched on at the rated voltage, the temperature follows the heat balance C·dθ/dt = v²/R(θ) − (θ − θ_amb)/R_th (odex, Gragg–Bulirsch–Stoer)", () => {
    const net = lampNetwork(LAMP, DEFAULT_AMBIENT);
    const parts: PartSpec[] = [part("vsource", "V1", ["a", "gnd"], undefined, { wave: "pulse", low: 0, high: LAMP.rated, delay: 1e-3 }), lampPart()];
    const until = 0.2;
    const r = runTransient(circuit(parts), { kind: "transient", until, maxStep: 1e-3, start: "bias", probes: [{ kind: "state", part: "L1", state: "temperature" }] }, { tolerances: { lteRelative: 1e-6 } });
    const R = (th: number) => LAMP.cold * Math.pow(th / DEFAULT_AMBIENT, TUNGSTEN_EXPONENT);
    const solver = new Solver(1);
    solver.relativeTolerance = 1e-11;
    solver.absoluteTolerance = 1e-9;
    solver.denseOutput = true;
    const times = [0.005, 0.02, 0.05, 0.1, 0.2];
    const reference: number[] = [];
    solver.solve(
      (_t, [th]) => [((LAMP.rated * LAMP.rated) / R(th!) - (th! - DEFAULT_AMBIENT) / net.resistance) / net.capacity],
      1e-3,
      [DEFAULT_AMBIENT],
      until,
      (_n, _xOld, _x, _y, dense) => {
        while (reference.length < times.length && times[reference.length]! <= _x) reference.push(dense!(0, times[reference.length]!));
      },
    );
    expect(reference.length).toBe(times.length);
    times.forEach((t, k) => {
      const got = sampleAt(r.time, r.signals[0]!.values, t);
      expect(Math.abs(got - reference[k]!) / (reference[k]! - DEFAULT_AMBIENT)).toBeLessThan(1e-3);
    });
  });

  test("the thermal network from (hot, rated, tau): R_th = (θ_hot − θ_amb)·hot/rated², C_th = tau/R_th", () => {
    const net = lampNetwork(LAMP, 300);
    const hotTemperature = 300 * Math.pow(10, 1 / 1.2);
    expect(net.resistance).toBeCloseTo(((hotTemperature - 300) * 400) / 144, 9);
    expect(net.capacity * net.resistance).toBeCloseTo(0.05, 12);
  });

  test("a hot resistance not above the cold one is a positioned error with a hint", () => {
    const bad = { ...lampPart(), span: { file: "t.onset", start: 0, end: 10 } };
    const thrown = (() => {
      try {
        runBias(circuit([part("vsource", "V1", ["a", "gnd"], 1), { ...bad, options: { ...bad.options, hot: 30 } }]), { kind: "bias" });
      } catch (e) {
        return e as { diagnostic: { code: string; message: string; hint?: string; span?: unknown } };
      }
      return undefined;
    })();
    expect(thrown?.diagnostic.code).toBe("out-of-range");
    expect(thrown?.diagnostic.message).toBe("lamp L1: the hot resistance (30 Ω) must exceed the cold resistance (40 Ω)");
    expect(thrown?.diagnostic.hint).toMatch(/hot= is typically/);
    expect(thrown?.diagnostic.span).toEqual({ file: "t.onset", start: 0, end: 10 });
  });

  test("a missing rated= is a positioned error naming the option", () => {
    const p = { ...part("lamp", "L1", ["a", "gnd"], 40, { hot: 400, tau: 0.05 }), span: { file: "t.onset", start: 0, end: 10 } };
    expect(() => runBias(circuit([part("vsource", "V1", ["a", "gnd"], 1), p]), { kind: "bias" })).toThrow("lamp L1 needs rated=");
  });
});

describe("lamp in the poles analysis", () => {
  test("linearised at its bias temperature: on a fixed voltage the thermal pole is −(1/R_th + 1.2·P/θ)/C_th (heat balance differentiated, docs/references.md §12.1)", async () => {
    const { runPoles } = await import("@onset/core");
    const net = lampNetwork(LAMP, DEFAULT_AMBIENT);
    for (const volts of [0, 5, LAMP.rated]) {
      const r = runPoles(circuit([part("vsource", "V1", ["a", "gnd"], volts), lampPart()]), { kind: "poles" });
      // the bias temperature from the heat balance at that voltage (the bias point solves it)
      const bias = runTransient(circuit([part("vsource", "V1", ["a", "gnd"], volts), lampPart()]), { kind: "transient", until: 1e-6, start: "bias", probes: [{ kind: "state", part: "L1", state: "temperature" }] });
      const theta = bias.signals[0]!.values[0]!;
      const power = (volts * volts) / (LAMP.cold * Math.pow(theta / DEFAULT_AMBIENT, TUNGSTEN_EXPONENT));
      const expected = -(1 / net.resistance + (TUNGSTEN_EXPONENT * power) / theta) / net.capacity;
      expect(r.poles.length).toBe(1);
      expect(r.poles[0]!.real / expected).toBeCloseTo(1, 9);
    }
  });
});

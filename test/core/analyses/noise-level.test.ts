import { describe, expect, test } from "vitest";
import { DEFAULT_TOLERANCES, type Circuit } from "@onset/core";
import { BOLTZMANN, buildSystem, linearize, NewtonSolver, NoiseBank, noiseLevel, pencilPoles, probeWeights, solveBias, TransientStepper, withSources } from "@onset/core/engine";
import { circuit, part } from "../../support/circuits.js";

const kelvin = 300.15;
const node = (n: string) => ({ kind: "node", node: n }) as const;

function level(c: Circuit, probe: string, corner: number) {
  const system = buildSystem(c);
  const bias = solveBias(system, new NewtonSolver(system, DEFAULT_TOLERANCES));
  const ss = linearize(system, bias.x);
  const generators = system.devices.flatMap((d) => d.noise?.(kelvin) ?? []);
  return { rms: noiseLevel(ss, probeWeights(system, node(probe), bias.x), generators, corner, pencilPoles(ss)), system, generators };
}

describe("noise level at a probe, linearised (Johnson 1928, Nyquist 1928: thermal noise 4kT/R)", () => {
  test("R ∥ C: the node's noise is kT/C whatever R (mathematics: ∫ 4kTR/(1 + (ωRC)²) df = kT/C), within 1 %", () => {
    for (const R of [1e3, 47e3, 1e6]) {
      const C = 10e-9;
      const corner = 1000 / (2 * Math.PI * R * C);
      const { rms } = level(circuit([part("resistor", "R1", ["a", "gnd"], R), part("capacitor", "C1", ["a", "gnd"], C)]), "a", corner);
      expect(Math.abs(rms / Math.sqrt((BOLTZMANN * kelvin) / C) - 1)).toBeLessThan(0.01);
    }
  });

  test("twenty separate R ∥ C nodes (a circuit large enough for the sparse factorisation): each node's noise is still kT/C, within 1 %", () => {
    const C = 10e-9;
    const R = 47e3;
    const parts = Array.from({ length: 20 }, (_, k) => [part("resistor", `R${k}`, [`a${k}`, "gnd"], R * (1 + k / 10)), part("capacitor", `C${k}`, [`a${k}`, "gnd"], C)]).flat();
    const { rms, system } = level(circuit(parts), "a7", 1000 / (2 * Math.PI * R * C));
    expect(system.n).toBeGreaterThan(16);
    expect(Math.abs(rms / Math.sqrt((BOLTZMANN * kelvin) / C) - 1)).toBeLessThan(0.01);
  });

  test("noiseLevel(…, check) calls the run's limits at every frequency, changes nothing, and stops where the check throws", () => {
    const C = 10e-9;
    const R = 47e3;
    const parts = Array.from({ length: 20 }, (_, k) => [part("resistor", `R${k}`, [`a${k}`, "gnd"], R), part("capacitor", `C${k}`, [`a${k}`, "gnd"], C)]).flat();
    const system = buildSystem(circuit(parts));
    const bias = solveBias(system, new NewtonSolver(system, DEFAULT_TOLERANCES));
    const ss = linearize(system, bias.x);
    const generators = system.devices.flatMap((d) => d.noise?.(kelvin) ?? []);
    const args = [ss, probeWeights(system, node("a3"), bias.x), generators, 1000 / (2 * Math.PI * R * C), pencilPoles(ss)] as const;
    let calls = 0;
    const rms = noiseLevel(...args, () => void calls++);
    expect(rms).toBe(noiseLevel(...args));
    expect(calls).toBeGreaterThan(50);
    const stop = new Error("limit");
    let seen = 0;
    expect(() => noiseLevel(...args, () => { if (++seen === 3) throw stop; })).toThrow(stop);
    expect(seen).toBe(3);
  });

  test("a parallel R–L–C tank of Q ≈ 316: still kT/C (equipartition), the narrow resonance integrated within 1 %", () => {
    const R = 100e3;
    const L = 10e-3;
    const C = 100e-9;
    const f0 = 1 / (2 * Math.PI * Math.sqrt(L * C));
    const { rms } = level(
      circuit([part("resistor", "R1", ["a", "gnd"], R), part("inductor", "L1", ["a", "gnd"], L, { series: 0 }), part("capacitor", "C1", ["a", "gnd"], C)]),
      "a",
      50 * f0,
    );
    expect(Math.abs(rms / Math.sqrt((BOLTZMANN * kelvin) / C) - 1)).toBeLessThan(0.01);
  });

  test("two resistors from one node to ground: its noise is that of R1 ∥ R2, 4kT(R1∥R2)·∫shape df over a flat band, within 1 %", () => {
    // A band far below the node's 1/(2π·R∥·C) corner: flat, so the level is √(4kT·R∥·B·∫shape).
    const R1 = 10e3;
    const R2 = 30e3;
    const parallel = (R1 * R2) / (R1 + R2);
    const corner = 1e3;
    const c = circuit([part("resistor", "R1", ["a", "gnd"], R1), part("resistor", "R2", ["a", "gnd"], R2), part("capacitor", "C1", ["a", "gnd"], 1e-15)]);
    const { rms } = level(c, "a", corner);
    // ∫₀^∞ |Φ(f)/Φ(0)|² df for the Catmull–Rom kernel at samples 1/(2·corner) apart (computed below from its table)
    const shapeIntegral = (() => {
      let sum = 0;
      const n = 800;
      for (let i = 0; i < n; i++) {
        const f = ((i + 0.5) / n) * 2 * corner;
        let re = 0;
        const m = 400;
        for (let j = 0; j < m; j++) {
          const x = -2 + (4 * (j + 0.5)) / m;
          const a = Math.abs(x);
          const phi = a < 1 ? 1.5 * a ** 3 - 2.5 * a ** 2 + 1 : a < 2 ? -0.5 * a ** 3 + 2.5 * a ** 2 - 4 * a + 2 : 0;
          re += (phi * Math.cos((2 * Math.PI * f * x) / (2 * corner)) * 4) / m;
        }
        sum += (re * re * 2 * corner) / n;
      }
      return sum;
    })();
    expect(Math.abs(rms / Math.sqrt(4 * BOLTZMANN * kelvin * parallel * shapeIntegral) - 1)).toBeLessThan(0.01);
  });

  test("the transient noise bank reproduces the predicted level: R ∥ C simulated for 2000 time constants, variance within 8 %", () => {
    const R = 10e3;
    const C = 10e-9;
    const tau = R * C;
    const corner = 20 / (2 * Math.PI * tau);
    const c = circuit([part("resistor", "R1", ["a", "gnd"], R), part("capacitor", "C1", ["a", "gnd"], C)]);
    const { rms, system, generators } = level(c, "a", corner);
    const run = withSources(system, [new NoiseBank(generators, { seed: 4, corner })]);
    const stepper = new TransientStepper(run, { start: "bias", maxStep: tau / 20 });
    const a = system.nodeIndex.get("a")!;
    let sum = 0;
    let count = 0;
    stepper.observe((t, x) => {
      if (t > 10 * tau) {
        sum += x[a]! ** 2;
        count++;
      }
    });
    stepper.advance(2000 * tau);
    // 2000 τ hold about 1000 independent values of v (correlation time 2τ): se of a variance ≈ √(2/1000) = 4.5 %
    expect(Math.abs(Math.sqrt(sum / count) / rms - 1)).toBeLessThan(0.08);
  });
});

import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { runTransient, type PartSpec } from "@onset/core";
import { buildSystem, TransientStepper } from "@onset/core/engine";
import { circuit, part, sampleAt } from "../../support/circuits.js";

/** Random RC networks: k nodes, each with a resistor to gnd, random resistors and capacitors between nodes, a sine source. */
const rcNetwork = fc
  .record({
    nodes: fc.integer({ min: 2, max: 6 }),
    links: fc.array(
      fc.record({ a: fc.nat(5), b: fc.nat(5), r: fc.double({ min: 100, max: 1e5, noNaN: true }), c: fc.double({ min: 1e-9, max: 1e-6, noNaN: true }) }),
      { minLength: 1, maxLength: 10 },
    ),
    shunts: fc.array(fc.double({ min: 1e3, max: 1e6, noNaN: true }), { minLength: 6, maxLength: 6 }),
    freq: fc.double({ min: 100, max: 5e3, noNaN: true }),
  })
  .map(({ nodes, links, shunts, freq }) => {
    const name = (i: number) => `n${i % nodes}`;
    const parts: PartSpec[] = [
      part("vsource", "Vs", ["in", "gnd"], undefined, { wave: "sine", amp: 1, freq }),
      part("resistor", "Rs", ["in", "n0"], 1e3),
    ];
    for (let i = 0; i < nodes; i++) parts.push(part("resistor", `Rg${i}`, [name(i), "gnd"], shunts[i]!));
    links.forEach((l, i) => {
      if (l.a % nodes === l.b % nodes) return;
      parts.push(part("resistor", `R${i}`, [name(l.a), name(l.b)], l.r));
      parts.push(part("capacitor", `C${i}`, [name(l.a), name(l.b)], l.c));
    });
    parts.push(part("capacitor", "Cg", ["n0", "gnd"], 10e-9));
    return { parts, freq };
  });

describe("transient properties", () => {
  test("KCL holds at every accepted step of random RC networks (current leaving each node sums to ≈ 0)", () => {
    fc.assert(
      fc.property(rcNetwork, ({ parts, freq }) => {
        const c = circuit(parts);
        const system = buildSystem(c);
        const stepper = new TransientStepper(system, { start: "bias", maxStep: 1 / (20 * freq) });
        let worst = 0;
        let scale = 1e-9;
        stepper.observe((t, x, dxdt) => {
          const leaving = new Map<string, number>();
          for (const d of system.devices) {
            const i = d.current!(x, dxdt, t);
            scale = Math.max(scale, Math.abs(i));
            const [a, b] = d.part.nodes as [string, string];
            leaving.set(a, (leaving.get(a) ?? 0) + i);
            leaving.set(b, (leaving.get(b) ?? 0) - i);
          }
          for (const [node, sum] of leaving) if (node !== "gnd") worst = Math.max(worst, Math.abs(sum));
        });
        stepper.advance(3 / freq);
        expect(stepper.stats.accepted).toBeGreaterThan(20);
        expect(worst).toBeLessThan(1e-9 * scale + 1e-15);
      }),
      { numRuns: 40 },
    );
  });

  test("halving the LTE tolerance changes a smooth waveform by at most a few tolerances (≤ 5·tol·peak)", () => {
    // Error-per-step control: each step's error is below tol·peak, and over two periods of these
    // stable networks the errors do not pile up (measured: the change stays below 1.9·tol·peak
    // over 100 random networks), so 5·tol·peak is a bound with margin that still fails on a bug.
    fc.assert(
      fc.property(rcNetwork, fc.constantFrom(1e-3, 1e-4, 1e-5), ({ parts, freq }, tol) => {
        const c = circuit(parts);
        const run = (t: number) =>
          runTransient(c, { kind: "transient", until: 2 / freq, start: "bias", probes: [{ kind: "node", node: "n0" }] }, {
            tolerances: { lteRelative: t, lteVoltage: 1e-12 },
          });
        const coarse = run(tol);
        const fine = run(tol / 2);
        const peak = Math.max(...coarse.signals[0]!.values.map(Math.abs));
        // compare on the coarse grid, reading the fine run by a local cubic between its points
        let worst = 0;
        coarse.time.forEach((t, k) => {
          const v = sampleAt(fine.time, fine.signals[0]!.values, t);
          worst = Math.max(worst, Math.abs(v - coarse.signals[0]!.values[k]!));
        });
        expect(worst).toBeLessThanOrEqual(5 * tol * peak + 1e-9);
      }),
      { numRuns: 30 },
    );
  });
});

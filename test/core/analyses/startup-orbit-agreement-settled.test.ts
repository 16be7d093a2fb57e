// The orbit-agreement rule (a settled-looking run whose orbit lies more than 5 % from its last
// cycles is unsettled) must leave runs that have settled alone: a Wien held only by its op-amp's
// rails (the orbit is the clipped run itself) and a lamp Wien whose filament settles within the run.
import { describe, expect, test } from "vitest";
import { runStartup, runSteady, type Circuit } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { lampAmplitude } from "../../e2e/support/steady-circuits.js";

const circuitOf = (text: string): Circuit => buildCircuit(loadSource("orbit-agreement-settled.onset", text)).circuit;
const probe = { kind: "node", node: "o" } as const;
const rel = (a: number, b: number) => Math.abs(a / b - 1);

const WIEN = "resistor R1 o s 10k\ncapacitor C1 s p 16n\nresistor R2 p gnd 10k\ncapacitor C2 p gnd 16n";

describe("settled runs stay settled under the orbit-agreement rule", () => {
  test("a lamp Wien (100 Ω cold, 500 Ω hot at 12 V, tau 40 ms, Rf 300 Ω): until=auto settles on the orbit, at the lamp law's amplitude (closed form) within 1e-3", () => {
    const circuit = circuitOf(`${WIEN}\nresistor Rf o n 300\nlamp L1 n gnd 100 hot=500 rated=12 tau=40m\nopamp U1 p n o preset=general rails=(-15, 15)`);
    const run = runStartup(circuit, { kind: "startup", probe, until: "auto" });
    expect(run.verdict).toBe("settled");
    expect(run.settled.from).toBe("orbit");
    // measured: 10.52380 V against the closed form's 10.52153 V (2.2e-4: the op-amp's finite gain, the filament's ripple and the 0.035 % THD)
    expect(rel(run.amplitude!, lampAmplitude(300, 100, 500, 12))).toBeLessThan(1e-3);
    // Cross-check: the steady analysis' orbit, within the issue's 0.05 % f, 0.5 % A, 2 % THD
    const steady = runSteady(circuit, { kind: "steady", probe });
    expect(rel(run.frequency!, steady.frequency!)).toBeLessThan(5e-4);
    expect(rel(run.amplitude!, steady.amplitude!)).toBeLessThan(5e-3);
    expect(rel(run.thd!, steady.thd!)).toBeLessThan(2e-2);
  }, 60_000);

  test("a Wien held only by its rails (gain 3.2, rails ±12 V): the orbit is the clipped run itself, so it stays settled with the orbit's figures", () => {
    const circuit = circuitOf(`${WIEN}\nresistor Rf o n 22k\nresistor Rs n gnd 10k\nopamp U1 p n o preset=general rails=(-12, 12)`);
    const run = runStartup(circuit, { kind: "startup", probe, until: "auto" });
    expect(run.verdict).toBe("settled");
    expect(run.settled.from).toBe("orbit");
    // The swing is clipped at the output limit, the rail less the 1.5 V headroom (docs/language.md): 10.5 V peak; measured 10.46 V (the knee rounds it).
    expect(run.amplitude!).toBeGreaterThan(10.3);
    expect(run.amplitude!).toBeLessThan(10.5);
    // Cross-check: the steady analysis' orbit
    const steady = runSteady(circuit, { kind: "steady", probe });
    expect(rel(run.frequency!, steady.frequency!)).toBeLessThan(5e-4);
    expect(rel(run.amplitude!, steady.amplitude!)).toBeLessThan(5e-3);
    expect(rel(run.thd!, steady.thd!)).toBeLessThan(2e-2);
  }, 60_000);
});

// examples/jfet-loop-source.onset with more gain and a fast detector (Rs 3.9 kΩ, Cf 0.47 µF, bleed
// 220 kΩ) collapses twice after its first overshoots, then holds at about 4.86 V — its peaks
// alternating by 0.7 % from one cycle to the next, for as long as it runs. That is no bounce: the
// orbit of one cycle is unstable by a flip (its Floquet multiplier lies below −1), and the loop
// settles on a swing that repeats every second cycle (period doubled).
import { readFileSync } from "node:fs";
import { describe, expect, test } from "vitest";
import { runStartup, runSteady } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";

const node = (n: string) => ({ kind: "node", node: n }) as const;
const source = readFileSync(new URL("../../../examples/jfet-loop-source.onset", import.meta.url), "utf8")
  .replace("param Cf = 1uF", "param Cf = 0.47uF")
  .replace("Rs  n   d    4.3k±1%", "Rs  n   d    3.9k±1%")
  .replace("Rb  c   gnd  1M±1%", "Rb  c   gnd  220k±1%");
const circuit = buildCircuit(loadSource("jfet-loop-source.onset", source)).circuit;

describe("a JFET Wien whose loop flips: settled, period doubled", () => {
  test("until=auto: settled on the swing that repeats every second cycle, its two levels named, not bouncing", () => {
    const auto = runStartup(circuit, { kind: "startup", probe: node("o"), until: "auto" });
    // measured: settled at 0.247 s, 4.861 V, 2.004 kHz, peaks alternating 4.8443 and 4.8776 V (the rule before: bouncing at the 2.06 s bound)
    expect(auto.verdict).toBe("settled");
    expect(auto.run.until).toBeLessThan(0.5);
    expect(auto.explanation).toMatch(/the swing repeats every second cycle \(period doubled\): its peaks alternate between 4\.84\d V and 4\.87\d V/);
    // Not the unstable orbit of one cycle (below): the run's own figures.
    expect(auto.settled.from).toBe("run");
    expect(auto.warnings.map((w) => w.code)).not.toContain("not-settled-within");
    // Source: scipy 1.17 solve_ivp Radau, the orbit of two cycles by shooting on the circuit's state equations from the
    // documented device laws (test/validation/reference/jfet_flip.py 2): peaks 4.844775 and 4.877793 V, 2005.14 Hz,
    // stable (its multipliers 0.0099 ± 0.3408i); measured here 4.8443 and 4.8776 V (1e-4 off), 2004.45 Hz (3.4e-4: the run's own step error).
    const { low, high } = auto.periodDoubled!;
    expect(Math.abs(low / 4.844775 - 1)).toBeLessThan(1e-3);
    expect(Math.abs(high / 4.877793 - 1)).toBeLessThan(1e-3);
    expect(Math.abs(auto.frequency! / 2005.14 - 1)).toBeLessThan(1e-3);
  });

  test("steady finds the orbit of one cycle unstable by a flip: its largest multiplier below −1", () => {
    const steady = runSteady(circuit, { kind: "steady", probe: node("o") });
    expect(steady.stability!.verdict).toBe("unstable");
    // Source: scipy 1.17 (test/validation/reference/jfet_flip.py 1): the orbit of one cycle at 2005.146 Hz, 4.86727 V,
    // multipliers −1.2800 and −0.2627 (and the trivial 1.0000009); measured here −1.276 ± 0.005, 2005.15 Hz, 4.86728 V.
    const largest = steady.stability!.largest!;
    expect(largest.im).toBe(0);
    expect(Math.abs(largest.re - -1.28)).toBeLessThan(0.01);
    expect(Math.abs(steady.amplitude! / 4.86727 - 1)).toBeLessThan(1e-4);
  });
});

// The matrix-free shooting's Floquet multipliers (an Arnoldi run with a convergence test) against
// closed forms: a diagonal operator's eigenvalues are its entries; a linear R–C chain behind an
// ideal buffer has the modes e^{λT}, λ the eigenvalues of its tridiagonal −C⁻¹G (numpy 2 eigvalsh).
import { describe, expect, test } from "vitest";
import { runSteady } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { RITZ_TOLERANCE, ritzMultipliers } from "../../../packages/core/src/steady/ritz-multipliers.js";

/** 300 multipliers 1 − 8.2e-4·k² crowding 1 (clamped at 0), as an R–C chain's lowest modes do. */
const crowded = Float64Array.from({ length: 300 }, (_, k) => Math.max(0, 1 - 8.2e-4 * (k + 1) ** 2));
const diagonal = { n: crowded.length, apply: (v: Float64Array, _tau: number, out: Float64Array) => out.set(v.map((x, i) => x * crowded[i]!)) };
const ones = new Float64Array(crowded.length).fill(1);

describe("ritzMultipliers on a diagonal operator (closed form: the entries)", () => {
  test("with room to converge: the six largest are the six largest entries, each within its residual, and every residual is within the tolerance", () => {
    const ritz = ritzMultipliers(diagonal, ones, 200, undefined);
    expect(ritz.length).toBeGreaterThanOrEqual(6);
    for (const [k, m] of ritz.entries()) {
      expect(m.residual).toBeLessThanOrEqual(RITZ_TOLERANCE);
      // (A symmetric operator: Bauer–Fike, the residual bounds the distance to an eigenvalue; 1e-13 for rounding.)
      const nearest = Math.min(...Array.from(crowded, (c) => Math.abs(c - m.re)));
      expect(nearest).toBeLessThanOrEqual(m.residual + 1e-13);
      if (k < 6) expect(Math.abs(m.re - crowded[k]!)).toBeLessThanOrEqual(m.residual + 1e-13);
    }
  });

  test("held to 8 steps it cannot converge: only the two largest Ritz values come back, their residuals above the tolerance", () => {
    const ritz = ritzMultipliers(diagonal, ones, 8, undefined);
    expect(ritz.length).toBe(2);
    for (const m of ritz) expect(m.residual).toBeGreaterThan(RITZ_TOLERANCE);
  });
});

/** The four-section ladder oscillator of the acceptance cases, its output o buffered into `sections` R–C sections of 1 MΩ and 10 pF. */
function bufferedChain(sections: number): string {
  const lines = [
    'title "R-C ladder oscillator with a buffered R-C chain"',
    "vcvs      E1 e gnd gnd d 30",
    "resistor  Ro e o 10k",
    "capacitor Co o gnd 1n",
    "diode     D1 o gnd saturation=5n emission=1.5 series=0",
    "diode     D2 gnd o saturation=5n emission=1.5 series=0",
    "resistor  R1 o a 10k",
    "capacitor C1 a gnd 4.7n",
    "resistor  R2 a b 10k",
    "capacitor C2 b gnd 4.7n",
    "resistor  R3 b c 10k",
    "capacitor C3 c gnd 4.7n",
    "resistor  R4 c d 10k",
    "capacitor C4 d gnd 4.7n",
    "vcvs      EB x0 gnd o gnd 1",
  ];
  for (let k = 1; k <= sections; k++) lines.push(`resistor Rx${k} x${k - 1} x${k} 1M`, `capacitor Cx${k} x${k} gnd 10p`);
  lines.push("steady probe=o");
  return lines.join("\n") + "\n";
}

// numpy 2 (np.linalg.eigvalsh) of −C⁻¹G for 150 sections of 1 MΩ, 10 pF, the first grounded by
// the buffer and the last open: the six slowest modes, 1/s (the ladder's own multipliers are
// below 0.5, the chain's nearest 1 crowd the trivial one).
const CHAIN_150 = [-10.893383964988226, -98.03333586519558, -272.27527074153977, -533.5432672896911, -881.7234849057907, -1316.6642132895397];

describe("the steady analysis of an oscillator with a buffered 150-section R–C chain (matrix-free)", () => {
  test("its listed multipliers are the chain's e^{λT} (closed form, numpy), largest first, each within its bar", () => {
    const r = runSteady(buildCircuit(loadSource("chain.onset", bufferedChain(150))).circuit!, { kind: "steady", probe: { kind: "node", node: "o" } });
    expect(r.found).toBe(true);
    expect(r.shooting).toBe("matrix-free");
    const T = r.period!;
    const closed = CHAIN_150.map((l) => Math.exp(l * T));
    expect(r.multipliers.length).toBeGreaterThanOrEqual(4);
    for (let k = 0; k < 4; k++) {
      const m = r.multipliers[k]!;
      const bar = r.multiplierError![k]!;
      expect(Math.hypot(m.re - closed[k]!, m.im), `multiplier ${k}: ${m.re} ± ${bar} against ${closed[k]}`).toBeLessThanOrEqual(bar);
      // Not vacuous: a bar within a thousandth.
      expect(bar).toBeLessThan(1e-3);
    }
    expect(r.stability!.verdict).toBe("stable");
    expect(Math.abs(r.stability!.cyclesToSettle! / (Math.log(0.01) / Math.log(closed[0]!)) - 1)).toBeLessThan(1e-3);
  });
});

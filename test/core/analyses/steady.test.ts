// Issue 15: the steady analysis against closed forms. A high-Q LC tank held by an ideal clip
// oscillates at its poles' frequency; a driven circuit's orbit has the drive's period; a circuit
// whose poles decay has no orbit; a pure driven sine gives the THD floor of the integrator.
import { describe, expect, test } from "vitest";
import { runPoles, runSteady, type SteadyAnalysis } from "@onset/core";
import { circuit, part } from "../../support/circuits.js";
import { clippedTank } from "../../support/clipped-tank.js";

const probe = { kind: "node", node: "v" } as const;
const steady = (extra: Partial<SteadyAnalysis> = {}): SteadyAnalysis => ({ kind: "steady", probe, ...extra });

describe("runSteady on an LC tank held by an ideal clip (mathematics: the tank's natural frequency)", () => {
  // L = 1 mH, C = 100 nF: ω₀ = 1/√(LC) = 10⁵ rad/s. R = 100 kΩ gives Q = R·√(C/L) = 1000; the
  // clip's harmonic currents see the tank's impedance cut by about Q·(n − 1/n), so they shift
  // the frequency by a part in ~Q² (Groszkowski 1933; docs/references.md §10): the orbit runs at the poles' frequency
  // Im(s)/2π (and at ω₀/2π) to well within 1e-5.
  const parts = clippedTank(100e3, 1e-3, 100e-9, 40e3);
  const c = circuit(parts);

  test("frequency = Im(dominant pole)/2π within 1e-5; a stable orbit whose largest multiplier is inside the unit circle", () => {
    const poles = runPoles(c, { kind: "poles" });
    expect(poles.starts).toBe(true);
    const r = runSteady(c, steady());
    expect(r.shooting).toBe("dense");
    expect(r.found).toBe(true);
    expect(r.kind).toBe("autonomous");
    expect(Math.abs(r.frequency! / poles.frequency! - 1)).toBeLessThan(1e-5);
    expect(Math.abs(r.frequency! * 2 * Math.PI * Math.sqrt(1e-3 * 100e-9) - 1)).toBeLessThan(1e-5);
    expect(r.stability!.verdict).toBe("stable");
    const largest = r.multipliers[0]!;
    expect(Math.hypot(largest.re, largest.im)).toBeLessThan(1);
    // The clip holds the swing inside the tank's linear range: |v| at most A·|v| = 1 V at the amplifier.
    expect(r.amplitude!).toBeGreaterThan(1 / 3);
    expect(r.iterations![0]).toBeGreaterThan(0);
  });

  test("from=poles finds the same orbit as from=startup (the result does not depend on where the shooting starts)", () => {
    const a = runSteady(c, steady());
    const b = runSteady(c, steady({ from: "poles" }));
    expect(b.found).toBe(true);
    expect(Math.abs(b.frequency! / a.frequency! - 1)).toBeLessThan(1e-7);
    // Both orbits are of the discretised circuit on the grid each transient left: within their error bars.
    expect(Math.abs(b.amplitude! - a.amplitude!)).toBeLessThan(a.numericalError!.amplitude + b.numericalError!.amplitude);
    expect(Math.abs(b.amplitude! / a.amplitude! - 1)).toBeLessThan(1e-4);
  });

  test("with the loss above the negative conductance the poles decay: no orbit, and the poles' verdict says so", () => {
    const r = runSteady(circuit(clippedTank(100e3, 1e-3, 100e-9, 400e3)), steady());
    expect(r.found).toBe(false);
    expect(r.frequency).toBeNull();
    expect(r.multipliers).toEqual([]);
    expect(r.explanation).toMatch(/^no periodic orbit: the circuit does not oscillate — the poles' dominant pair at .* decays/);
  });
});

describe("runSteady on a driven circuit (mathematics: the steady-state phasor)", () => {
  const R = 1e3;
  const Cap = 1e-6;
  const f = 1e3;
  const rc = circuit([
    part("vsource", "V1", ["in", "gnd"], undefined, { wave: "sine", amp: 2, freq: f }),
    part("resistor", "R1", ["in", "v"], R),
    part("capacitor", "C1", ["v", "gnd"], Cap),
  ]);

  test("an RC low-pass driven at 1 kHz: the orbit has the drive's period, amplitude A/√(1 + (ωRC)²) within 1e-6, multiplier e^(−T/RC)", () => {
    const r = runSteady(rc, steady());
    expect(r.found).toBe(true);
    expect(r.kind).toBe("driven");
    expect(r.period).toBe(1 / f);
    const w = 2 * Math.PI * f * R * Cap;
    expect(Math.abs(r.harmonics[0]!.amplitude / (2 / Math.sqrt(1 + w * w)) - 1)).toBeLessThan(1e-6);
    // One state: the monodromy is the decay of the RC over one period.
    expect(r.multipliers).toHaveLength(1);
    expect(Math.abs(r.multipliers[0]!.re / Math.exp(-1 / f / (R * Cap)) - 1)).toBeLessThan(1e-4);
    expect(r.stability!.verdict).toBe("stable");
  });

  test("a pure driven sine: THD at the integrator's floor, below −120 dBc (1e-6)", () => {
    const r = runSteady(rc, steady());
    expect(r.thd!).toBeLessThan(1e-6);
  });

  test("a max-step far below the period under a small stored-points: the orbit grid merges the run's steps, says so, and keeps the phasor within its error bar", () => {
    // 1000 steps per period; stored-points 6000 bounds the grid at 256 points for 3 unknowns
    // (stored-points / (8 × unknowns), at least 256), so every 4 steps become one.
    const r = runSteady(rc, steady({ maxStep: 1e-6 }), { limits: { maxStoredPoints: 6000 } });
    expect(r.found).toBe(true);
    expect(r.points![0]).toBeLessThanOrEqual(256);
    const merged = r.warnings.filter((w) => w.code === "orbit-grid-merged");
    expect(merged.map((w) => w.message)).toEqual(["the orbit's grid merges every 4 of the run's steps: stored-points=6000 bounds its memory (raise it with --limit stored-points=N, or maxStoredPoints)"]);
    const w = 2 * Math.PI * f * R * Cap;
    expect(Math.abs(r.harmonics[0]!.amplitude - 2 / Math.sqrt(1 + w * w))).toBeLessThanOrEqual(Math.max(r.numericalError!.amplitude, 1e-6 * r.amplitude!));
    expect(runSteady(rc, steady({ maxStep: 1e-6 })).warnings.filter((x) => x.code === "orbit-grid-merged")).toEqual([]);
  });
});

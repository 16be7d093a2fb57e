import { describe, expect, test } from "vitest";
import { runSteady, type Circuit } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";
import { paint } from "../../../packages/cli/src/color.js";
import { steadyReport } from "../../../packages/cli/src/report/steady.js";

const reportOf = (text: string) => {
  const circuit: Circuit = elaborate(loadProgram("report.onset", text).program, {}).circuit!;
  return steadyReport(runSteady(circuit, { kind: "steady", probe: { kind: "node", node: "o" } }), paint(false));
};

describe("steadyReport(result, paint)", () => {
  test("a driven orbit whose only multiplier is below 1e-10 (a rectifier's capacitor, clamped at every peak): no trivial multiplier named, and the empty list read as disturbances dying within a period, not 'one state'", () => {
    const lines = reportOf("vsource V1 in gnd wave=sine amp=9 freq=60\ndiode D1 in o\ncapacitor C1 o gnd 47u\nresistor RL o gnd 1.5k\n");
    const heading = lines.find((l) => l.includes("Floquet multipliers"))!;
    expect(heading).not.toContain("trivial");
    expect(lines.find((l) => l.trim().startsWith("multipliers"))).toContain("none above 1e-10");
  });

  test("an autonomous orbit's heading says its trivial multiplier is left out", () => {
    const lines = reportOf("inductor L1 o gnd 3.3m series=0.8\ncapacitor C1 o gnd 68n\nresistor Rl o gnd 12k\nvccs G1 gnd o o gnd 150u\ndiode D1 o k\nresistor Rk k gnd 2.2k\ndiode D2 k2 o\nresistor Rk2 k2 gnd 2.2k\n");
    expect(lines.find((l) => l.includes("Floquet multipliers"))).toContain("the trivial one left out");
  });

  test("a Ritz multiplier whose residual is above the Arnoldi run's tolerance gets a 'not converged' line; one within it does not", () => {
    const circuit: Circuit = elaborate(loadProgram("report.onset", "inductor L1 o gnd 3.3m series=0.8\ncapacitor C1 o gnd 68n\nresistor Rl o gnd 12k\nvccs G1 gnd o o gnd 150u\ndiode D1 o k\nresistor Rk k gnd 2.2k\ndiode D2 k2 o\nresistor Rk2 k2 gnd 2.2k\n").program, {}).circuit!;
    const r = runSteady(circuit, { kind: "steady", probe: { kind: "node", node: "o" } });
    const withResidual = (residual: number) => steadyReport({ ...r, multipliers: r.multipliers.map((m) => ({ ...m, residual })) }, paint(false));
    expect(withResidual(1e-3).some((l) => l.trim().startsWith("not converged"))).toBe(true);
    expect(withResidual(1e-12).some((l) => l.trim().startsWith("not converged"))).toBe(false);
  });

  test("without an orbit the 'tried:' line names the transient run only: whether a shooting ran, and why it failed, is the explanation's", () => {
    // An LC tank undamped by a transconductor with nothing to limit it: its swing never levels off.
    const lines = reportOf("inductor L1 o gnd 47m\ncapacitor C1 o gnd 220n\nresistor Rl o gnd 10k\nvccs G1 gnd o o gnd 150u\n");
    expect(lines[0]).toContain("no orbit");
    const tried = lines.find((l) => l.trim().startsWith("tried:"))!;
    expect(tried).toMatch(/^ {2}tried: the growing mode, \d+ periods of transient \([^)]*\)$/);
  });

  test("a driven circuit without an orbit: the 'tried:' line names the transient from the bias point, not a hard start's kick", () => {
    // Two tones in no ratio of whole numbers have no common period: a driven answer without an
    // orbit, here as one whose transient ran 48 periods before its shootings failed (a driven
    // answer counts them since acceptance pass 9, and the line then read "a large kick in the
    // decaying pair's mode (a hard start)").
    const circuit: Circuit = elaborate(loadProgram("report.onset", "vsource V1 s m wave=sine amp=1 freq=1k\nvsource V2 m gnd wave=sine amp=1 freq=1414.2135623\nresistor R1 s o 1k\ncapacitor C1 o gnd 100n\n").program, {}).circuit!;
    const none = runSteady(circuit, { kind: "steady", probe: { kind: "node", node: "o" } });
    expect(none).toMatchObject({ found: false, from: "driven" });
    const lines = steadyReport({ ...none, transient: { ...none.transient, periods: 48, until: 0.024 } }, paint(false));
    const tried = lines.find((l) => l.trim().startsWith("tried:"))!;
    expect(tried).toMatch(/^ {2}tried: 48 periods of transient \([^)]*\) from the bias point$/);
  });
});

import { describe, expect, test } from "vitest";
import { isOnsetError, runBias, runTransient, type Circuit } from "@onset/core";
import { buildSystem, NewtonSolver, pencilPoles, resolveTolerances, solveBias } from "@onset/core/engine";
import { circuit, part } from "../../support/circuits.js";

/** The diagnostic an engine call throws (code, message, hint), or a failure when it returns. */
function diagnosticOf(run: () => unknown) {
  try {
    run();
  } catch (error) {
    if (!isOnsetError(error)) throw error;
    const { code, message, hint, stage } = error.diagnostic;
    return { code, message, hint, stage };
  }
  throw new Error("expected the call to fail");
}

// A diode clamp driven hard: Newton has real work at the bias point and in every step.
const clamp: Circuit = circuit([
  part("vsource", "V1", ["in", "gnd"], undefined, { wave: "sine", amp: 5, freq: 1e3 }),
  part("resistor", "R1", ["in", "a"], 1e3),
  part("diode", "D1", ["a", "gnd"]),
  part("capacitor", "C1", ["a", "gnd"], 100e-9),
]);
const transient = { kind: "transient", until: 1e-3, start: "rest", probes: [] } as const;

describe("the simulator's failure paths, message by message", () => {
  test("newton-not-converged: the step shrinks below its floor while Newton cannot meet a zero tolerance", () => {
    const d = diagnosticOf(() => runTransient(clamp, transient, { tolerances: { newtonRelative: 0, newtonVoltage: 0, newtonCurrent: 0 } }));
    expect(d).toEqual({
      code: "newton-not-converged",
      stage: "simulation",
      message: "Newton did not converge at t = 0 s after 1 iterations (largest change at 'in'); the step fell below 1.0e-17 s",
      hint: "the circuit may have a discontinuity the model cannot follow; check the parts at that node, or soften limits (op-amp knee=)",
    });
  });

  test("step-too-small: no step is short enough to meet a zero truncation-error tolerance", () => {
    const d = diagnosticOf(() => runTransient(clamp, transient, { tolerances: { lteRelative: 0, lteVoltage: 0, lteCurrent: 0, newtonRelative: 1e-5, newtonVoltage: 1e-9, newtonCurrent: 1e-12 } }));
    expect(d).toEqual({
      code: "step-too-small",
      stage: "simulation",
      message: "the time step fell below 1.0e-17 s at t = 0 s to meet the error tolerance",
      hint: "a very fast edge or a stiff loop; relax the tolerance or smooth the source edges",
    });
  });

  test("bias-not-converged: one iteration per attempt is not enough for any rung of the ladder", () => {
    const forward = circuit([part("vsource", "V1", ["in", "gnd"], 5), part("resistor", "R1", ["in", "a"], 1e3), part("diode", "D1", ["a", "gnd"])]);
    const d = diagnosticOf(() => runBias(forward, { kind: "bias" }, { tolerances: { biasIterations: 1 } }));
    expect(d).toEqual({
      code: "bias-not-converged",
      stage: "simulation",
      message: "the bias point did not converge after 9 Newton iterations (largest change at 'in')",
      hint: "plain Newton, gmin stepping and source stepping all failed; check for a latch-up loop or values many decades apart near that node",
    });
  });

  test("singular-matrix: two ideal sources in parallel fix one node twice", () => {
    const parallel = circuit([part("vsource", "V1", ["a", "gnd"], 1), part("vsource", "V2", ["a", "gnd"], 2), part("resistor", "R1", ["a", "gnd"], 1e3)]);
    const system = buildSystem(parallel);
    const d = diagnosticOf(() => solveBias(system, new NewtonSolver(system, resolveTolerances())));
    expect(d).toEqual({
      code: "singular-matrix",
      stage: "simulation",
      message: "the circuit equations are singular at unknown 'V2.i'",
      hint: "a node may be floating, or ideal sources/inductors may form a loop; check the parts at that node",
    });
  });

  test("singular-pencil: a linearised circuit with no conductance and no capacitance has no natural frequencies", () => {
    const d = diagnosticOf(() => pencilPoles({ n: 2, G: new Float64Array(4), C: new Float64Array(4) }));
    expect(d).toEqual({ code: "singular-pencil", stage: "simulation", message: "the linearised circuit is singular at every frequency tried", hint: undefined });
  });
});

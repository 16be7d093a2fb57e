import { describe, expect, test } from "vitest";
import { linearPrediction } from "../../../packages/core/src/analyses/startup.js";

describe("linearPrediction(ss): the start-up's prediction at the bias point", () => {
  test("an RC node has its one real pole at −1/(RC) and no dominant pair", () => {
    // closed form: C·dv/dt + v/R = 0 decays as e^(−t/RC)
    const R = 1e3;
    const C = 1e-6;
    const p = linearPrediction({ n: 1, G: Float64Array.of(1 / R), C: Float64Array.of(C) });
    expect(p.ok).toBe(true);
    expect(p.poles).toHaveLength(1);
    expect(p.poles[0]!.real).toBeCloseTo(-1 / (R * C), 9);
    expect(p.pole).toBeNull();
  });

  test("a pencil singular at every frequency (singular-pencil) gives no prediction, and the run may go on", () => {
    expect(linearPrediction({ n: 2, G: new Float64Array(4), C: new Float64Array(4) })).toEqual({ poles: [], pole: null, ok: false });
  });

  test("any other error is not taken for a missing prediction: it propagates", () => {
    expect(() => linearPrediction({ n: -1, G: new Float64Array(0), C: new Float64Array(0) })).toThrow(RangeError);
  });
});

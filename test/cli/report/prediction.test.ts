import { describe, expect, test } from "vitest";
import { predictedStartupTime } from "../../../packages/cli/src/report/prediction.js";

describe("predictedStartupTime(amplitude, kick, growthRate)", () => {
  test("is the time for e^(σt) to grow from the kick response to 0.9 of the amplitude", () => {
    // Mathematics: k·e^(σt) = 0.9·A  ⇔  t = ln(0.9·A/k)/σ.
    const t = predictedStartupTime(2, 1e-9, 500)!;
    expect(1e-9 * Math.exp(500 * t)).toBeCloseTo(1.8, 9);
  });

  test("is absent when the circuit does not grow or nothing is known", () => {
    expect(predictedStartupTime(2, 1e-9, -10)).toBeNull();
    expect(predictedStartupTime(2, 1e-9, 0)).toBeNull();
    expect(predictedStartupTime(null, 1e-9, 500)).toBeNull();
    expect(predictedStartupTime(2, null, 500)).toBeNull();
  });
});

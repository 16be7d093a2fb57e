import { describe, expect, test } from "vitest";
import { heldDrives } from "../../../packages/core/src/steady/held-drives.js";
import { circuit, part } from "../../support/circuits.js";

describe("heldDrives (closed form: a wave's mean over one period)", () => {
  test("a sine is held at its offset, a trapezoidal train at low + (high − low)·(width + (rise + fall)/2)/period; DC parts are untouched", () => {
    const c = circuit([
      part("vsource", "V1", ["a", "gnd"], undefined, { wave: "sine", amp: 2, freq: 1e3, offset: 0.5 }),
      part("vsource", "V2", ["b", "gnd"], undefined, { wave: "pulse", low: -1, high: 3, rise: 1e-4, fall: 3e-4, width: 2e-4, period: 1e-3 }),
      part("vsource", "V3", ["c", "gnd"], 5),
      part("resistor", "R1", ["a", "b"], 1e3),
    ]);
    const held = heldDrives(c);
    const value = (name: string) => held.parts.find((p) => p.name === name)!;
    expect(value("V1").value).toBe(0.5);
    expect(value("V1").options).toEqual({});
    // −1 + 4 · (0.2 ms + 0.2 ms)/1 ms = 0.6
    expect(value("V2").value).toBeCloseTo(0.6, 12);
    expect(value("V3")).toBe(c.parts.find((p) => p.name === "V3"));
  });

  test("a circuit without a periodic source comes back as the same object", () => {
    const c = circuit([part("vsource", "V1", ["a", "gnd"], 1), part("resistor", "R1", ["a", "gnd"], 1e3)]);
    expect(heldDrives(c)).toBe(c);
  });
});

// A settled-looking run next to which the shooting finds no orbit: the JFET Wien whose detector
// charges through 22 kΩ into 5.5 µF swings clipped at the rails (level from cycle to cycle) while
// the detector still charges, and the shooting from there does not converge. The run's own state
// then says it has not settled.
import { describe, expect, test } from "vitest";
import { runStartup } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { detectorWienSource } from "../../support/jfet-detector-wien.js";

const wien = buildCircuit(
  loadSource("rail-clipped-detector-wien.onset", detectorWienSource({ R: "10k", C: "10n", Rf: "10k", Rs: "3.9k", idss: "8m", pinchoff: "-2.5", Rgate: "470k", Rk: "22k", Cf: "5.5u", Rb: "1M", rail: "15" })),
).circuit;
const probe = { kind: "node", node: "o" } as const;

describe("a settled-looking run with no orbit found next to it", () => {
  test("a fixed until= that ends while the swing is clipped and the detector charges: unsettled, naming the detector's drift per period", () => {
    const r = runStartup(wien, { kind: "startup", probe, until: 0.124 });
    // measured: the last cycles at 13.40 V (the rails), the detector c moving 0.39 % per period; before: "settled at 13.4 V"
    expect(r.settled.note).toMatch(/no periodic orbit was found next to it/);
    expect(r.verdict).toBe("unsettled");
    expect(r.settlingTime).toBeNull();
    expect(r.explanation).toMatch(/^the envelope held steady, but the charged state c still moves by 0\.\d+ % of its size per period and no periodic orbit was found next to the run: .* raise until= /);
  });

  test("until=auto runs on and ends as a 2 s run does: the loop bounces (cross-check)", () => {
    expect(runStartup(wien, { kind: "startup", probe, until: 2 }).verdict).toBe("bouncing");
    expect(runStartup(wien, { kind: "startup", probe, until: "auto" }).verdict).toBe("bouncing");
  });
});

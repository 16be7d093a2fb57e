// A settled-looking run whose own last cycles are not the orbit: the JFET Wien whose detector
// charges through 22 kΩ into 5.5 µF swings clipped at the rails (level from cycle to cycle) while
// the detector still charges. The shooting from there once did not converge within 25 periods
// (the run's own drifting state then said it had not settled); given up to 100 periods while it
// still closes in, it finds the orbit next to the run, at less than half the clipped swing, which
// says the same: the run has not settled.
import { describe, expect, test } from "vitest";
import { runStartup } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { detectorWienSource } from "../../support/jfet-detector-wien.js";

const wien = buildCircuit(
  loadSource("rail-clipped-detector-wien.onset", detectorWienSource({ R: "10k", C: "10n", Rf: "10k", Rs: "3.9k", idss: "8m", pinchoff: "-2.5", Rgate: "470k", Rk: "22k", Cf: "5.5u", Rb: "1M", rail: "15" })),
).circuit;
const probe = { kind: "node", node: "o" } as const;

describe("a settled-looking run whose last cycles are not the orbit next to them", () => {
  test("a fixed until= that ends while the swing is clipped and the detector charges: unsettled, naming the orbit next to the run", () => {
    const r = runStartup(wien, { kind: "startup", probe, until: 0.124 });
    // measured: the last cycles at 13.40 V (the rails), the orbit next to them 6.101 V; before the drift check: "settled at 13.4 V"
    expect(r.settled.note).toMatch(/the periodic orbit next to them swings 6\.\d+ V peak, 5\d\.\d % from the last cycles' 13\.4 V/);
    expect(r.verdict).toBe("unsettled");
    expect(r.settlingTime).toBeNull();
    expect(r.explanation).toMatch(/^the envelope held steady, but the periodic orbit next to the run swings .*: the circuit has not settled .* raise until= /);
  });

  test("until=auto runs on and ends as a 2 s run does: the loop bounces (cross-check)", () => {
    expect(runStartup(wien, { kind: "startup", probe, until: 2 }).verdict).toBe("bouncing");
    expect(runStartup(wien, { kind: "startup", probe, until: "auto" }).verdict).toBe("bouncing");
  });
});

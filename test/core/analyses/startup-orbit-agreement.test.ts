// A start-up run whose envelope holds still while the circuit has not settled: a JFET Wien whose
// peak detector charges through 22 kΩ into 4.7 µF swings at the rails (clipped, so level from
// cycle to cycle) while the detector still charges. The periodic orbit found next to such a run
// is far from its last cycles; the run must not report that orbit as where it settled.
import { describe, expect, test } from "vitest";
import { runStartup } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { detectorWienSource } from "../../support/jfet-detector-wien.js";

const wien = buildCircuit(
  loadSource("rail-clipped-detector-wien.onset", detectorWienSource({ R: "10k", C: "10n", Rf: "10k", Rs: "3.9k", idss: "8m", pinchoff: "-2.5", Rgate: "470k", Rk: "22k", Cf: "4.7u", Rb: "1M", rail: "15" })),
).circuit;
const probe = { kind: "node", node: "o" } as const;

describe("a settled-looking run far from the orbit next to it", () => {
  test("a fixed until= that ends while the swing is clipped: unsettled, the run's own figures, and the orbit's distance named", () => {
    const r = runStartup(wien, { kind: "startup", probe, until: 0.124 });
    // measured: the last cycles 13.40 V peak (the rails), the orbit next to them 6.101 V (before: "settled at 6.101 V")
    expect(r.verdict).toBe("unsettled");
    expect(r.settlingTime).toBeNull();
    expect(r.settled.from).toBe("run");
    expect(r.amplitude!).toBeGreaterThan(13);
    expect(r.explanation).toMatch(/^the envelope held steady, but the periodic orbit next to the run swings 6\.1\d* V peak, 5\d(\.\d+)? % from the last cycles' 13\.\d+ V: the circuit has not settled .* raise until= to see where it goes/);
  });

  test("until=auto runs on past the level clipped swing and finds what a long run finds: the loop bounces", () => {
    const auto = runStartup(wien, { kind: "startup", probe, until: "auto" });
    // Cross-check: the same circuit run to a fixed 2 s says bouncing (measured: 21 collapses and restarts); before, until=auto stopped at 0.124 s "settled at 6.101 V"
    const long = runStartup(wien, { kind: "startup", probe, until: 2 });
    expect(long.verdict).toBe("bouncing");
    expect(auto.verdict).toBe("bouncing");
    expect(auto.run.until).toBeGreaterThan(0.5);
  });
});

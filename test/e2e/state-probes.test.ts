import { readFileSync } from "node:fs";
import { afterAll, describe, expect, test } from "vitest";
import { Workspace } from "./support/onset.js";

const ws = new Workspace();
afterAll(() => ws.remove());

// A diode-clipped follower: the op-amp's pole node and the diode's junction behind its series
// resistance are internal states of the MNA vector.
const FOLLOWER = `title "Clipped follower"
vsource  V1 in gnd wave=sine amp=3 freq=1k
resistor R1 in a 1k
diode    D1 a gnd series=100
opamp    U1 a o o
resistor RL o gnd 10k
transient until=2m probes=(o, U1.pole, D1.junction, (a, D1.junction), V1.i)
`;

describe("probing internal states", () => {
  test("U1.pole and D1.junction are recorded, with units, in the JSON, the CSV and the plot", async () => {
    ws.write("follower.onset", FOLLOWER);
    const r = await ws.run(["run", "follower.onset", "--json", "--csv", "follower.csv", "--svg", "follower.svg"]);
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout) as { results: { probes: { name: string; unit: string; max: number; min: number }[] }[] };
    const probes = doc.results[0]!.probes;
    expect(probes.map((p) => [p.name, p.unit])).toEqual([
      ["o", "V"],
      ["U1.pole", "V"],
      ["D1.junction", "V"],
      ["a-D1.junction", "V"],
      ["V1.i", "A"],
    ]);
    const junction = probes[2]!;
    // The junction clamps near a diode drop while the input swings ±3 V through 1 kΩ.
    expect(junction.max).toBeGreaterThan(0.4);
    expect(junction.max).toBeLessThan(0.8);
    // Across the 100 Ω series resistance: (3 V − 0.6 V)·100/1100 at most, about 0.2 V.
    expect(probes[3]!.max).toBeGreaterThan(0.05);
    expect(probes[3]!.max).toBeLessThan(0.3);
    const header = readFileSync(ws.path("follower.csv"), "utf8").split("\n")[0];
    expect(header).toBe("time (s),o (V),U1.pole (V),D1.junction (V),a-D1.junction (V),V1.i (A)");
    expect(readFileSync(ws.path("follower.svg"), "utf8")).toContain("U1.pole");
  });
});

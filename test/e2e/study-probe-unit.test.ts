// A study measured on a probe that is not a voltage (a lamp's temperature) gives the samples'
// swing in that probe's unit: kelvin, not volts (SI base units, docs/language.md).
import { afterAll, describe, expect, test } from "vitest";
import { Workspace } from "./support/onset.js";

const ws = new Workspace();
afterAll(() => ws.remove());

const lampStudy = `param R = 3.3k±1% each
param C = 47n±2% each
resistor  R1 o s   (R)
capacitor C1 s p   (C)
resistor  R2 p gnd (R)
capacitor C2 p gnd (C)
resistor  Rf o n   680±1%
lamp      L1 n gnd 180 hot=800 rated=6 tau=60m
opamp     U1 p n o preset=general rails=(-15, 15)
steady probe=L1.temperature
tolerance runs=3 seed=7 measure=steady
`;

describe("a study on a temperature probe", () => {
  test("the report gives amplitude and offset in K, the JSON says probeUnit K", async () => {
    ws.write("lamp-study.onset", lampStudy);
    const text = await ws.run(["run", "lamp-study.onset"]);
    expect(text.status, text.stderr).toBe(0);
    expect(text.stdout).toMatch(/^ {2}amplitude +[\d.]+ mK/m);
    expect(text.stdout).toMatch(/^ {2}offset +[\d.]+ K/m);
    expect(text.stdout).not.toMatch(/amplitude [\d.]+ m?V/);
    const json = await ws.run(["run", "lamp-study.onset", "--json"]);
    const [study] = (JSON.parse(json.stdout) as { results: { analysis: string; probeUnit: string; samples: { metrics: { offset: number } }[] }[] }).results.filter((r) => r.analysis === "tolerance");
    expect(study!.probeUnit).toBe("K");
    // The lamp settles near 510 K (its thermal balance at R_lamp = Rf/2; closed form in docs/language.md's lamp law).
    expect(study!.samples[0]!.metrics.offset).toBeGreaterThan(450);
  }, 60_000);
});

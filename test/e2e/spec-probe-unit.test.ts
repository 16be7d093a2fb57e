// A spec checked on a probe that is not a voltage (a current through a part, a lamp's
// temperature) prints its criteria's measured swing in that probe's unit: the report, the JSON,
// the HTML page and the plots' limits (SI base units, docs/language.md).
import { readFileSync } from "node:fs";
import { afterAll, describe, expect, test } from "vitest";
import { Workspace } from "./support/onset.js";

const ws = new Workspace();
afterAll(() => ws.remove());

const lampWien = (params: string, analyses: string) => `${params}
resistor  R1 o s   (R)
capacitor C1 s p   47n
resistor  R2 p gnd (R)
capacitor C2 p gnd 47n
resistor  Rf o n   680
lamp      L1 n gnd 180 hot=800 rated=6 tau=60m
opamp     U1 p n o preset=general rails=(-15, 15)
${analyses}`;

interface Criterion {
  readonly metric: string;
  readonly measured: number;
  readonly unit: string;
}

describe("a spec on a current probe", () => {
  test("the report, the JSON and the HTML page give the amplitude and rms criteria in A", async () => {
    ws.write("current.onset", lampWien("param R = 3.3k", "startup probe=Rf.i until=1\npoles\nspec frequency=1k±5% amplitude=1m..100m rms=1m..100m\n"));
    const text = await ws.run(["run", "current.onset", "--html", "current.html"]);
    expect(text.status, text.stderr).toBe(0);
    expect(text.stdout).toMatch(/^ {2}amplitude=1m\.\.100m +[\d.]+ mA +pass$/m);
    expect(text.stdout).toMatch(/^ {2}rms=1m\.\.100m +[\d.]+ mA +pass$/m);
    expect(text.stdout).toMatch(/settled at [\d.]+ mA peak/);
    expect(text.stdout).not.toMatch(/[\d.] [mµn]?V\b/);
    const html = readFileSync(ws.path("current.html"), "utf8");
    expect(html).toMatch(/<td>amplitude=1m\.\.100m<\/td><td class="num">[\d.]+ mA</);
    expect(html).toMatch(/growth from [\d.]+ nA peak of noise/);
    const json = await ws.run(["run", "current.onset", "--json"]);
    const doc = JSON.parse(json.stdout) as { spec: { criteria: Criterion[] } };
    expect(doc.spec.criteria.map((c) => [c.metric, c.unit])).toEqual([
      ["frequency", "Hz"],
      ["amplitude", "A"],
      ["rms", "A"],
    ]);
    // The measured value is the current: at balance the bridge's gain is 3, so n follows o/3 and
    // Rf carries (2/3)·Vo/Rf (closed form of the Wien bridge; Vo from the same run probed at o).
    ws.write("voltage.onset", lampWien("param R = 3.3k", "startup probe=o until=1\nspec amplitude=1..100\n"));
    const volts = JSON.parse((await ws.run(["run", "voltage.onset", "--json"])).stdout) as { spec: { criteria: Criterion[] } };
    expect(volts.spec.criteria[0]!.unit).toBe("V");
    expect(doc.spec.criteria[1]!.measured / ((2 / 3) * (volts.spec.criteria[0]!.measured / 680))).toBeCloseTo(1, 2);
  }, 60_000);
});

describe("a spec on a lamp's temperature", () => {
  test("a sweep under measure=steady gives each setting's criteria in K", async () => {
    ws.write("sweep.onset", lampWien("param R = 3.3k", "steady probe=L1.temperature\nsweep Rf from=660 to=700 steps=2 measure=steady\nspec amplitude=1m..1\n"));
    const json = await ws.run(["run", "sweep.onset", "--json"]);
    expect(json.status, json.stderr).toBe(0);
    const [sweep] = (JSON.parse(json.stdout) as { results: { points: { spec: { criteria: Criterion[] } }[] }[] }).results;
    for (const point of sweep!.points) expect(point.spec.criteria.map((c) => c.unit)).toEqual(["K"]);
  }, 60_000);

  test("a tolerance study's histogram labels its amplitude limits in K", async () => {
    ws.write("study.onset", lampWien("param R = 3.3k±1% each", "steady probe=L1.temperature\ntolerance runs=3 seed=7 measure=steady\nspec amplitude=1m..1\n"));
    const r = await ws.run(["run", "study.onset", "--svg", "study.svg", "--quiet"]);
    expect(r.status, r.stderr).toBe(0);
    const labels = [...readFileSync(ws.path("study.svg"), "utf8").matchAll(/allowed [^<]*/g)].map((m) => m[0]);
    expect(labels).toEqual(["allowed 1 mK", "allowed 1 K"]);
  }, 60_000);
});

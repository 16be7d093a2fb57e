import { readFileSync, readdirSync } from "node:fs";
import { afterAll, describe, expect, test } from "vitest";
import { parseSvg, type SvgNode } from "../cli/plot/svg-tree.js";
import { RC_STEP, Workspace, wien } from "./support/onset.js";

const ws = new Workspace();
afterAll(() => ws.remove());

function rows(csv: string): { header: string[]; data: number[][] } {
  const [head, ...lines] = csv.trimEnd().split("\n");
  return { header: head!.split(","), data: lines.map((l) => l.split(",").map(Number)) };
}

function texts(node: SvgNode): string[] {
  return [node.text, ...node.children.flatMap(texts)].filter((t) => t.trim() !== "");
}

describe("onset run --csv", () => {
  test("an RC step from rest: time, then one column per probe, against v = V(1 − e^(−t/RC))", async () => {
    ws.write("rc.onset", RC_STEP);
    const r = await ws.run(["run", "rc.onset", "--csv", "rc.csv"]);
    expect(r.status).toBe(0);
    const { header, data } = rows(readFileSync(ws.path("rc.csv"), "utf8"));
    expect(header).toEqual(["time (s)", "o (V)", "R1.i (A)"]);
    expect(data.length).toBeGreaterThan(400);
    expect(data[0]![0]).toBe(0);
    expect(data[data.length - 1]![0]).toBeCloseTo(5e-3, 12);
    // Step response of a first-order RC circuit (Nilsson & Riedel, Electric Circuits, ch. 7):
    // v(t) = V(1 − e^(−t/τ)), τ = RC = 1 ms; the current is (V − v)/R.
    const tau = 10e3 * 100e-9;
    for (const [t, v, i] of data) {
      const expected = 5 * (1 - Math.exp(-t! / tau));
      expect(Math.abs(v! - expected)).toBeLessThan(5e-4);
      expect(Math.abs(i! - (5 - expected) / 10e3)).toBeLessThan(5e-8);
    }
  });

  test("several analyses write FILE, then FILE-2: a start-up CSV holds time and its probe", async () => {
    ws.write("two.onset", `${RC_STEP}transient until=1m probes=(o)\n`);
    expect((await ws.run(["run", "two.onset", "--csv", "out.csv", "--quiet"])).status).toBe(0);
    expect(rows(readFileSync(ws.path("out.csv"), "utf8")).header).toEqual(["time (s)", "o (V)", "R1.i (A)"]);
    expect(rows(readFileSync(ws.path("out-2.csv"), "utf8")).header).toEqual(["time (s)", "o (V)"]);
    ws.write("osc.onset", wien("startup probe=(o, n) until=20m\n"));
    expect((await ws.run(["run", "osc.onset", "--csv", "osc.csv", "--quiet"])).status).toBe(0);
    expect(rows(readFileSync(ws.path("osc.csv"), "utf8")).header).toEqual(["time (s)", "o-n (V)"]);
  });

  test("no temporary files are left beside the written ones", () => {
    expect(readdirSync(ws.dir).filter((f) => f.endsWith(".tmp"))).toEqual([]);
  });
});

describe("onset run --svg", () => {
  test("a transient plot is well-formed SVG with labelled axes and a legend of the probes", async () => {
    ws.write("rc.onset", RC_STEP);
    expect((await ws.run(["run", "rc.onset", "--svg", "rc.svg"])).status).toBe(0);
    const svg = parseSvg(readFileSync(ws.path("rc.svg"), "utf8"));
    expect(svg.name).toBe("svg");
    const words = texts(svg).join("\n");
    expect(words).toContain("RC charge");
    expect(words).toMatch(/time/);
    expect(words).toMatch(/ms/);
    expect(words).toContain("R1.i");
  });

  test("a start-up plot with its spectrum panel parses, with the start-up and settling markers", async () => {
    ws.write("osc.onset", wien("startup probe=o until=40m\n"));
    expect((await ws.run(["run", "osc.onset", "--svg", "osc.svg"])).status).toBe(0);
    const words = texts(parseSvg(readFileSync(ws.path("osc.svg"), "utf8"))).join("\n");
    expect(words).toMatch(/start-up \d/);
    expect(words).toMatch(/settled \d/);
    expect(words).toMatch(/spectrum/);
  });
});

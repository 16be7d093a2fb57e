import { readFileSync } from "node:fs";
import { afterAll, describe, expect, test } from "vitest";
import { LAMP_WIEN } from "./support/steady-circuits.js";
import { Workspace } from "./support/onset.js";

const ws = new Workspace();
afterAll(() => ws.remove());

describe("a start-up judged at another node than its probe", () => {
  test("the report prints where it was judged, JSON names it in judgedAt, and the plot draws the probe", async () => {
    ws.write("lamp.onset", `${LAMP_WIEN}startup probe=L1.temperature until=auto\n`);
    const text = await ws.run(["run", "lamp.onset", "--svg", "lamp.svg"]);
    expect(text.status).toBe(0);
    expect(text.stdout).toContain("start-up on L1.temperature: settled");
    expect(text.stdout).toContain("  judged at: node o, where the oscillation swings most (verdict, start-up and settling times); the figures are the probe's");
    expect(readFileSync(ws.path("lamp.svg"), "utf8")).toContain("L1.temperature");
    const json = await ws.run(["run", "lamp.onset", "--json"]);
    const result = (JSON.parse(json.stdout) as { results: Record<string, unknown>[] }).results[0]!;
    expect([result.probe, result.unit, result.judgedAt, result.verdict]).toEqual(["L1.temperature", "K", "o", "settled"]);
  });

  test("a probe on the judged node itself has no judgedAt and no such line", async () => {
    ws.write("out.onset", `${LAMP_WIEN}startup probe=o until=auto\n`);
    const json = await ws.run(["run", "out.onset", "--json"]);
    const result = (JSON.parse(json.stdout) as { results: Record<string, unknown>[] }).results[0]!;
    expect("judgedAt" in result).toBe(false);
    const text = await ws.run(["run", "out.onset"]);
    expect(text.stdout).not.toContain("judged at:");
  });
});

import { afterAll, describe, expect, test } from "vitest";
import { Workspace, wien } from "./support/onset.js";

const ws = new Workspace();
afterAll(() => ws.remove());

describe("settled figures with their error bars", () => {
  test("the JSON carries numericalError, thdOrders and where the figures come from; the text prints value ± bar", async () => {
    ws.write("osc.onset", wien("startup probe=o until=auto\n"));
    const json = await ws.run(["run", "osc.onset", "--json"]);
    expect(json.status).toBe(0);
    const startup = (JSON.parse(json.stdout) as { results: Record<string, unknown>[] }).results[0]!;
    expect(startup.thdOrders).toEqual([2, 30]);
    expect(startup.settled).toMatchObject({ from: "orbit", note: null });
    const e = startup.numericalError as Record<string, number>;
    for (const key of ["frequency", "amplitude", "rms", "thd"]) expect(e[key]).toBeGreaterThan(0);
    expect(e.frequency! / (startup.frequency as number)).toBeLessThan(2e-4);
    const text = await ws.run(["run", "osc.onset"]);
    expect(text.stdout).toMatch(/frequency\s+\d[\d.]* k?Hz ± \d[\d.]* k?Hz/);
    expect(text.stdout).toMatch(/THD \(2–30\)\s+\d[\d.]* % ± \d[\d.]* %/);
    expect(text.stdout).toContain("settled figures: the periodic orbit next to the run");
  });

  test("--set startup.harmonics=10 and startup.accuracy=1e-5 reach the analysis", async () => {
    ws.write("osc.onset", wien("startup probe=o until=auto\n"));
    const r = await ws.run(["run", "osc.onset", "--json", "--set", "startup.harmonics=10", "--set", "startup.accuracy=1e-5"]);
    expect(r.status).toBe(0);
    const startup = (JSON.parse(r.stdout) as { results: Record<string, unknown>[] }).results[0]!;
    expect(startup.thdOrders).toEqual([2, 10]);
    // A tighter accuracy takes more steps.
    const loose = JSON.parse((await ws.run(["run", "osc.onset", "--json"])).stdout) as { results: { solver: { accepted: number } }[] };
    expect((startup.solver as { accepted: number }).accepted).toBeGreaterThan(loose.results[0]!.solver.accepted);
  });
});

import { afterAll, describe, expect, test } from "vitest";
import { DIVIDER, Workspace, wien } from "./support/onset.js";

const ws = new Workspace();
afterAll(() => ws.remove());

// The exit statuses of the command-line contract (circuit-language.md, "Command line").
describe("onset run exit status", () => {
  const spec = wien("startup probe=o until=40m\nspec frequency=1.55k±5% amplitude=10..16\n");

  test("0 when the run is done and every spec criterion is met", async () => {
    ws.write("spec.onset", spec);
    const r = await ws.run(["run", "spec.onset"]);
    expect(r.stderr).toBe("");
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/spec met: 2 of 2 criteria pass/);
  });

  test("0 for a file without a spec", async () => {
    ws.write("divider.onset", DIVIDER);
    expect((await ws.run(["run", "divider.onset"])).status).toBe(0);
  });

  // A Wien bridge passes 1/3 at f₀, so the loop needs an amplifier gain of 3 (Sedra & Smith,
  // Microelectronic Circuits, the Wien-bridge oscillator): 1 + 18k/10k = 2.8 does not start.
  test("1 when a criterion fails: at a gain of 2.8 the oscillator stays silent", async () => {
    ws.write("spec.onset", spec);
    const r = await ws.run(["run", "spec.onset", "--set", "Rf=18k"]);
    expect(r.status).toBe(1);
    expect(r.stdout).toMatch(/start-up on o: silent/);
    expect(r.stdout).toMatch(/spec NOT met: 0 of 2 criteria pass/);
  });

  test("2 for a bad file, a missing file, an unknown option, an unknown command and a bad --set", async () => {
    ws.write("zero.onset", "resistor R1 a 0 1k\nbias\n");
    const runs = await Promise.all([
      ws.run(["run", "zero.onset"]),
      ws.run(["run", "no-such-file.onset"]),
      ws.run(["run", "divider.onset", "--colour"]),
      ws.run(["rnu", "divider.onset"]),
      ws.run(["run", "divider.onset", "--set", "R9=1k"]),
      ws.run(["run", "divider.onset", "--set", "R1"]),
      ws.run(["run"]),
    ]);
    for (const r of runs) {
      expect(r.status).toBe(2);
      expect(r.stdout).toBe("");
      expect(r.stderr).toMatch(/error: /);
      expect(r.stderr).not.toMatch(/\n\s+at .*:\d+:\d+\)?\n/);
    }
    expect(runs[2]!.stderr).toContain("run: unknown option '--colour'");
    expect(runs[3]!.stderr).toContain("unknown command 'rnu' (did you mean 'run'?)");
    expect(runs[4]!.stderr).toContain("cannot set 'R9'");
  });

  test("2 for a wiring fault found before solving: a node without a DC path to gnd", async () => {
    ws.write("float.onset", "vsource V1 a gnd 1\ncapacitor C1 a b 1n\nresistor R2 b gnd2 1k\nbias\n");
    const r = await ws.run(["run", "float.onset"]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("float.onset:2:1: error: nodes");
  });

  test("3 when the simulation fails: a unity-gain source driving its own input has singular equations", async () => {
    ws.write("loop.onset", "resistor R1 o gnd 1k\nvcvs E1 o gnd o gnd 1\nbias\n");
    const r = await ws.run(["run", "loop.onset"]);
    expect(r.status).toBe(3);
    expect(r.stderr).toContain("error: the circuit equations are singular");
    expect(r.stderr).toContain("hint: ");
  });
});

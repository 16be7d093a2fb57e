import { spawn } from "node:child_process";
import { readFileSync, renameSync, writeFileSync } from "node:fs";
import { afterAll, describe, expect, test } from "vitest";
import { MAIN, Workspace } from "./support/onset.js";

const ws = new Workspace();
afterAll(() => ws.remove());

/** RC charge whose title and resistance come from the test; R is in an included file. */
const circuit = (title: string) => `title "${title}"
include "values.onset"
vsource   V1 in gnd 5
resistor  R1 in o   (R)
capacitor C1 o  gnd 100n
transient until=2m max-step=20u start=rest probes=(o)
`;

/** Waits until `ready()` holds, looking every 50 ms; fails after `seconds` (a guard, not a measurement). */
async function until(ready: () => boolean, what: string, seconds = 30): Promise<void> {
  const end = Date.now() + seconds * 1000;
  while (!ready()) {
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

const count = (text: string, part: string) => text.split(part).length - 1;

describe("onset run --watch", () => {
  test("runs again on every save of the file or an include, survives an error in the file, rewrites the outputs and stops on Ctrl-C", async () => {
    ws.write("osc.onset", circuit("First"));
    ws.write("values.onset", "param R = 10k\n");
    const child = spawn(process.execPath, [MAIN, "run", "--watch", "osc.onset", "--csv", "osc.csv"], { cwd: ws.dir, stdio: ["ignore", "pipe", "pipe"] });
    let out = "";
    let err = "";
    child.stdout.setEncoding("utf8").on("data", (d: string) => (out += d));
    child.stderr.setEncoding("utf8").on("data", (d: string) => (err += d));
    const exited = new Promise<number | null>((done) => child.on("close", done));
    try {
      await until(() => count(err, "watching 2 files") === 1, "the first run");
      expect(out).toContain("First  osc.onset");
      const firstCsv = readFileSync(ws.path("osc.csv"), "utf8");

      // An editor that saves by writing a new file and renaming it over the old one.
      writeFileSync(ws.path("osc.onset.tmp"), circuit("Second"));
      renameSync(ws.path("osc.onset.tmp"), ws.path("osc.onset"));
      await until(() => count(err, "watching 2 files") === 2, "the run after the first save");
      expect(out).toContain("Second  osc.onset");
      expect(err).toContain("osc.onset changed: running again");

      // An error in the included file: shown with its place, and watching goes on.
      writeFileSync(ws.path("values.onset"), "param R = (10k\n");
      await until(() => count(err, "watching 2 files") === 3, "the run with an error");
      expect(err).toContain("values.onset changed: running again");
      expect(err).toMatch(/values\.onset:1:11: error: /);
      expect(child.exitCode).toBe(null);

      // Fixed with another value: the output is rewritten with the new time constant.
      writeFileSync(ws.path("values.onset"), "param R = 20k\n");
      await until(() => count(err, "watching 2 files") === 4, "the run after the fix");
      expect(count(out, "Second  osc.onset")).toBe(2);
      expect(readFileSync(ws.path("osc.csv"), "utf8")).not.toBe(firstCsv);
    } finally {
      child.kill("SIGINT");
    }
    expect(await exited).toBe(0);
    expect(err.trimEnd().split("\n").at(-1)).toBe("stopped watching");
  });

  test("standard input cannot be watched", async () => {
    const r = await ws.run(["run", "--watch", "-"], "bias\n");
    expect([r.status, r.stderr]).toEqual([2, "error: --watch needs a file to watch, not standard input\nhint: give the circuit file's name\n"]);
  });
});

import { readFileSync } from "node:fs";
import { afterAll, describe, expect, test } from "vitest";
import { DIVIDER, Workspace } from "./support/onset.js";

const ws = new Workspace();
afterAll(() => ws.remove());

describe("reading the circuit", () => {
  test("- reads the file from standard input", async () => {
    const r = await ws.run(["run", "-"], DIVIDER);
    expect(r.status).toBe(0);
    expect(r.stdout).toContain("Half-supply divider  <stdin>");
    expect(r.stdout).toMatch(/\n {2}m +2\.5 V\n/);
  });

  test("an error shows file:line:col, the line, a caret under the mistake and a hint, without a stack trace", async () => {
    ws.write("typo.onset", "vsource V1 a gnd 5\nresistor R1 a 0 1k\nbias\n");
    const r = await ws.run(["run", "typo.onset"]);
    expect(r.status).toBe(2);
    expect(r.stderr).toBe(
      ["typo.onset:2:15: error: node '0' is not ground in this language", "  resistor R1 a 0 1k", "                ^", "hint: write gnd for the ground node", ""].join("\n"),
    );
  });

  test("an error in standard input names <stdin>", async () => {
    const r = await ws.run(["check", "-"], "resistor R1 a 0 1k\n");
    expect(r.status).toBe(2);
    expect(r.stderr.split("\n")[0]).toBe("<stdin>:1:15: error: node '0' is not ground in this language");
  });

  test("includes are read relative to the including file", async () => {
    ws.write("parts.onset", "resistor R2 m gnd 10k\n");
    ws.write("main.onset", 'include "parts.onset"\nvsource V1 in gnd 5\nresistor R1 in m 30k\nbias\n');
    const r = await ws.run(["run", "main.onset", "--json"]);
    expect(r.status).toBe(0);
    const bias = (JSON.parse(r.stdout) as { results: { nodes: { node: string; voltage: number }[] }[] }).results[0]!;
    // 5 V · 10k/(30k + 10k) = 1.25 V (voltage divider).
    expect(bias.nodes.find((n) => n.node === "m")!.voltage).toBeCloseTo(1.25, 9);
  });
});

describe("onset check and onset format", () => {
  test("check passes a valid file and reports its parts and analyses", async () => {
    ws.write("divider.onset", DIVIDER);
    const r = await ws.run(["check", "divider.onset"]);
    expect(r.status).toBe(0);
    expect(r.stdout).toBe("divider.onset: ok (3 parts, analyses: bias)\n");
  });

  test("format prints the canonical layout; --write rewrites the file and a second pass changes nothing", async () => {
    ws.write("messy.onset", "vsource V1 in gnd 5   # supply\nresistor   R1 in m 10k\nresistor R2 m gnd 10k\n\n\n\nbias\n");
    const printed = await ws.run(["format", "messy.onset"]);
    expect(printed.status).toBe(0);
    // The part columns line up and the run of blank lines closes to one (the canonical layout).
    const lines = printed.stdout.split("\n");
    expect(lines.slice(0, 3).map((l) => l.indexOf("10k"))).toEqual([-1, lines[2]!.indexOf("10k"), lines[2]!.indexOf("10k")]);
    expect(printed.stdout).toContain("# supply");
    expect(printed.stdout.endsWith("\n\nbias\n")).toBe(true);
    expect(readFileSync(ws.path("messy.onset"), "utf8")).toContain("resistor   R1");
    const written = await ws.run(["format", "messy.onset", "--write"]);
    expect(written.status).toBe(0);
    expect(readFileSync(ws.path("messy.onset"), "utf8")).toBe(printed.stdout);
    const again = await ws.run(["format", "messy.onset", "--write"]);
    expect(again.stderr).toContain("already in the canonical layout");
  });

  test("format --write refuses standard input", async () => {
    const r = await ws.run(["format", "-", "--write"], DIVIDER);
    expect(r.status).toBe(2);
  });
});

describe("help and version", () => {
  test("--help lists the commands; help run lists run's options; --version prints the version", async () => {
    const [general, run, version, runHelp] = await Promise.all([ws.run(["--help"]), ws.run(["help", "run"]), ws.run(["--version"]), ws.run(["run", "--help"])]);
    expect(general.status).toBe(0);
    for (const c of ["run", "check", "format", "design", "merge", "help"]) expect(general.stdout).toMatch(new RegExp(`\\n  ${c} `));
    expect(run.status).toBe(0);
    for (const o of ["--json", "--csv FILE", "--svg FILE", "--set NAME=VALUE", "--quiet", "--no-color", "--jobs N", "--shard k/n", "--resume", "--results FILE", "--sample I"]) {
      expect(run.stdout).toContain(o);
    }
    expect(runHelp.stdout).toBe(run.stdout);
    const pkg = JSON.parse(readFileSync(new URL("../../packages/cli/package.json", import.meta.url), "utf8")) as { version: string };
    expect(version.stdout).toBe(`onset ${pkg.version}\n`);
  });

  test("no command at all is a usage error that shows the overview", async () => {
    const r = await ws.run([]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("usage: onset COMMAND");
  });
});

import { spawnSync } from "node:child_process";
import { readFileSync, rmSync, writeFileSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { expect, test } from "vitest";

const repo = resolve(dirname(fileURLToPath(import.meta.url)), "../..");

test("the README's npm API example runs as written, on the built packages", () => {
  const readme = readFileSync(join(repo, "README.md"), "utf8");
  const code = /## From another program \(npm API\)\n\n```ts\n([\s\S]*?)```/.exec(readme)?.[1];
  expect(code).toBeDefined();
  // Beside the README, so the example's relative path and the workspace's packages resolve.
  const script = join(repo, `.readme-example-${process.pid}.mjs`);
  writeFileSync(script, code!);
  try {
    const r = spawnSync(process.execPath, [script], { cwd: repo, encoding: "utf8", timeout: 120_000 });
    expect(r.stderr).toBe("");
    const rows = r.stdout.trim().split("\n").map((line) => line.split(" "));
    expect(rows.map((row) => row.slice(0, 2))).toEqual([
      ["0.3", "settled"],
      ["0.5", "settled"],
      ["0.8", "settled"],
    ]);
    // The demo's frequency, within 2 % of the README's report (2.441 kHz at P1.at = 0.5).
    expect(Math.abs(Number(rows[1]![2]) / 2441 - 1)).toBeLessThan(0.02);
  } finally {
    rmSync(script, { force: true });
  }
});

test("the README's runSteady example runs as written: the cable tracer's orbit, stable, near the 1.2 kHz it is designed for", () => {
  const readme = readFileSync(join(repo, "README.md"), "utf8");
  const code = /`runSteady` takes the circuit[\s\S]*?```ts\n([\s\S]*?)```/.exec(readme)?.[1];
  expect(code).toBeDefined();
  const script = join(repo, `.readme-steady-${process.pid}.mjs`);
  writeFileSync(script, code!);
  try {
    const r = spawnSync(process.execPath, [script], { cwd: repo, encoding: "utf8", timeout: 120_000 });
    expect(r.stderr).toBe("");
    const [frequency, amplitude, thd, verdict, largest] = r.stdout.trim().split(" ");
    expect(verdict).toBe("stable");
    // f = 1/(2π·√6·RC) = 1.214 kHz for the ladder's 5.36 kΩ and 10 nF (closed form), moved a little by the clip and the op-amp
    expect(Math.abs(Number(frequency) / 1214 - 1)).toBeLessThan(0.05);
    expect(Number(amplitude)).toBeGreaterThan(0);
    expect(Number(thd)).toBeGreaterThan(0);
    expect(Math.abs(Number(largest))).toBeLessThan(1);
  } finally {
    rmSync(script, { force: true });
  }
});

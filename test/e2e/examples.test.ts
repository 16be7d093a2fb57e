import { readdirSync } from "node:fs";
import { dirname, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, test } from "vitest";
import { onset } from "./support/onset.js";

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), "../..");
const run = async (...args: string[]) => onset(args, { cwd: ROOT });

interface Doc {
  results: Array<Record<string, unknown>>;
}

describe("the example files", () => {
  test("every example checks clean", async () => {
    const files = readdirSync(resolve(ROOT, "examples")).filter((f) => f.endsWith(".onset"));
    expect(files).toEqual(expect.arrayContaining(["rc-filter-step.onset", "rlc-ringing.onset"]));
    const checked = await Promise.all(files.map((f) => run("check", `examples/${f}`)));
    checked.forEach((r, k) => expect(r.status, `${files[k]}: ${r.stderr}`).toBe(0));
  });

  test("rc-filter-step: the output settles to 3.3 V·(1 − e^(−5.5 ms/τ)) and the corner is 1/(2πRC)", async () => {
    const r = await run("run", "examples/rc-filter-step.onset", "--json");
    expect(r.status).toBe(0);
    const [, transient, response] = (JSON.parse(r.stdout) as Doc).results as [unknown, { probes: { name: string; final: number }[] }, { cutoffs: number[] }];
    // First-order step response and corner frequency (Nilsson & Riedel, Electric Circuits, ch. 7 and 14).
    const tau = 4.7e3 * 220e-9;
    const o = transient.probes.find((p) => p.name === "o")!;
    expect(Math.abs(o.final - 3.3 * (1 - Math.exp(-(6e-3 - 0.5e-3 - 0.5e-6) / tau)))).toBeLessThan(2e-3);
    expect(response.cutoffs[0]! * 2 * Math.PI * tau).toBeCloseTo(1, 3);
  });

  test("rlc-ringing: poles at −R/2L ± j√(1/LC − (R/2L)²) and the step overshoot e^(−πζ/√(1−ζ²))", async () => {
    const r = await run("run", "examples/rlc-ringing.onset", "--json");
    expect(r.status).toBe(0);
    const [poles, transient] = (JSON.parse(r.stdout) as Doc).results as [{ dominant: { real: number; imag: number } }, { probes: { name: string; max: number }[] }];
    // Series RLC, second-order step response (Nilsson & Riedel, Electric Circuits, ch. 8).
    const R = 100;
    const L = 10e-3;
    const C = 100e-9;
    const alpha = R / (2 * L);
    const omega0 = 1 / Math.sqrt(L * C);
    expect(poles.dominant.real / -alpha).toBeCloseTo(1, 6);
    expect(poles.dominant.imag / Math.sqrt(omega0 ** 2 - alpha ** 2)).toBeCloseTo(1, 6);
    const zeta = alpha / omega0;
    const peak = 5 * (1 + Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta)));
    const o = transient.probes.find((p) => p.name === "o")!;
    expect(Math.abs(o.max / peak - 1)).toBeLessThan(2e-3);
  });
});

describe("the amplitude-stabilised examples", () => {
  interface Startup {
    verdict: string;
    amplitude: number;
    thd: number;
  }
  const startupOf = async (file: string) => {
    const r = await run("run", `examples/${file}`, "--json");
    expect(r.status, r.stderr).toBe(0);
    return (JSON.parse(r.stdout) as Doc).results[0] as unknown as Startup;
  };
  const AMBIENT = 300.15;

  test("audio-test-source: the lamp settles at Rf/2, so the amplitude is 3·√(2·P·R) with P from the lamp's thermal network (docs/references.md §12.4)", async () => {
    const s = await startupOf("audio-test-source.onset");
    expect(s.verdict).toBe("settled");
    const rLamp = 294 / 2;
    const theta = AMBIENT * Math.pow(rLamp / 100, 1 / 1.2);
    const rThermal = (AMBIENT * Math.pow(10, 1 / 1.2) - AMBIENT) / (12 ** 2 / 1000);
    const expected = 3 * Math.sqrt((2 * (theta - AMBIENT) * rLamp) / rThermal);
    expect(Math.abs(s.amplitude / expected - 1)).toBeLessThan(0.02);
    expect(s.thd).toBeLessThan(2e-4);
  });

  test("low-frequency-reference: the thermistor settles at 2·Rg, so the amplitude is (3/2)·√(2·P·R) with P = D·(θ − θ_amb) (docs/references.md §12.4)", async () => {
    const s = await startupOf("low-frequency-reference.onset");
    expect(s.verdict).toBe("settled");
    const rNtc = 2 * 3.6e3;
    const theta = 1 / (1 / 298.15 + Math.log(rNtc / 10e3) / 3500);
    const expected = 1.5 * Math.sqrt(2 * 40e-6 * (theta - AMBIENT) * rNtc);
    expect(Math.abs(s.amplitude / expected - 1)).toBeLessThan(0.02);
    expect(s.thd).toBeLessThan(2e-4);
  });

  test("jfet-loop-source settles and meets its spec", async () => {
    const s = await startupOf("jfet-loop-source.onset");
    expect(s.verdict).toBe("settled");
    expect(s.thd).toBeLessThan(5e-3);
  });
});

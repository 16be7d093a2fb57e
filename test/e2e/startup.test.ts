// Issue 12 through the built command: physical excitation, seeds, driven waveforms, warnings.
import { afterAll, describe, expect, test } from "vitest";
import { Workspace, wien } from "./support/onset.js";

const ws = new Workspace();
afterAll(() => ws.remove());

type Doc = Record<string, unknown> & { results: Array<Record<string, unknown>> };

async function json(args: string[]): Promise<Doc> {
  const r = await ws.run([...args, "--json"]);
  return JSON.parse(r.stdout) as Doc;
}

describe("onset run: start-up", () => {
  test("seeds=4: the start-up time's spread is the same with one job or two (each seed's run is deterministic)", async () => {
    ws.write("seeds.onset", wien("startup probe=o seeds=4\n"));
    const one = await json(["run", "seeds.onset", "--jobs", "1"]);
    const two = await json(["run", "seeds.onset", "--jobs", "2"]);
    const spread = one.results[0]!.startupTimeSpread as { seeds: number[]; times: number[]; min: number; median: number; max: number };
    expect(spread.seeds).toEqual([1, 2, 3, 4]);
    expect(spread.times[0]).toBe(one.results[0]!.startupTime);
    expect(spread.min).toBe(Math.min(...spread.times));
    expect(spread.max).toBe(Math.max(...spread.times));
    expect(spread.median).toBeCloseTo((([...spread.times].sort((a, b) => a - b))[1]! + [...spread.times].sort((a, b) => a - b)[2]!) / 2, 15);
    expect(two.results[0]!.startupTimeSpread).toEqual(spread);
  });

  test("the report states the thermal excitation; JSON carries it with the level at the probe", async () => {
    ws.write("thermal.onset", wien("startup probe=o\n"));
    const text = await ws.run(["run", "thermal.onset"]);
    expect(text.stdout).toMatch(/excitation: thermal noise of \d+ sources at 27 °C \(band [\d.]+ kHz, seed 1\), [\d.]+ µV rms at the probe; [\d.]+ [nµ]V rms at the probe over the first cycle/);
    const doc = await json(["run", "thermal.onset"]);
    expect(doc.results[0]!.excitation).toMatchObject({ kind: "thermal", seed: 1, temperature: 27, ramp: null, duration: null });
  });

  test("a 2.5 V, 1.2 kHz sine source into a resistor with kick=none is measured, not silent (issue 12, item 2)", async () => {
    ws.write("driven.onset", "vsource V1 x gnd wave=sine amp=2.5 freq=1.2k\nresistor R1 x gnd 1k\nstartup probe=x kick=none\n");
    const doc = await json(["run", "driven.onset"]);
    const r = doc.results[0]!;
    expect(r.verdict).toBe("settled");
    expect(r.frequency as number).toBeCloseTo(1200, 6);
    expect(r.amplitude as number).toBeCloseTo(2.5, 5);
  });

  test("an op-amp without rails= or supply= is named in a warning, in text and JSON", async () => {
    // the bench Wien's op-amp names no rails
    ws.write("rails.onset", wien("startup probe=o until=40m\n"));
    const text = await ws.run(["run", "rails.onset"]);
    expect(text.stdout).toContain("warning: opamp U1 has neither rails= nor supply=: it limits at the default rails (-15, 15) V less its headroom");
    const doc = await json(["run", "rails.onset"]);
    expect(doc.results[0]!.warnings).toEqual([
      {
        code: "default-rails",
        message: "opamp U1 has neither rails= nor supply=: it limits at the default rails (-15, 15) V less its headroom",
        hint: "write rails=(neg, pos) for fixed supplies, or supply=(vneg, vpos) to follow two supply nodes",
      },
    ]);
    ws.write("railed.onset", wien("startup probe=o until=40m\n").replace("preset=general", "preset=general rails=(-12, 12)"));
    expect((await json(["run", "railed.onset"])).results[0]!.warnings).toEqual([]);
  });
});

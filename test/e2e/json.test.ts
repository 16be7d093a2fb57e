import { afterAll, describe, expect, test } from "vitest";
import { DIVIDER, Workspace, wien } from "./support/onset.js";

const ws = new Workspace();
afterAll(() => ws.remove());

type Doc = Record<string, unknown> & { results: Array<Record<string, unknown>> };

async function json(args: string[]): Promise<{ status: number | null; doc: Doc }> {
  const r = await ws.run([...args, "--json"]);
  // Exactly one JSON document: JSON.parse rejects anything before or after it.
  return { status: r.status, doc: JSON.parse(r.stdout) as Doc };
}

describe("onset run --json", () => {
  test("a bias point: node voltages by Ohm's law and the source current, in SI units", async () => {
    ws.write("divider.onset", DIVIDER);
    const { status, doc } = await json(["run", "divider.onset"]);
    expect(status).toBe(0);
    expect(doc).toMatchObject({ file: "divider.onset", title: "Half-supply divider", overrides: {}, spec: null, exit: 0 });
    const bias = doc.results[0] as { analysis: string; nodes: { node: string; voltage: number }[]; sources: { part: string; current: number }[] };
    expect(bias.analysis).toBe("bias");
    // 5 V across 10 kΩ + 10 kΩ: 2.5 V at the middle, 250 µA drawn (Ohm's law).
    expect(bias.nodes.find((n) => n.node === "m")!.voltage).toBeCloseTo(2.5, 9);
    expect(Math.abs(bias.sources[0]!.current)).toBeCloseTo(250e-6, 12);
  });

  test("start-up, poles and spec carry the contract's fields and no waveform arrays", async () => {
    ws.write("osc.onset", wien("startup probe=o until=40m\npoles\nspec frequency=1.55k±5% thd<1%\n"));
    const { status, doc } = await json(["run", "osc.onset"]);
    expect(status).toBe(1);
    expect(doc.exit).toBe(1);
    const [startup, poles] = doc.results as [Record<string, unknown>, Record<string, unknown>];
    for (const key of ["analysis", "probe", "verdict", "frequency", "frequencySpread", "amplitude", "peakToPeak", "rms", "offset", "startupTime", "settlingTime", "growthRate", "thd", "harmonics", "cycles", "solver"]) {
      expect(startup).toHaveProperty(key);
    }
    expect(startup).toMatchObject({ analysis: "startup", probe: "o", verdict: "settled" });
    expect(startup).not.toHaveProperty("waveform");
    // the envelope's dynamics, without its arrays
    expect(Object.keys(startup.envelope as object)).toEqual(["bounceFrequency", "dampingRatio"]);
    const harmonics = startup.harmonics as { order: number; frequency: number; amplitude: number }[];
    expect(harmonics[0]).toMatchObject({ order: 1 });
    expect(harmonics[2]!.frequency / harmonics[0]!.frequency).toBeCloseTo(3, 9);
    expect(startup.thd as number).toBeGreaterThan(0.01);
    expect(startup.thd as number).toBeLessThan(1);
    expect((startup.solver as { accepted: number }).accepted).toBeGreaterThan(100);
    expect(poles).toMatchObject({ analysis: "poles", starts: true });
    const list = poles.poles as { real: number; imag: number }[];
    expect(list.length).toBeGreaterThan(1);
    for (const p of list) expect(Object.keys(p).sort()).toEqual(["imag", "real"]);
    // The dominant pair's frequency is |imag|/2π (definition), and it grows (real > 0).
    const dominant = poles.dominant as { real: number; imag: number };
    expect(poles.frequency as number).toBeCloseTo(dominant.imag / (2 * Math.PI), 6);
    expect(poles.growthRate).toBe(dominant.real);
    const spec = doc.spec as { pass: boolean; criteria: { text: string; measured: number | null; pass: boolean }[] };
    expect(spec.pass).toBe(false);
    expect(spec.criteria.map((c) => [c.text, c.pass])).toEqual([
      ["frequency=1.55k±5%", true],
      ["thd<1%", false],
    ]);
    expect(spec.criteria[1]!.measured).toBe(startup.thd);
  });

  test("a response: points of frequency, magnitude and phase; the Wien network peaks at 1/3 with 0° at 1/(2πRC)", async () => {
    ws.write(
      "network.onset",
      `vsource   Vin in gnd 0
resistor  R1 in s   10k
capacitor C1 s  p   10n
resistor  R2 p  gnd 10k
capacitor C2 p  gnd 10n
response from=Vin to=p start=100 stop=10k per-decade=40
`,
    );
    const { status, doc } = await json(["run", "network.onset"]);
    expect(status).toBe(0);
    const r = doc.results[0] as { analysis: string; points: { frequency: number; magnitude: number; phase: number }[]; phaseCrossings: { phase: number; frequency: number; magnitude: number }[] };
    expect(r.analysis).toBe("response");
    expect(r.points).toHaveLength(81);
    for (const p of r.points) expect(Object.keys(p)).toEqual(expect.arrayContaining(["frequency", "magnitude", "phase"]));
    // Wien network (series RC into parallel RC): H(f₀) = 1/3 at phase 0 where f₀ = 1/(2πRC) (circuit theory, e.g. Sedra & Smith).
    const f0 = 1 / (2 * Math.PI * 10e3 * 10e-9);
    const zero = r.phaseCrossings.find((c) => c.phase === 0)!;
    expect(zero.frequency / f0).toBeCloseTo(1, 6);
    expect(zero.magnitude).toBeCloseTo(1 / 3, 6);
  });

  test("errors are one JSON document too, with code, message, file, line and column", async () => {
    ws.write("typo.onset", "vsource V1 a gnd 5\nresistor R1 a gnd 1k\nbias\ntransient until=1m probes=(a, b)\n");
    const r = await ws.run(["run", "typo.onset", "--json"]);
    expect(r.status).toBe(2);
    const doc = JSON.parse(r.stdout) as { error: Record<string, unknown>; exit: number };
    expect(doc.exit).toBe(2);
    expect(doc.error).toMatchObject({ file: "typo.onset", line: 4 });
    expect(typeof doc.error.code).toBe("string");
    expect(typeof doc.error.message).toBe("string");
    expect(typeof doc.error.column).toBe("number");
  });

  test("a usage error under --json prints an error document without a position", async () => {
    const r = await ws.run(["run", "divider.onset", "--json", "--jobs", "0"]);
    expect(r.status).toBe(2);
    expect(JSON.parse(r.stdout)).toMatchObject({ error: { code: "bad-option", file: null, line: null, column: null }, exit: 2 });
  });
});

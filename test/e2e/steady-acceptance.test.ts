// Issue 15 as an acceptance tester would check it, on circuits of our own (support/steady-circuits.ts):
// `steady` from the command line against closed forms, the odex ODE integrator, and the settled
// start-up run; its JSON contract; no fabricated orbits; unstable orbits named; studies the same
// on one and two workers; bad input a positioned error.
import { readFileSync } from "node:fs";
import { afterAll, describe, expect, test } from "vitest";
import { Workspace } from "./support/onset.js";
import { ladderReference } from "../support/clipped-oscillators.js";
import {
  DIODE_WIEN,
  DOUBLING_RESONATOR,
  JFET_FAST_DETECTOR,
  LADDER_CLIP,
  LAMP_WIEN,
  LC_CLIP,
  QUIET_WIEN,
  SINE_RC,
  SQUARE_RLC,
  THERMISTOR_WIEN,
  lampAmplitude,
  thermistorAmplitude,
} from "./support/steady-circuits.js";

const ws = new Workspace();
afterAll(() => ws.remove());

interface Multiplier {
  re: number;
  im: number;
  magnitude: number;
}
interface Steady {
  analysis: "steady";
  probe: string;
  unit: string;
  found: boolean;
  explanation: string;
  kind: "autonomous" | "driven";
  from: string;
  frequency: number | null;
  period: number | null;
  amplitude: number | null;
  peakToPeak: number | null;
  rms: number | null;
  offset: number | null;
  thd: number | null;
  harmonics: { order: number; frequency: number; amplitude: number }[];
  iterations: number[] | null;
  multipliers: Multiplier[];
  stability: { verdict: "stable" | "unstable" | "marginal"; largest: number | null } | null;
  predicted: { frequency: number | null; startupTime: number | null };
  transient: { periods: number };
}
interface Startup {
  analysis: "startup";
  verdict: string;
  frequency: number;
  amplitude: number;
  thd: number;
}
type Result = Steady | Startup | { analysis: "poles"; frequency: number };

async function run(name: string, text: string, ...args: string[]): Promise<{ status: number | null; results: Result[] }> {
  ws.write(name, text);
  const r = await ws.run(["run", name, "--json", ...args]);
  expect(r.stderr).not.toMatch(/\n\s+at /);
  return { status: r.status, results: (JSON.parse(r.stdout) as { results: Result[] }).results };
}
const steadyOf = (results: Result[]) => results.find((r): r is Steady => r.analysis === "steady")!;
const startupOf = (results: Result[]) => results.find((r): r is Startup => r.analysis === "startup")!;
const polesOf = (results: Result[]) => results.find((r): r is { analysis: "poles"; frequency: number } => r.analysis === "poles")!;
const rel = (a: number, b: number) => Math.abs(a / b - 1);

/** Issue 15's agreement with the settled start-up run: frequency 0.05 %, amplitude 0.5 %, THD 2 % relative. */
function agrees(s: Steady, u: Startup): void {
  expect(u.verdict).toBe("settled");
  expect(rel(s.frequency!, u.frequency)).toBeLessThan(5e-4);
  expect(rel(s.amplitude!, u.amplitude)).toBeLessThan(5e-3);
  expect(rel(s.thd!, u.thd)).toBeLessThan(2e-2);
}

describe("steady against closed forms and the odex ODE integrator", () => {
  test("an LC tank held by an ideal clip runs at its poles' imaginary part and at 1/(2π√LC) (closed form) within 2e-5; the JSON's figures in SI", async () => {
    const { status, results } = await run("lc.onset", LC_CLIP);
    expect(status).toBe(0);
    const s = steadyOf(results);
    expect(s).toMatchObject({ analysis: "steady", probe: "v", unit: "V", found: true, kind: "autonomous", from: "startup" });
    for (const key of ["frequency", "period", "amplitude", "peakToPeak", "rms", "offset", "thd", "harmonics", "iterations", "multipliers", "stability"]) expect(s).toHaveProperty(key);
    expect(rel(s.frequency!, polesOf(results).frequency)).toBeLessThan(2e-5);
    expect(rel(s.frequency! * 2 * Math.PI * Math.sqrt(2.2e-3 * 47e-9), 1)).toBeLessThan(2e-5);
    // SI: Hz and s, volts; the period is one over the frequency
    expect(s.period! * s.frequency!).toBeCloseTo(1, 12);
    expect(s.peakToPeak!).toBeCloseTo(2 * s.amplitude!, 9);
    expect(s.harmonics[0]!.frequency).toBeCloseTo(s.frequency!, 6);
    // the clip holds the tank's swing between |v| at which A·|v| reaches the 2 V rail and the rail: 2/3 … 2 V
    expect(s.amplitude!).toBeGreaterThan(2 / 3);
    expect(s.amplitude!).toBeLessThan(2);
    expect(s.stability!.verdict).toBe("stable");
    expect(s.stability!.largest!).toBeLessThan(1);
  });

  test("a C–R ladder held by an ideal clip: the frequency of its ideal-clip state equations (odex ODE integrator) within 0.05 %, near its poles' pair", async () => {
    const { results } = await run("ladder.onset", LADDER_CLIP);
    const s = steadyOf(results);
    expect(s.found).toBe(true);
    const reference = ladderReference(30, 4.7e3, 22e-9, 5, 400e-3);
    expect(rel(s.frequency!, reference.frequency)).toBeLessThan(5e-4);
    // a gain 3 % over the threshold: the clip moves the frequency from the poles' by about 0.1 %
    expect(rel(s.frequency!, polesOf(results).frequency)).toBeLessThan(3e-3);
    expect(s.stability!.verdict).toBe("stable");
  });

  test("a square-driven RLC's orbit has the drive's period exactly (closed form: the source's period)", async () => {
    const { results } = await run("square.onset", SQUARE_RLC);
    const s = steadyOf(results);
    expect(s).toMatchObject({ found: true, kind: "driven" });
    expect(s.period!).toBeCloseTo(333.333e-6, 15);
    expect(s.stability!.verdict).toBe("stable");
  });

  test("a pure sine through an RC low-pass: amplitude 1.5/√(1 + (ωRC)²) (closed form) within 1e-5, THD below −120 dBc (the integrator's floor)", async () => {
    const { results } = await run("sine.onset", SINE_RC);
    const s = steadyOf(results);
    expect(s.frequency).toBe(750);
    const wrc = 2 * Math.PI * 750 * 2.2e3 * 100e-9;
    expect(rel(s.amplitude!, 1.5 / Math.sqrt(1 + wrc * wrc))).toBeLessThan(1e-5);
    expect(s.thd!).toBeLessThan(1e-6);
  });
});

describe("steady against the settled start-up run, with a closed form where there is one", () => {
  test("a lamp-stabilised Wien (cold gain 4.9): agrees with the settled start-up run; amplitude within 1e-3 of the lamp's thermal balance (closed form)", async () => {
    const { results } = await run("lamp.onset", `${LAMP_WIEN}steady probe=o\nstartup probe=o until=auto\nsteady probe=o from=poles\n`);
    const s = steadyOf(results);
    agrees(s, startupOf(results));
    // The poles' period is 2.7 of the orbit's (the cold lamp's gain moves the pair): a shooting
    // from it converged on two turns of the orbit, reported at half the frequency with a THD of 2.7e6.
    const fromPoles = results.filter((r): r is Steady => r.analysis === "steady")[1]!;
    expect(fromPoles.from).toBe("poles");
    expect(rel(fromPoles.frequency!, s.frequency!)).toBeLessThan(1e-6);
    expect(rel(fromPoles.thd!, s.thd!)).toBeLessThan(2e-2);
    expect(rel(s.amplitude!, lampAmplitude(470, 120, 900, 10))).toBeLessThan(1e-3);
    // a slow loop: the largest multiplier close to, and inside, the unit circle
    expect(s.stability!.verdict).toBe("stable");
    expect(s.stability!.largest!).toBeGreaterThan(0.9);
  });

  test("a thermistor-stabilised Wien: agrees with the settled start-up run; amplitude within 1e-3 of the bead's thermal balance (closed form)", async () => {
    const { results } = await run("ntc.onset", `${THERMISTOR_WIEN}steady probe=o\nstartup probe=o until=auto\n`);
    const s = steadyOf(results);
    agrees(s, startupOf(results));
    expect(rel(s.amplitude!, thermistorAmplitude(2e3, 4.7e3, 3300, 60e-6))).toBeLessThan(1e-3);
  });

  test("a diode-limited Wien: the same frequency and multipliers on every probe, from=poles and cycles=, and the start-up run's figures", async () => {
    const probes = ["o", "p", "(o, p)", "Rf2.i", "U1.pole"];
    const text = `${DIODE_WIEN}${probes.map((p) => `steady probe=${p}\n`).join("")}steady probe=o from=poles\nsteady probe=o cycles=5\nstartup probe=o until=auto\n`;
    const { results } = await run("diodes.onset", text);
    const all = results.filter((r): r is Steady => r.analysis === "steady");
    expect(all.map((s) => s.probe)).toEqual(["o", "p", "o-p", "Rf2.i", "U1.pole", "o", "o"]);
    const [first] = all;
    for (const s of all) {
      expect(s.found).toBe(true);
      // the orbit does not depend on where it is measured or started (grid error about 1e-6)
      expect(rel(s.frequency!, first!.frequency!)).toBeLessThan(1e-5);
      expect(Math.abs(s.stability!.largest! - first!.stability!.largest!)).toBeLessThan(1e-3);
    }
    expect(all[3]!.unit).toBe("A");
    expect(all[5]!.from).toBe("poles");
    expect(all[6]!.transient.periods).toBeLessThanOrEqual(3 * 5);
    agrees(first!, startupOf(results));
  });
});

describe("no fabricated orbits; unstable orbits named", () => {
  test("a Wien below the Barkhausen gain: found false, no figures, the poles' verdict", async () => {
    const { status, results } = await run("quiet.onset", QUIET_WIEN);
    expect(status).toBe(0);
    const s = steadyOf(results);
    expect(s).toMatchObject({ found: false, frequency: null, amplitude: null, thd: null, multipliers: [], stability: null });
    expect(s.explanation).toMatch(/^no periodic orbit: the circuit does not oscillate — the poles' dominant pair at .* decays/);
  });

  test("a hard-driven varactor resonator: the drive-period orbit is unstable, a multiplier below −1 (a flip); the transient repeats every two periods, not one", async () => {
    const { results } = await run("doubling.onset", `${DOUBLING_RESONATOR}steady probe=k\n`);
    const s = steadyOf(results);
    expect(s).toMatchObject({ found: true, kind: "driven" });
    expect(s.stability!.verdict).toBe("unstable");
    expect(s.multipliers[0]!.re).toBeLessThan(-1);
    expect(s.explanation).toMatch(/unstable/);
    // The transient (variable steps, no shooting) settles on the period-2 orbit the flip leaves.
    ws.write("doubling-run.onset", `${DOUBLING_RESONATOR}transient until=1.5m max-step=40n probes=(k)\n`);
    expect((await ws.run(["run", "doubling-run.onset", "--csv", "doubling.csv"])).status).toBe(0);
    const rows = readFileSync(ws.path("doubling.csv"), "utf8").trim().split("\n").slice(1).map((l) => l.split(",").map(Number));
    const at = (t: number) => {
      const i = rows.findIndex((r) => r[0]! >= t);
      const [t0, v0] = rows[i - 1]!;
      const [t1, v1] = rows[i]!;
      return v0! + ((v1! - v0!) * (t - t0!)) / (t1! - t0!);
    };
    const T = 1 / 120e3;
    let one = 0;
    let two = 0;
    for (let k = 0; k < 50; k++) {
      const t = 1.5e-3 - 3 * T + (k / 50) * T;
      one = Math.max(one, Math.abs(at(t + T) - at(t)));
      two = Math.max(two, Math.abs(at(t + 2 * T) - at(t)));
    }
    expect(two).toBeLessThan(one / 3);
  });
});

describe("the orbit's stability as a check on an amplitude-control loop", () => {
  test("a JFET loop whose detector over-corrects: steady says unstable (a multiplier below −1); the start-up run never settles on it (bouncing)", async () => {
    const { results } = await run("jfet.onset", `${JFET_FAST_DETECTOR}steady probe=o\nstartup probe=o until=80m\n`);
    const s = steadyOf(results);
    expect(s.found).toBe(true);
    expect(s.stability!.verdict).toBe("unstable");
    expect(s.multipliers[0]!.re).toBeLessThan(-1);
    // the independent route: the transient from the noise, which leaves an unstable orbit
    expect(startupOf(results).verdict).toBe("bouncing");
  });
});

describe("studies with measure=steady", () => {
  test("tolerance and sweep: the same document on one and two workers, every sample and setting on a stable orbit", async () => {
    ws.write("mc.onset", `${DIODE_WIEN}steady probe=o\ntolerance runs=24 seed=5 measure=steady\nspec frequency=2.2k±5% amplitude=2..4\n`);
    ws.write("sw.onset", `${DIODE_WIEN}steady probe=o\nsweep Rf2 from=2.7k to=4.7k steps=3 measure=steady\n`);
    const [mc1, mc2, sw1, sw2] = await Promise.all([
      ws.run(["run", "mc.onset", "--json", "--jobs", "1"]),
      ws.run(["run", "mc.onset", "--json", "--jobs", "2"]),
      ws.run(["run", "sw.onset", "--json", "--jobs", "1"]),
      ws.run(["run", "sw.onset", "--json", "--jobs", "2"]),
    ]);
    expect(mc2.stdout).toBe(mc1.stdout);
    expect(sw2.stdout).toBe(sw1.stdout);
    const study = (JSON.parse(mc1.stdout) as { results: [{ measure?: string; samples: { metrics: { verdict: string; startupTime: number | null; settlingTime: number | null } }[] }] }).results[0];
    // the document says how its samples were measured: their startupTime is the poles' prediction
    expect(study.measure).toBe("steady");
    expect(study.samples.map((s) => s.metrics.verdict)).toEqual(Array(24).fill("settled"));
    for (const s of study.samples) expect(s.metrics.settlingTime).toBeNull();
    const sweep = (JSON.parse(sw1.stdout) as { results: [{ measure: string; points: { results: Steady[] }[] }] }).results[0];
    expect(sweep.measure).toBe("steady");
    for (const p of sweep.points) expect(p.results[0]!.stability!.verdict).toBe("stable");
  });
});

describe("the text report of a study with measure=steady", () => {
  test("labels the samples' start-up time as predicted, in the percentiles and beside each worst sample", async () => {
    ws.write("mc-text.onset", `${DIODE_WIEN}steady probe=o\ntolerance runs=6 seed=2 measure=steady\nspec startup<50m\n`);
    const r = await ws.run(["run", "mc-text.onset"]);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/^ {2}start-up time \(predicted\) +[\d.]+ ms/m);
    expect(r.stdout).toMatch(/, start-up [\d.]+ ms \(predicted\)$/m);
  });
});

describe("bad input to steady: a positioned error with a hint, exit 2, no stack trace", () => {
  test.each([
    ["probe=zz", "unknown node 'zz'", "hint: a probe names a node"],
    ["probe=o from=bias", "from=bias is not a choice for steady", "hint: from= is one of startup, poles"],
    ["probe=o cycles=0", "cycles= of steady must be between 1 and 100000, got 0", "hint: cycles= is the periods of transient"],
    ["probe=o cycles=1e9", "cycles= of steady must be between 1 and 100000, got 1000000000", "hint: cycles= is the periods of transient"],
    ["from=poles", "steady needs probe=", "hint: probe= is the probe"],
  ])("steady %s", async (options, message, hint) => {
    ws.write("bad.onset", `${DIODE_WIEN}steady ${options}\n`);
    const r = await ws.run(["run", "bad.onset"]);
    expect(r.status).toBe(2);
    const [first, , , last] = r.stderr.split("\n");
    expect(first).toMatch(new RegExp(`^bad\\.onset:14:\\d+: error: ${message.replace(/[().*+?]/g, "\\$&")}`));
    expect(last).toContain(hint);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });
});

import type { Circuit, Probe, StartupAnalysis, StartupKick } from "../circuit/circuit.js";
import { GROUND, probeName } from "../circuit/circuit.js";
import { inputError } from "../circuit/diagnostic.js";
import type { NoiseGenerator } from "../devices/device.js";
import { ZERO_CELSIUS } from "../devices/thermal-noise.js";
import type { MnaSystem } from "../solver/system.js";
import type { NoiseBankSettings } from "../waves/noise-bank.js";
import { densityOfSigma, INTERPOLATED_VARIANCE } from "../waves/smooth-noise.js";

/** The default temperature of the resistances (°C). */
export const DEFAULT_TEMPERATURE = 27;
/** The default power-on ramp (s). */
export const DEFAULT_RAMP = 1e-3;
/** The thermal noise band: flat (within 0.02 %) at f₀, fading out by this multiple of it. */
export const NOISE_BAND = 20;
/** `kick=noise`: the current lasts this many predicted cycles, band 4·f₀ (as it always has). */
const KICK_CYCLES = 5;
const KICK_BAND = 4;
/** `kick=noise`: the default r.m.s. current (A). */
const KICK_LEVEL = 1e-9;

/** How a start-up run was excited, and what that left at the probe. */
export interface Excitation {
  readonly kind: StartupKick;
  /** Seed of every noise stream (each stream is keyed by the seed and its generator's name). */
  readonly seed: number;
  /** °C: the temperature of the resistances (thermal and power-on). */
  readonly temperature: number | null;
  /** s: the power-on ramp. */
  readonly ramp: number | null;
  /** A r.m.s.: the injected current (noise). */
  readonly level: number | null;
  /** The node the injected current enters (noise). */
  readonly node: string | null;
  /** s: how long the noise lasts; null when it lasts the whole run, or there is none. */
  readonly duration: number | null;
  /** Hz: the noise band's corner (the noise is flat to within 0.4 % up to a fifth of it). */
  readonly band: number | null;
  /** How many independent noise generators there are. */
  readonly sources: number;
  /**
   * V (or A on a current probe) r.m.s.: what the tool's noise alone leaves at the probe,
   * through the circuit linearised at its bias point (see `noiseLevel`); five times this is
   * the noise floor an oscillation must rise above. Null without noise.
   */
  readonly noiseAtProbe: number | null;
  /** V (or A) r.m.s. of the probe about its mean over the first predicted cycle (after a ramp). */
  readonly firstCycleRms: number | null;
}

/** What a run needs to build its excitation. */
export interface ExcitationSetup {
  /** Everything but the two levels measured on the run. */
  readonly excitation: Omit<Excitation, "noiseAtProbe" | "firstCycleRms">;
  readonly generators: readonly NoiseGenerator[];
  readonly bank: NoiseBankSettings;
}

/** The nodes a `kick=noise` current leaves and enters. */
function kickNodes(probe: Probe, circuit: Circuit): [string, string] {
  switch (probe.kind) {
    case "node":
      return [GROUND, probe.node];
    case "difference":
      return [probe.minus, probe.plus];
    case "current":
    case "state": {
      const p = circuit.parts.find((x) => x.name === probe.part);
      if (!p) throw inputError("unknown-part", `startup probe '${probeName(probe)}' names no part`);
      return [GROUND, p.nodes[0] === GROUND ? p.nodes[1]! : p.nodes[0]!];
    }
  }
}

const index = (system: MnaSystem, node: string): number => (node === GROUND ? -1 : system.nodeIndex.get(node) ?? -1);

/**
 * The excitation of a start-up run at predicted frequency f₀: the noise generators (indices in
 * `system`'s layout, which a power-on build of the same circuit shares) and their band.
 */
export function excitationSetup(circuit: Circuit, system: MnaSystem, analysis: StartupAnalysis, kick: StartupKick, f0: number): ExcitationSetup {
  const seed = analysis.seed ?? 1;
  const none = { temperature: null, ramp: null, level: null, node: null, duration: null, band: null };
  switch (kick) {
    case "thermal":
    case "power-on": {
      const temperature = analysis.temperature ?? DEFAULT_TEMPERATURE;
      const kelvin = temperature + ZERO_CELSIUS;
      const generators = system.devices.flatMap((d) => d.noise?.(kelvin) ?? []).filter((g) => g.density > 0);
      const corner = NOISE_BAND * f0;
      return {
        excitation: { ...none, kind: kick, seed, temperature, ramp: kick === "power-on" ? (analysis.ramp ?? DEFAULT_RAMP) : null, band: corner, sources: generators.length },
        generators,
        bank: { seed, corner },
      };
    }
    case "noise": {
      const level = analysis.level ?? KICK_LEVEL;
      const corner = KICK_BAND * f0;
      const duration = KICK_CYCLES / f0;
      const [from, to] = kickNodes(analysis.probe, circuit);
      // The r.m.s. `level` over the band, as the noise wave defines it (see waves/noise.ts).
      const density = densityOfSigma(level / Math.sqrt(INTERPOLATED_VARIANCE), corner);
      const generator: NoiseGenerator = { name: "startup.kick", density, from: index(system, from), to: index(system, to), gain: 1 };
      return {
        excitation: { ...none, kind: kick, seed, level, node: to, duration, band: corner, sources: 1 },
        generators: [generator],
        bank: { seed, corner, stop: duration },
      };
    }
    case "none":
      return { excitation: { ...none, kind: kick, seed, sources: 0 }, generators: [], bank: { seed, corner: f0 } };
  }
}

/** Hz: the repetition frequencies of the circuit's periodic sources (sines, pulse trains). */
export function periodicDrives(circuit: Circuit): number[] {
  const drives: number[] = [];
  for (const p of circuit.parts) {
    if (p.kind !== "vsource" && p.kind !== "isource") continue;
    const { wave, freq, period } = p.options;
    if (wave === "sine" && typeof freq === "number" && freq > 0) drives.push(freq);
    if (wave === "pulse" && typeof period === "number" && period > 0 && Number.isFinite(period)) drives.push(1 / period);
  }
  return drives;
}

/** The r.m.s. of v about its mean over [from, from + period], by the trapezoid rule; null if the record is shorter. */
export function firstCycleRms(t: Float64Array, v: Float64Array, from: number, period: number): number | null {
  const to = from + period;
  if (t.length < 2 || t[t.length - 1]! < to) return null;
  let area = 0;
  let squares = 0;
  for (let i = 0; i + 1 < t.length; i++) {
    const a = Math.max(t[i]!, from);
    const b = Math.min(t[i + 1]!, to);
    if (!(b > a)) continue;
    const h = t[i + 1]! - t[i]!;
    const va = v[i]! + ((v[i + 1]! - v[i]!) * (a - t[i]!)) / h;
    const vb = v[i]! + ((v[i + 1]! - v[i]!) * (b - t[i]!)) / h;
    area += 0.5 * (b - a) * (va + vb);
    squares += 0.5 * (b - a) * (va * va + vb * vb);
  }
  const mean = area / period;
  return Math.sqrt(Math.max(0, squares / period - mean * mean));
}

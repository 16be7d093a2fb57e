import type { OptionSchema, UnitSymbol } from "../circuit/schema.js";

/** The option sets of the `wave=` variants, for a source whose level is in `unit` (V or A). */
export function waveOptionSets(unit: UnitSymbol): Record<string, Record<string, OptionSchema>> {
  return {
    sine: {
      amp: { type: "number", unit, summary: "peak amplitude" },
      freq: { type: "number", unit: "Hz", min: 0, minExclusive: true, summary: "frequency" },
      offset: { type: "number", unit, default: 0, summary: "level the sine is centred on" },
      phase: { type: "number", unit: "rad", default: 0, summary: "starting phase (radians, or degrees with `deg`)" },
      delay: { type: "number", unit: "s", default: 0, min: 0, summary: "time before the sine starts; until then the level is offset + amp·sin(phase)" },
    },
    pulse: {
      low: { type: "number", unit, summary: "level before the pulse and between pulses" },
      high: { type: "number", unit, summary: "level during the pulse" },
      delay: { type: "number", unit: "s", default: 0, min: 0, summary: "time of the first rising edge" },
      rise: { type: "number", unit: "s", default: 0, min: 0, summary: "rise time; 0 is an ideal edge" },
      fall: { type: "number", unit: "s", default: 0, min: 0, summary: "fall time; 0 is an ideal edge" },
      width: { type: "number", unit: "s", default: Infinity, min: 0, allowInfinite: true, summary: "time at `high` (0: a triangle when rise + fall = period); unset means the pulse never falls" },
      period: { type: "number", unit: "s", default: Infinity, min: 0, minExclusive: true, allowInfinite: true, summary: "repetition period; unset means one pulse" },
    },
    steps: {
      points: { type: "points", units: ["s", unit], summary: "time–level pairs, linear in between, held before the first and after the last" },
    },
    noise: {
      rms: { type: "number", unit, min: 0, summary: "r.m.s. level" },
      seed: { type: "number", unit: "1", default: 1, integer: true, min: 0, summary: "seed of the reproducible random sequence" },
      corner: { type: "number", unit: "Hz", default: 100e3, min: 0, minExclusive: true, summary: "bandwidth: samples every 1/(2·corner), joined smoothly" },
      stop: { type: "number", unit: "s", default: Infinity, min: 0, minExclusive: true, allowInfinite: true, summary: "time after which the noise fades to zero within one sample" },
    },
  };
}

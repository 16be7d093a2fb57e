// The sources as they are for good, which a periodic steady state is of: the settled circuit's
// waves equal the written ones from the time the written ones start repeating (or hold).
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import type { Circuit, OptionValue, PartSpec } from "../../../packages/core/src/circuit/circuit.js";
import { vsourceSchema } from "../../../packages/core/src/devices/vsource.js";
import { settledSources } from "../../../packages/core/src/steady/settled-sources.js";
import { waveFromPart } from "../../../packages/core/src/waves/from-part.js";

const source = (options: Record<string, OptionValue>, value?: number): PartSpec => ({ kind: "vsource", name: "V1", nodes: ["a", "gnd"], options, ...(value === undefined ? {} : { value }) });
const settledPart = (part: PartSpec): PartSpec => settledSources({ parts: [part], analyses: [], tolerances: [] }).parts[0]!;
const wave = (part: PartSpec) => waveFromPart(part, vsourceSchema);

describe("settledSources(circuit)", () => {
  test("a delayed sine is the same wave from its delay on (mathematics: sin is 2π-periodic), started at t = 0", () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 1e5, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), (freq, delayTurns, phase, at) => {
        const delay = (delayTurns * 40) / freq;
        const written = source({ wave: "sine", amp: 2, freq, offset: 0.5, phase, delay });
        const settled = settledPart(written);
        expect(settled.options.delay).toBe(0);
        const t = delay + (at * 3) / freq;
        expect(wave(settled).value(t, false)).toBeCloseTo(wave(written).value(t, false), 6);
      }),
    );
  });

  test("a delayed pulse train is the same train from its delay on, its delay taken modulo its period", () => {
    const written = source({ wave: "pulse", low: -1, high: 3, delay: 7.3e-3, rise: 1e-5, fall: 2e-5, width: 4e-4, period: 1e-3 });
    const settled = settledPart(written);
    expect(settled.options.delay).toBeCloseTo(0.3e-3, 15);
    for (let k = 0; k < 2000; k++) {
      const t = 7.3e-3 + k * 1.37e-6;
      expect(wave(settled).value(t, false)).toBeCloseTo(wave(written).value(t, false), 9);
    }
  });

  test("a one-shot pulse, a steps wave and a noise that stops become DC at their last level", () => {
    expect(settledPart(source({ wave: "pulse", low: 0, high: 12, delay: 1e-3, rise: 1e-4, fall: 0, width: Infinity, period: Infinity }))).toMatchObject({ value: 12, options: {} });
    expect(settledPart(source({ wave: "pulse", low: 0.2, high: 5, delay: 1e-3, rise: 0, fall: 0, width: 1e-3, period: Infinity }))).toMatchObject({ value: 0.2, options: {} });
    expect(settledPart(source({ wave: "steps", points: [0, 0, 1e-3, 9, 2e-3, -4] }))).toMatchObject({ value: -4, options: {} });
    expect(settledPart(source({ wave: "noise", rms: 1e-6, seed: 1, corner: 1e5, stop: 2e-3 }))).toMatchObject({ value: 0, options: {} });
  });

  test("returns the very circuit when no source changes (DC, an undelayed sine, a pulse train starting in its first period, a noise that never stops)", () => {
    const circuit: Circuit = {
      parts: [
        source({}, 12),
        source({ wave: "sine", amp: 1, freq: 50, offset: 0, phase: 0, delay: 0 }),
        source({ wave: "pulse", low: 0, high: 1, delay: 2e-4, rise: 0, fall: 0, width: 1e-4, period: 1e-3 }),
        source({ wave: "noise", rms: 1, seed: 1, corner: 1e5, stop: Infinity }),
      ],
      analyses: [],
      tolerances: [],
    };
    expect(settledSources(circuit)).toBe(circuit);
  });
});

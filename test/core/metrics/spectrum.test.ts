import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { periodicSpectrum, thdOfPeriodicSamples } from "../../../packages/core/src/metrics/spectrum.js";

// Direct DFT sum X_k = Σ x_m e^{−2πikm/M} (mathematics), peak amplitude 2|X_k|/M (|X_k|/M at
// the Nyquist bin), written independently of the fft.js path.
function directAmplitude(x: Float64Array, bin: number): number {
  let re = 0;
  let im = 0;
  const size = x.length;
  for (let m = 0; m < size; m++) {
    const angle = (-2 * Math.PI * ((bin * m) % size)) / size;
    re += x[m] * Math.cos(angle);
    im += x[m] * Math.sin(angle);
  }
  return ((bin === size / 2 ? 1 : 2) * Math.hypot(re, im)) / size;
}

function directThd(x: Float64Array, cycles: number, maxOrder: number): number {
  let sum = 0;
  for (let h = 2; h <= maxOrder; h++) sum += directAmplitude(x, h * cycles) ** 2;
  return Math.sqrt(sum) / directAmplitude(x, cycles);
}

describe("periodicSpectrum and thdOfPeriodicSamples (fft.js) against a direct DFT sum", () => {
  test("property: random harmonic mixtures plus noise give the direct DFT's amplitudes and THD", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(64, 256, 1024),
        fc.integer({ min: 1, max: 3 }),
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 6, maxLength: 6 }),
        fc.array(fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }), { minLength: 6, maxLength: 6 }),
        fc.integer({ min: 1, max: 2 ** 31 - 1 }),
        (size, cycles, amplitudes, phases, seed) => {
          let state = seed;
          const x = Float64Array.from({ length: size }, (_, m) => {
            const theta = (2 * Math.PI * cycles * m) / size;
            let value = 0.3 + (1 + amplitudes[0]) * Math.cos(theta + phases[0]);
            for (let h = 2; h <= 6; h++) value += 0.2 * amplitudes[h - 1] * Math.cos(h * theta + phases[h - 1]);
            state = (Math.imul(state, 1103515245) + 12345) >>> 0;
            return value + 0.01 * (state / 2 ** 32 - 0.5);
          });
          const maxOrder = 8;
          const spectrum = periodicSpectrum(x, cycles, maxOrder);
          for (let h = 1; h <= maxOrder; h++) {
            expect(spectrum.amplitudes[h - 1]).toBeCloseTo(directAmplitude(x, h * cycles), 10);
          }
          expect(spectrum.mean).toBeCloseTo(x.reduce((a, b) => a + b) / size, 12);
          expect(thdOfPeriodicSamples(x, cycles, maxOrder)).toBeCloseTo(directThd(x, cycles, maxOrder), 10);
        },
      ),
      { numRuns: 40 },
    );
  });

  test("a cosine at the Nyquist bin has amplitude |X|/M, not 2|X|/M (mathematics)", () => {
    // 4 cycles of 8 samples: harmonic 4 sits on bin 16 = M/2.
    const x = Float64Array.from({ length: 32 }, (_, m) => Math.cos((2 * Math.PI * 4 * m) / 32) + 0.5 * Math.cos(Math.PI * m));
    const spectrum = periodicSpectrum(x, 4, 4);
    expect(spectrum.amplitudes[0]).toBeCloseTo(1, 13);
    expect(spectrum.amplitudes[3]).toBeCloseTo(0.5, 13);
    expect(directAmplitude(x, 16)).toBeCloseTo(0.5, 13);
  });

  test("r.m.s. includes the mean: 0.5 + sin gives √(0.25 + 0.5) (mathematics)", () => {
    const x = Float64Array.from({ length: 128 }, (_, m) => 0.5 + Math.sin((2 * Math.PI * 2 * m) / 128));
    expect(periodicSpectrum(x, 2, 10).rms).toBeCloseTo(Math.sqrt(0.75), 13);
  });
});

describe("thdOfPeriodicSamples on a sampled square wave (docs/references.md §4, 'Sampled square wave' [math])", () => {
  // With N midpoint samples per period the DFT fundamental is 4/(N·sin(π/N)) and every other
  // bin holds aliased odd harmonics, so the THD over all bins is √(N²·sin²(π/N)/8 − 1), not the
  // continuous 0.483426. Counting harmonics up to N/2 − 1 per period takes in every bin. At
  // N = 2^16 the sampled value agrees with the continuous one to the six digits tabulated
  // (docs/references.md §4: [np] FFT at 2^16 samples per period, [js] fft.js gives the same).
  test.each([
    [16, 0.466827],
    [64, 0.4824],
    [1024, 0.483422],
    [65536, 0.483426],
  ])("N = %i samples per period: THD_F = %f", (n, tabulated) => {
    const cycles = 2;
    const x = Float64Array.from({ length: cycles * n }, (_, m) => (Math.sin((2 * Math.PI * (m + 0.5)) / n) >= 0 ? 1 : -1));
    const closedForm = Math.sqrt((n * n * Math.sin(Math.PI / n) ** 2) / 8 - 1);
    const thd = thdOfPeriodicSamples(x, cycles, n / 2 - 1);
    expect(thd).toBeCloseTo(closedForm, 10);
    expect(thd).toBeCloseTo(tabulated, 6);
  });
});

describe("argument checks", () => {
  test("reject sizes fft.js cannot take and harmonics beyond Nyquist, naming the rule", () => {
    expect(() => thdOfPeriodicSamples(new Float64Array(100), 1, 10)).toThrow(
      "thdOfPeriodicSamples: the sample count must be a power of two >= 2 (got 100)",
    );
    expect(() => thdOfPeriodicSamples(new Float64Array(64), 4, 10)).toThrow(
      "thdOfPeriodicSamples: harmonic 10 of 4 cycles lies above the Nyquist bin of 64 samples",
    );
    expect(() => periodicSpectrum(new Float64Array(64), 1.5, 10)).toThrow(
      "periodicSpectrum: cycles must be a whole number >= 1 (got 1.5)",
    );
  });
});

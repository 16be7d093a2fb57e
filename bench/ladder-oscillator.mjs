// The ladder-network oscillator of bench/scaling-case.mjs as a circuit object, `sections` long.
const part = (kind, name, nodes, value, options = {}) => ({ kind, name, nodes, value, options });

/** An RC ladder with values varied over a 7- and a 5-section cycle. */
export function ladderParts(sections, prefix = "n") {
  const parts = [];
  for (let k = 1; k <= sections; k++) {
    parts.push(part("resistor", `R${k}`, [`${prefix}${k - 1}`, `${prefix}${k}`], 100 * (1 + (k % 7) / 10)));
    parts.push(part("capacitor", `C${k}`, [`${prefix}${k}`, "gnd"], 1e-9 * (1 + (k % 5) / 10)));
  }
  return parts;
}

/**
 * The ladder turns the phase by 180° where its attenuation is about e^π/2 ≈ 12, an inverting
 * op-amp stage of gain 40 supplies the other 180°, and two diode pairs across three quarters of
 * its feedback resistor bring the gain down to 10 as the amplitude grows (see bench/scaling-case.mjs).
 */
export function ladderOscillator(sections) {
  const diode = { saturation: 2.5e-9, emission: 1.8, series: 0.5, junction: 0 };
  return {
    parts: [
      ...ladderParts(sections, "l").map((p) => (p.name === "R1" ? { ...p, nodes: ["o", "l1"] } : p)),
      part("resistor", "Rin", [`l${sections}`, "n"], 1e6),
      part("resistor", "Rf1", ["n", "f"], 10e6),
      part("resistor", "Rf2", ["f", "o"], 30e6),
      part("diode", "D1", ["f", "x1"], undefined, diode),
      part("diode", "D2", ["x1", "o"], undefined, diode),
      part("diode", "D3", ["o", "x2"], undefined, diode),
      part("diode", "D4", ["x2", "f"], undefined, diode),
      part("resistor", "Rp", ["p", "gnd"], 1e3),
      part("opamp", "U1", ["p", "n", "o"], undefined, { gain: 200000, gbw: 1e6, slew: 5e5, rout: 75, rin: 2e6, headroom: 1.5, knee: 0.01, noise: 0, rails: [-12, 12], vos: 0 }),
      part("capacitor", "Ckick", [`l${sections >> 1}`, "gnd"], 1e-12, { initial: 0.1 }),
    ],
    analyses: [],
    tolerances: [],
  };
}

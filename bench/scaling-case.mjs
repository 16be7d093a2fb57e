// One case of the scaling suite, run in a process of its own so that its peak memory is its own:
// `node bench/scaling-case.mjs <ladder|driven-ladder|oscillator> <sections>` prints one JSON line.
import { buildSystem, TransientStepper } from "@onset/core/engine";

const part = (kind, name, nodes, value, options = {}) => ({ kind, name, nodes, value, options });

/** An RC ladder with values varied over a 7- and a 5-section cycle, `sections` long, driven at n0. */
function ladderParts(sections, prefix = "n") {
  const parts = [];
  for (let k = 1; k <= sections; k++) {
    parts.push(part("resistor", `R${k}`, [`${prefix}${k - 1}`, `${prefix}${k}`], 100 * (1 + (k % 7) / 10)));
    parts.push(part("capacitor", `C${k}`, [`${prefix}${k}`, "gnd"], 1e-9 * (1 + (k % 5) / 10)));
  }
  return parts;
}

const PERIOD = 1 / 300; // about the oscillator's period at 300 sections (see below)

const cases = {
  /** The case: a 20 µs run with a 1 V pulse into the ladder. */
  ladder: (sections) => ({
    circuit: [part("vsource", "Vs", ["n0", "gnd"], undefined, { wave: "pulse", low: 0, high: 1, delay: 1e-6, rise: 1e-7, fall: 1e-7, width: 5e-6 }), ...ladderParts(sections)],
    until: 20e-6,
    maxStep: 20e-6 / 100,
    start: "bias",
  }),
  /** The same ladder driven by a sine at the oscillator's frequency, stepped as the oscillator is. */
  "driven-ladder": (sections) => ({
    circuit: [part("vsource", "Vs", ["n0", "gnd"], undefined, { wave: "sine", amp: 1, freq: 1 / PERIOD }), ...ladderParts(sections)],
    until: 80 * PERIOD,
    maxStep: PERIOD / 100,
    start: "bias",
  }),
  /**
   * A ladder-network oscillator: the RC ladder turns the phase by 180° where its attenuation is
   * about e^π/2 ≈ 12 (a uniform RC line's transfer 1/cosh√(jωRC), its phase −π at √(ωRC/2) = π),
   * an inverting op-amp stage of gain 40 supplies the other 180°, and two diode pairs across
   * three quarters of its feedback resistor bring the gain down to 10 as the amplitude grows.
   */
  oscillator: (sections) => ({
    circuit: [
      ...ladderParts(sections, "l").map((p) => (p.name === "R1" ? { ...p, nodes: ["o", "l1"] } : p)),
      part("resistor", "Rin", [`l${sections}`, "n"], 1e6),
      part("resistor", "Rf1", ["n", "f"], 10e6),
      part("resistor", "Rf2", ["f", "o"], 30e6),
      part("diode", "D1", ["f", "x1"], undefined, { saturation: 2.5e-9, emission: 1.8, series: 0.5, junction: 0 }),
      part("diode", "D2", ["x1", "o"], undefined, { saturation: 2.5e-9, emission: 1.8, series: 0.5, junction: 0 }),
      part("diode", "D3", ["o", "x2"], undefined, { saturation: 2.5e-9, emission: 1.8, series: 0.5, junction: 0 }),
      part("diode", "D4", ["x2", "f"], undefined, { saturation: 2.5e-9, emission: 1.8, series: 0.5, junction: 0 }),
      part("resistor", "Rp", ["p", "gnd"], 1e3),
      part("opamp", "U1", ["p", "n", "o"], undefined, { gain: 200000, gbw: 1e6, slew: 5e5, rout: 75, rin: 2e6, headroom: 1.5, knee: 0.01, noise: 0, rails: [-12, 12], vos: 0 }),
      part("capacitor", "Ckick", [`l${sections >> 1}`, "gnd"], 1e-12, { initial: 0.1 }),
    ],
    until: 80 * PERIOD,
    maxStep: PERIOD / 100,
    start: "rest",
  }),
};

const [kind, sizeText] = process.argv.slice(2);
const sections = Number(sizeText);
const spec = cases[kind](sections);
const cpu0 = process.cpuUsage();
const wall0 = performance.now();
const system = buildSystem({ parts: spec.circuit, analyses: [], tolerances: [] });
const stepper = new TransientStepper(system, { start: spec.start, maxStep: spec.maxStep });
const probe = system.nodeIndex.get(kind === "oscillator" ? "o" : `n${sections >> 1}`);
let peak = 0;
let crossings = 0;
let last = 0;
let previous = 0;
stepper.observe((t, x) => {
  const v = x[probe];
  if (t > spec.until / 2) {
    peak = Math.max(peak, Math.abs(v));
    if (previous < 0 && v >= 0) crossings++;
  }
  previous = v;
  last = v;
});
// The stepping rate is measured over the second half, past the set-up and the first orderings.
stepper.advance(spec.until / 2);
const cpuHalf = process.cpuUsage();
const stepsHalf = stepper.stats.accepted;
stepper.advance(spec.until);
const cpuEnd = process.cpuUsage();
const cpu = process.cpuUsage(cpu0);
const secondHalf = (cpuEnd.user + cpuEnd.system - cpuHalf.user - cpuHalf.system) / 1e6;
console.log(
  JSON.stringify({
    kind,
    sections,
    unknowns: system.n,
    wallMs: performance.now() - wall0,
    cpuMs: (cpu.user + cpu.system) / 1000,
    accepted: stepper.stats.accepted,
    stepsPerCpuSecond: (stepper.stats.accepted - stepsHalf) / secondHalf,
    factorizations: stepper.stats.factorizations,
    newtonIterations: stepper.stats.newtonIterations,
    peakRssMB: process.resourceUsage().maxRSS / 1024,
    peak,
    frequency: crossings / (spec.until / 2),
    last,
  }),
);

import type { Probe } from "../circuit/circuit.js";
import { formatQuantity } from "../metrics/format.js";
import type { ProbeFigures } from "../metrics/probe-figures.js";
import type { Harmonic } from "../metrics/spectrum.js";
import type { StartupMetrics } from "../metrics/startup.js";
import type { QuantityUnit } from "../solver/quantities.js";
import type { MnaSystem } from "../solver/system.js";
import { largestNode, modeOfPole } from "../steady/growing-mode.js";
import type { SmallSignal } from "./linearize.js";
import { startsFrom, type Pole } from "./poles.js";

/**
 * The node a start-up's outcome is judged at when that is not the probe: the node the growing
 * mode of the bias point's dominant pair swings most (as `steady` watches it). A probe may swing
 * at a harmonic (a lamp's temperature follows the power, at 2f), barely at all (a supply node),
 * or through a slow detector, and the verdict, start-up and settling times must not depend on
 * where it is. Null when the probe is that node, or the poles give no growing mode (a circuit
 * that does not start, a driven one): the probe is judged.
 */
export function judgedNode(system: MnaSystem, linearised: () => SmallSignal, pole: Pole | null, probe: Probe): Probe | null {
  if (!pole || !(pole.imag > 0) || !startsFrom(pole)) return null;
  const mode = modeOfPole(linearised(), pole);
  if (!mode) return null;
  const unknown = system.unknowns[largestNode(mode, system.unknowns)];
  if (!unknown?.isNode || (probe.kind === "node" && probe.node === unknown.label)) return null;
  return { kind: "node", node: unknown.label };
}

/** Verdicts of a swing above the noise that does not die away. */
const OSCILLATING: ReadonlySet<StartupMetrics["verdict"]> = new Set(["settled", "relaxation", "parasitic", "growing", "unsettled", "bouncing"]);
/** …and those of one that repeats. */
const STEADY: ReadonlySet<StartupMetrics["verdict"]> = new Set(["settled", "relaxation", "parasitic"]);
/** A frequency within this fraction of a whole multiple of another is its harmonic. */
const HARMONIC_MATCH = 0.01;

/** A probe's oscillation within this factor of another growing pair's frequency is that pair's (a grown swing moves its frequency by a few per cent). */
const PAIR_MATCH = 1.25;

/**
 * What the probe's own record shows beside the judged node's: `judged` — nothing of its own (no
 * swing above its noise, a swing dying away, one at the judged frequency or a harmonic of it — a
 * filament's temperature at 2f, a detector's ripple — or one no other growing pair predicts);
 * `own` — a steady oscillation at the frequency of another growing pair of the bias point
 * (`others`, Hz): a second oscillator in the circuit, which the probe is judged on itself;
 * `forming` — that oscillation still growing or moving, which an `until=auto` run waits for.
 */
export function probeOscillation(own: StartupMetrics, judged: StartupMetrics, others: readonly number[]): "judged" | "own" | "forming" {
  const f = own.frequency;
  if (!OSCILLATING.has(own.verdict) || f === null || !others.some((o) => f < PAIR_MATCH * o && o < PAIR_MATCH * f)) return "judged";
  if (judged.frequency !== null) {
    const k = Math.round(f / judged.frequency);
    if (k >= 1 && Math.abs(f / (k * judged.frequency) - 1) <= HARMONIC_MATCH) return "judged";
  }
  return STEADY.has(own.verdict) ? "own" : "forming";
}

/** The head of a settled explanation: the amplitude and frequency it names. */
export const SETTLED_AT = /^settled at .+? peak and .+?Hz/;

/**
 * The start-up's outcome judged at `judgedAt` (verdict, times, growth, envelope dynamics, cycles)
 * with the probe's own figures, and an explanation that names both. Settled, it reads as the
 * probe's (its amplitude, in its unit) and says where it was judged; otherwise the judged node's
 * explanation comes first, then how the probe swings. Either way it says when the probe swings
 * mostly at a harmonic (THD is then over a fundamental it barely has), or no more than the
 * excitation's noise there.
 */
export function probeView(
  judged: StartupMetrics,
  probe: ProbeFigures & { readonly frequency: number | null; readonly envelope: Float64Array },
  names: { readonly probe: string; readonly judgedAt: string; readonly unit: QuantityUnit; readonly noise: number },
): StartupMetrics {
  const { frequency, envelope, ...figures } = probe;
  const f = frequency ?? judged.frequency;
  const where = `node ${names.judgedAt}, where the oscillation swings most`;
  const settled = SETTLED_AT.test(judged.explanation) && probe.amplitude !== null && f !== null;
  const explanation = settled
    ? `${judged.explanation.replace(SETTLED_AT, `settled at ${formatQuantity(probe.amplitude!, names.unit)} peak and ${formatQuantity(f!, "Hz")}`)} (judged at ${where})${settledNote(probe, names)}`
    : `at ${where}: ${judged.explanation}; ${swingText(probe, names)}`;
  return {
    ...judged,
    ...figures,
    frequency: f,
    explanation,
    // The envelope's slow dynamics are the loop's, the same at every node; its fit is in the judged node's unit.
    envelope: { ...judged.envelope, value: envelope, fit: null },
  };
}

type SwingNames = { readonly probe: string; readonly unit: QuantityUnit; readonly noise: number };

/** After a settled explanation in the probe's figures: what is unusual in its swing. */
function settledNote(probe: ProbeFigures, names: SwingNames): string {
  if (withinNoise(probe, names)) return "; the probe's swing is no more than the excitation's noise there";
  const h = harmonicSwing(probe);
  if (!h) return "";
  const u = names.unit;
  return `; the probe swings mostly at ${h.top.order}·f (${formatQuantity(h.top.amplitude, u)} at ${formatQuantity(h.top.frequency, "Hz")}) about ${formatQuantity(probe.offset!, u)}, and its THD is over its ${formatQuantity(h.fundamental.amplitude, u)} at f`;
}

/** How the probe swings, after an explanation of the judged node's. */
function swingText(probe: ProbeFigures, names: SwingNames): string {
  const u = names.unit;
  const at = `the probe ${names.probe}`;
  if (probe.amplitude === null) return `${at} rests at ${formatQuantity(probe.offset!, u)}`;
  const swing = `${at} swings ${formatQuantity(probe.amplitude, u)} peak about ${formatQuantity(probe.offset!, u)}`;
  if (withinNoise(probe, names)) return `${swing}, no more than the excitation's noise there`;
  const h = harmonicSwing(probe);
  return h ? `${swing}, mostly at ${h.top.order}·f (${formatQuantity(h.top.frequency, "Hz")})` : swing;
}

function withinNoise(probe: ProbeFigures, names: SwingNames): boolean {
  return probe.amplitude !== null && names.noise > 0 && probe.amplitude <= names.noise;
}

/** The probe's largest harmonic when that is not the fundamental (a filament's temperature at 2f). */
function harmonicSwing(probe: ProbeFigures): { readonly top: Harmonic; readonly fundamental: Harmonic } | null {
  const [fundamental, ...rest] = probe.harmonics;
  if (!fundamental) return null;
  let top = fundamental;
  for (const h of rest) if (h.amplitude > top.amplitude) top = h;
  return top === fundamental ? null : { top, fundamental };
}

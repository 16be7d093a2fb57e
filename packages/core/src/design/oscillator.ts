import { inputError } from "../circuit/diagnostic.js";
import { didYouMean } from "../circuit/suggest.js";
import { builtinPresets } from "../devices/registry.js";
import { chooseCapacitor, seriesUpwards, writeValue } from "./choose.js";
import { snapToSeries, type SeriesName } from "./eseries.js";
import { CAPACITOR_TOLERANCE, opampLine, predict, RESISTOR_TOLERANCE, type DesignChoice, type Line, type Sizing } from "./sizing.js";
import { AMPLITUDE_LIMITS, wienLimited, wienNetworkLines, type AmplitudeLimit } from "./wien-limiters.js";
import { withPrefix } from "../units/si-prefix.js";
import { checkDesignRequest, checkPositive, checkSimulated, finiteResult } from "./design-arguments.js";
import type { DesignedFile } from "./designed-file.js";

export type { DesignChoice } from "./sizing.js";
export type { AmplitudeLimit } from "./wien-limiters.js";

/** The oscillator topologies `onset design` sizes. */
export type Topology = "wien" | "twin-t" | "phase-shift";

/** What to design: the topology and frequency, and optionally the capacitor, resistor series, op-amp preset, start-up time and rails. */
export interface DesignRequest {
  readonly topology: Topology;
  /** Target frequency (Hz). */
  readonly frequency: number;
  /** Capacitor (F); chosen from the E6 decade values when absent. */
  readonly capacitor?: number;
  /** Resistor series; default E24. */
  readonly series?: SeriesName;
  /** Op-amp preset; default `general`. */
  readonly preset?: string;
  /** Start-up time to design the gain for (s); default 200 periods of the target. */
  readonly startupTime?: number;
  /** Supply rails (V); default (−12, 12). */
  readonly rails?: readonly [number, number];
  /** How the amplitude is held (Wien bridge only for all but `diodes`); default `diodes`. */
  readonly limit?: AmplitudeLimit;
}

/** A sized oscillator: the snapped part values, the frequency they give and the file to run. */
export interface DesignResult {
  readonly request: Required<Omit<DesignRequest, "capacitor">> & { readonly capacitor: number };
  readonly choices: readonly DesignChoice[];
  /** The frequency formula evaluated with the snapped values (Hz). */
  readonly formulaFrequency: number;
  /** The dominant pole pair of the snapped circuit at its bias point (Hz, 1/s). */
  readonly predicted: { readonly frequency: number; readonly growthRate: number };
  /** predicted.frequency / target − 1 */
  readonly error: number;
  /** ln(10¹²)/growthRate: the start-up time the chosen gain gives (s). */
  readonly startupEstimate: number;
  /**
   * The start-up of the written file as `onset run` gives it (when `simulate` was passed): the
   * settled frequency, which the poles miss by the start margin (the ladder's by about −5 %).
   */
  readonly simulated: SimulatedStartup | null;
  /** What was chosen and why, one sentence each. */
  readonly notes: readonly string[];
  /** A ready-to-run circuit file, as data: `printDesignedFile` of `@onset/netlist-parser` writes it in the language. */
  readonly file: DesignedFile;
}

/**
 * Growth the start-up estimate assumes: from the circuit's own thermal noise (tens of µV at an
 * op-amp output, the start-up analysis's default excitation) to a volt-scale amplitude, a
 * factor of about 10⁶, i.e. ln(10⁶) ≈ 13.8 envelope time constants (measured on the examples
 * with kick=thermal: 10.5–16).
 */
export const STARTUP_GROWTH = Math.log(1e6);

/** What a run of the designed file measured; `error` is frequency / target − 1. */
export interface SimulatedStartup {
  readonly verdict: string;
  readonly frequency: number | null;
  readonly amplitude: number | null;
  readonly thd: number | null;
  readonly startupTime: number | null;
  readonly error: number | null;
}

/** What {@link designOscillator} may do beyond sizing: simulate the file it writes. */
export interface DesignOptions {
  /**
   * Runs the start-up analysis of the written file and returns its metrics. Core cannot write or
   * read the language, so the caller prints the file and reads it back, e.g. with `@onset/netlist-parser`:
   * `(file) => { const c = elaborate(parseText(printDesignedFile(file), "design.onset").program).circuit!; return runStartup(c, startupAnalysisOf(c)!); }`.
   */
  readonly simulate?: (file: DesignedFile) => Omit<SimulatedStartup, "error">;
}

/**
 * Steps a gain-setting resistor up through the series until the snapped circuit's growth
 * rate reaches `required` (at most 40 values); returns the lines with it.
 */
function raiseUntilStarts(build: (r: number) => Line[], from: number, series: SeriesName, required: number): { lines: Line[]; value: number } {
  let last: { lines: Line[]; value: number } | undefined;
  for (const value of seriesUpwards(from, series, 40)) {
    const lines = build(value);
    last = { lines, value };
    if (predict(lines).growthRate >= required) return last;
  }
  return last!;
}

/**
 * Rf1 from `from` to f, Rf2 from f to the output o, and anti-parallel diode strings across Rf2
 * (`perString` diodes in series each way): the gain falls as the swing turns the diodes on.
 */
function limitedFeedback(from: string, rf1: number, rf2: number, perString: 1 | 2, rf2Comment: string): Line[] {
  const diodes: Line[] =
    perString === 1
      ? [
          { kind: "diode", name: "D1", nodes: ["f", "o"] },
          { kind: "diode", name: "D2", nodes: ["o", "f"] },
        ]
      : [
          { kind: "diode", name: "D1", nodes: ["f", "x1"] },
          { kind: "diode", name: "D2", nodes: ["x1", "o"] },
          { kind: "diode", name: "D3", nodes: ["o", "x2"] },
          { kind: "diode", name: "D4", nodes: ["x2", "f"] },
        ];
  return [
    { kind: "resistor", name: "Rf1", nodes: [from, "f"], value: rf1, tolerance: RESISTOR_TOLERANCE },
    { kind: "resistor", name: "Rf2", nodes: ["f", "o"], value: rf2, tolerance: RESISTOR_TOLERANCE, comment: rf2Comment },
    ...diodes,
  ];
}

function wien(req: DesignResult["request"], required: number): Sizing {
  const { frequency: f, capacitor: c, series } = req;
  const ideal = 1 / (2 * Math.PI * f * c);
  const r = snapToSeries(ideal, series);
  const choices: DesignChoice[] = [
    { part: "R1, R2", ideal, chosen: r, unit: "Ω" },
    { part: "C1, C2", ideal: c, chosen: c, unit: "F" },
  ];
  if (req.limit !== "diodes") return { ...wienLimited(req, req.limit, r), choices };
  const rg = 10e3;
  // Diodes on: 1 + Rf1/Rg = 2.8 < 3, so the amplitude settles; Rf2 adds the start margin.
  const rf1 = snapToSeries(1.8 * rg, series);
  const lines = (rf2: number): Line[] => [
    ...wienNetworkLines(r, c),
    { kind: "resistor", name: "Rg", nodes: ["n", "gnd"], value: rg, tolerance: RESISTOR_TOLERANCE },
    ...limitedFeedback("n", rf1, rf2, 1, "start margin; the diodes across it settle the amplitude"),
    opampLine(["p", "n", "o"], req.preset, req.rails),
  ];
  const chosen = raiseUntilStarts(lines, 0.25 * rg, series, required);
  const gain = 1 + (rf1 + chosen.value) / rg;
  return {
    lines: chosen.lines,
    probe: "o",
    formulaFrequency: 1 / (2 * Math.PI * r * c),
    choices,
    gainNote: `small-signal gain 1 + (Rf1 + Rf2)/Rg = ${gain.toFixed(3)} (the bridge needs 3); with the diodes conducting 1 + Rf1/Rg = ${(1 + rf1 / rg).toFixed(2)}`,
    thdLimit: 0.03,
    runs: 100,
    description: [
      "Wien bridge: series R1–C1 and parallel R2∥C2 from the output to the non-inverting input;",
      "f = 1/(2πRC) and the bridge passes 1/3 there, so the amplifier needs a gain of 3.",
    ],
  };
}

function phaseShift(req: DesignResult["request"], required: number): Sizing {
  const { frequency: f, capacitor: c, series } = req;
  const ideal = 1 / (2 * Math.PI * Math.sqrt(6) * f * c);
  const r = snapToSeries(ideal, series);
  // Diodes on: Rf1/R ≈ 26 < 29; Rf2 adds the start margin.
  const rf1 = snapToSeries(26 * r, series);
  const lines = (rf2: number): Line[] => [
    { kind: "capacitor", name: "C1", nodes: ["o", "a"], value: c, tolerance: CAPACITOR_TOLERANCE },
    { kind: "resistor", name: "R1", nodes: ["a", "gnd"], value: r, tolerance: RESISTOR_TOLERANCE },
    { kind: "capacitor", name: "C2", nodes: ["a", "b"], value: c, tolerance: CAPACITOR_TOLERANCE },
    { kind: "resistor", name: "R2", nodes: ["b", "gnd"], value: r, tolerance: RESISTOR_TOLERANCE },
    { kind: "capacitor", name: "C3", nodes: ["b", "c"], value: c, tolerance: CAPACITOR_TOLERANCE },
    { kind: "resistor", name: "R3", nodes: ["c", "n"], value: r, tolerance: RESISTOR_TOLERANCE, comment: "the last shunt R, to the virtual ground" },
    ...limitedFeedback("n", rf1, rf2, 1, "start margin; the diodes across it settle the amplitude"),
    opampLine(["gnd", "n", "o"], req.preset, req.rails),
  ];
  const chosen = raiseUntilStarts(lines, 3 * r, series, required);
  return {
    lines: chosen.lines,
    probe: "o",
    formulaFrequency: 1 / (2 * Math.PI * Math.sqrt(6) * r * c),
    choices: [
      { part: "R1, R2, R3", ideal, chosen: r, unit: "Ω" },
      { part: "C1, C2, C3", ideal: c, chosen: c, unit: "F" },
    ],
    gainNote: `small-signal inverting gain (Rf1 + Rf2)/R3 = ${((rf1 + chosen.value) / r).toFixed(2)} (the ladder needs 29); with the diodes conducting Rf1/R3 = ${(rf1 / r).toFixed(1)}`,
    thdLimit: 0.03,
    runs: 100,
    description: [
      "Three-section C–R ladder into an inverting stage; f = 1/(2π·√6·RC), where the ladder passes",
      "−1/29 of the output (H = x³/(x³ + 6x² + 5x + 1), x = sRC, is real at ωRC = 1/√6), so the stage needs a gain of 29.",
    ],
  };
}

/** Ω at which the twin-T's response is real: k(2k+1)Ω⁴ + k(1−2k)Ω² − 1 = 0 (docs/references.md §2.3). */
export function twinTCrossing(k: number): number {
  checkPositive("twinTCrossing", "k", k);
  const a = k * (2 * k + 1);
  const b = k * (1 - 2 * k);
  return finiteResult("twinTCrossing", Math.sqrt((-b + Math.sqrt(b * b + 4 * a)) / (2 * a)), `k = ${k}`);
}

function twinTLines(r: number, rs: number, c: number, rin: number, rf1: number, rf2: number, rp1: number, rp2: number, req: DesignResult["request"]): Line[] {
  return [
    { kind: "resistor", name: "Ra", nodes: ["o", "m1"], value: r, tolerance: RESISTOR_TOLERANCE },
    { kind: "resistor", name: "Rb", nodes: ["m1", "t"], value: r, tolerance: RESISTOR_TOLERANCE },
    { kind: "capacitor", name: "Cs1", nodes: ["m1", "gnd"], value: c, tolerance: CAPACITOR_TOLERANCE, comment: "Cs1 ∥ Cs2 is the 2C shunt" },
    { kind: "capacitor", name: "Cs2", nodes: ["m1", "gnd"], value: c, tolerance: CAPACITOR_TOLERANCE },
    { kind: "capacitor", name: "Ca", nodes: ["o", "m2"], value: c, tolerance: CAPACITOR_TOLERANCE },
    { kind: "capacitor", name: "Cb", nodes: ["m2", "t"], value: c, tolerance: CAPACITOR_TOLERANCE },
    { kind: "resistor", name: "Rs", nodes: ["m2", "gnd"], value: rs, tolerance: RESISTOR_TOLERANCE, comment: "under half of Ra: the notch turns the phase by −180°" },
    { kind: "resistor", name: "Rin", nodes: ["t", "n"], value: rin, tolerance: RESISTOR_TOLERANCE },
    ...limitedFeedback("n", rf1, rf2, 2, "start margin; the diode pairs across it settle the amplitude"),
    { kind: "resistor", name: "Rp1", nodes: ["o", "p"], value: rp1, tolerance: RESISTOR_TOLERANCE, comment: "with Rp2: positive feedback for the start" },
    { kind: "resistor", name: "Rp2", nodes: ["p", "gnd"], value: rp2, tolerance: RESISTOR_TOLERANCE },
    opampLine(["p", "n", "o"], req.preset, req.rails),
  ];
}

/** The setting in [lo, hi] where the growth rate of `build(setting)` changes sign (growth rising with the setting). */
function startThreshold(build: (setting: number) => Line[], lo: number, hi: number): number {
  for (let k = 0; k < 40 && hi / lo > 1.001; k++) {
    const mid = Math.sqrt(lo * hi);
    if (predict(build(mid)).growthRate > 0) hi = mid;
    else lo = mid;
  }
  return Math.sqrt(lo * hi);
}

function twinT(req: DesignResult["request"], required: number): Sizing {
  const { frequency: f, capacitor: c, series } = req;
  const kTarget = 0.45;
  const omega = twinTCrossing(kTarget);
  const ideal = omega / (2 * Math.PI * f * c);
  const r = snapToSeries(ideal, series);
  const rs = snapToSeries(kTarget * r, series);
  const rin = snapToSeries(4.2 * r, series);
  const rf1 = snapToSeries(32 * rin, series);
  const rp2 = 1e3;
  // The divider is set from the snapped network itself: the positive feedback at which the
  // loop would just start with the diodes fully conducting (Rf2 shorted), found by bisection on
  // the poles, and 80 % of it — so the diodes, not the rails, settle the amplitude.
  const threshold = startThreshold((beta) => twinTLines(r, rs, c, rin, rf1, 1e-3, rp2 * (1 / beta - 1), rp2, req), 1e-4, 0.3);
  const rp1 = snapToSeries(rp2 * (1 / (0.8 * threshold) - 1), series);
  const lines = (rf2: number) => twinTLines(r, rs, c, rin, rf1, rf2, rp1, rp2, req);
  const picked = raiseUntilStarts(lines, 4 * rin, series, required);
  const chosen = picked.lines;
  const rf2 = picked.value;
  return {
    lines: chosen,
    probe: "o",
    formulaFrequency: (twinTCrossing(rs / r) / (2 * Math.PI * r * c)),
    choices: [
      { part: "Ra, Rb", ideal, chosen: r, unit: "Ω" },
      { part: "Rs", ideal: kTarget * ideal, chosen: rs, unit: "Ω" },
      { part: "Ca, Cb, Cs1, Cs2", ideal: c, chosen: c, unit: "F" },
    ],
    gainNote: `inverting gain (Rf1 + Rf2)/Rin = ${((rf1 + rf2) / rin).toFixed(1)}, ${(rf1 / rin).toFixed(1)} with the diodes conducting; divider Rp1/Rp2 = ${writeValue(rp1)}/${writeValue(rp2)} (positive feedback ${((rp2 / (rp1 + rp2)) * 100).toFixed(2)} %)`,
    thdLimit: 0.01,
    runs: 100,
    description: [
      "Twin-T notch (R, R with 2C; C, C with k·R, k = 0.45) from the output into an inverting stage.",
      "With k under ½ the network reaches −180° at Ω = ωRC = 1.0274, the root of k(2k+1)Ω⁴ + k(1−2k)Ω² = 1;",
      "a divider on the non-inverting input adds positive feedback for the start margin.",
    ],
  };
}

/** A measured value with a prefix and a space before its unit (`8.599 V`, `74.29 ms`). */
function quantity(value: number, unit: string): string {
  const { mantissa, prefix } = withPrefix(value);
  return `${mantissa} ${prefix}${unit}`;
}

/** The header line of the simulated start-up: what the file settles at, which the target is judged on. */
function simulatedLine(sim: SimulatedStartup | null, pct: (x: number) => string): string[] {
  if (!sim) return [];
  if (sim.verdict !== "settled" || sim.frequency === null || sim.error === null) return [`simulated start-up of this file: ${sim.verdict}, no settled frequency`];
  const parts = [
    `settles at ${sim.frequency.toFixed(2)} Hz (${pct(sim.error)} from the target)`,
    ...(sim.amplitude === null ? [] : [`${quantity(sim.amplitude, "V")} peak`]),
    ...(sim.thd === null ? [] : [`THD ${Number((sim.thd * 100).toPrecision(3))} %`]),
    ...(sim.startupTime === null ? [] : [`90 % reached at ${quantity(sim.startupTime, "s")}`]),
  ];
  return [`simulated start-up of this file: ${parts.join(", ")}`];
}

function designedFile(result: Omit<DesignResult, "file">, sizing: Sizing): DesignedFile {
  const { request: req } = result;
  const pct = (x: number) => `${(x * 100).toFixed(2)} %`;
  const header = [
    `Designed by onset design ${req.topology} for ${writeValue(req.frequency)}Hz (${req.series}, op-amp preset ${req.preset}${req.limit === "diodes" ? "" : `, --limit ${req.limit}`}).`,
    ...sizing.description,
    "",
    ...result.choices.map((ch) =>
      ch.ideal === ch.chosen
        ? `${ch.part}: ${writeValue(ch.chosen)}${ch.unit === "Ω" ? "Ω" : "F"}`
        : `${ch.part}: ideal ${writeValue(ch.ideal)}Ω → ${writeValue(ch.chosen)}Ω (${req.series}, nearest in the log sense)`,
    ),
    `formula with the snapped values: ${result.formulaFrequency.toFixed(2)} Hz`,
    `small-signal poles of the snapped circuit (the start): ${result.predicted.frequency.toFixed(2)} Hz (${pct(result.error)} from the target), growth ${result.predicted.growthRate.toFixed(1)} 1/s`,
    ...simulatedLine(result.simulated, pct),
    ...(req.limit === "diodes"
      ? [
          `gain: ${sizing.gainNote};`,
          `chosen so the envelope grows ${STARTUP_GROWTH.toFixed(1)} time constants (from thermal noise to volts) in ${writeValue(req.startupTime)}s: estimate ${writeValue(result.startupEstimate)}s.`,
        ]
      : [`gain: ${sizing.gainNote}.`]),
  ];
  // Four significant digits, as the header writes its values.
  const startupLimit = Number(Math.max(1.5 * req.startupTime, 2 * result.startupEstimate).toPrecision(4));
  return {
    header,
    title: `${req.topology} oscillator, ${writeValue(req.frequency)}Hz`,
    parts: sizing.lines,
    analyses: [
      { keyword: "startup", options: [["probe", sizing.probe], ["until", sizing.until === undefined ? "auto" : sizing.until]] },
      { keyword: "poles" },
      { keyword: "tolerance", options: [["runs", sizing.runs], ["seed", 1], ["dist", "normal"]] },
    ],
    spec: [
      { metric: "frequency", test: "within", value: req.frequency, tolerance: 0.05 },
      { metric: "thd", test: "below", value: sizing.thdLimit, percent: true },
      { metric: "startup", test: "below", value: startupLimit },
      { metric: "yield", test: "above", value: 0.9, percent: true },
    ],
  };
}

/**
 * Designs an RC oscillator for a target frequency: picks the capacitor (unless given), snaps the
 * resistors to an E-series, chooses the gain network so the snapped circuit starts within the
 * requested time (checked on its poles), and writes a ready-to-run circuit file; with
 * `options.simulate`, runs the file's start-up and reports its settled frequency beside the poles.
 */
export function designOscillator(request: DesignRequest, options: DesignOptions = {}): DesignResult {
  checkDesignRequest("designOscillator", request, options);
  const f = request.frequency;
  if (!(f > 0) || !Number.isFinite(f)) throw inputError("out-of-range", `design needs a positive frequency, got ${f} Hz`, { hint: "e.g. --freq 2.5k" });
  if (request.capacitor !== undefined && !(request.capacitor > 0 && Number.isFinite(request.capacitor))) {
    throw inputError("out-of-range", `design needs a positive capacitor, got ${request.capacitor} F`, { hint: "e.g. --cap 4.7n" });
  }
  const preset = request.preset ?? "general";
  if (!builtinPresets.opamp?.[preset]) {
    throw inputError("unknown-preset", `unknown op-amp preset '${preset}'${didYouMean(preset, Object.keys(builtinPresets.opamp ?? {}))}`, { hint: `use one of ${Object.keys(builtinPresets.opamp ?? {}).join(", ")}` });
  }
  // The frequency each topology's formula gives for R and C (twin-T at k = 0.45).
  const scale = request.topology === "wien" ? 1 : request.topology === "phase-shift" ? 1 / Math.sqrt(6) : twinTCrossing(0.45);
  const series = request.series ?? "E24";
  const base = {
    topology: request.topology,
    frequency: f,
    series,
    preset,
    startupTime: request.startupTime ?? 200 / f,
    rails: request.rails ?? ([-12, 12] as const),
    limit: request.limit ?? "diodes",
  };
  if (base.limit !== "diodes" && base.topology !== "wien") {
    throw inputError("bad-limit", `design: --limit ${base.limit} is for the Wien bridge; ${base.topology} limits with diodes`, { hint: `use onset design wien --limit ${base.limit}, or leave --limit out` });
  }
  if (!AMPLITUDE_LIMITS.includes(base.limit)) {
    throw inputError("bad-limit", `design: unknown amplitude limit '${base.limit}'${didYouMean(base.limit, AMPLITUDE_LIMITS)}`, { hint: `choose one of ${AMPLITUDE_LIMITS.join(", ")}` });
  }
  const required = STARTUP_GROWTH / base.startupTime;
  const size = (c: number) => {
    const req = { ...base, capacitor: c };
    return { req, sizing: req.topology === "wien" ? wien(req, required) : req.topology === "phase-shift" ? phaseShift(req, required) : twinT(req, required) };
  };
  const frequencyWith = (r: number, c: number) => scale / (2 * Math.PI * r * c);
  const best = size(request.capacitor ?? chooseCapacitor((c) => scale / (2 * Math.PI * f * c), frequencyWith, f, series));
  const { req, sizing } = best;
  const predicted = predict(sizing.lines);
  const short = predicted.growthRate < required;
  const notes = [
    `capacitor ${writeValue(req.capacitor)}F ${request.capacitor === undefined ? "chosen from the E6 values: of those that put the resistors between 2 kΩ and 50 kΩ, the one whose snapped resistors land the formula nearest the target" : "as given"}`,
    ...sizing.choices.filter((c) => c.ideal !== c.chosen).map((c) => `${c.part}: ideal ${writeValue(c.ideal)}Ω, snapped to ${writeValue(c.chosen)}Ω (${req.series})`),
    sizing.gainNote,
    ...(short ? [`the gain network reached only ${predicted.growthRate.toFixed(1)} 1/s of the ${required.toFixed(1)} 1/s a ${writeValue(req.startupTime)}s start-up needs`] : []),
  ];
  const partial = {
    request: req,
    choices: sizing.choices,
    formulaFrequency: sizing.formulaFrequency,
    predicted,
    error: predicted.frequency / f - 1,
    startupEstimate: STARTUP_GROWTH / predicted.growthRate,
    notes,
  };
  if (!options.simulate) return { ...partial, simulated: null, file: designedFile({ ...partial, simulated: null }, sizing) };
  // The header lines do not change the circuit, so the file is simulated before its header says how it ran.
  const run = options.simulate(designedFile({ ...partial, simulated: null }, sizing));
  checkSimulated("designOscillator", run);
  const simulated: SimulatedStartup = {
    verdict: run.verdict,
    frequency: run.frequency,
    amplitude: run.amplitude,
    thd: run.thd,
    startupTime: run.startupTime,
    error: run.frequency === null ? null : run.frequency / f - 1,
  };
  return { ...partial, simulated, file: designedFile({ ...partial, simulated }, sizing) };
}

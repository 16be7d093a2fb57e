import type { OptionSpec, ParsedArgs } from "../args.js";
import { LIMIT_HELP } from "../input/limits.js";
import { checkCommand } from "./check.js";
import type { CommandContext } from "./context.js";
import { designCommand } from "./design.js";
import { formatCommand } from "./format.js";
import { mergeCommand } from "./merge.js";
import { runCommand } from "./run.js";

/** A command: its usage line, what it does, its options and how many positional words it takes. */
export interface CommandSpec {
  readonly name: string;
  readonly usage: string;
  readonly summary: string;
  readonly details: readonly string[];
  readonly options: readonly OptionSpec[];
  readonly positionals: { readonly min: number; readonly max: number; readonly name: string };
  readonly action: (ctx: CommandContext, args: ParsedArgs) => number | Promise<number>;
}

const common: OptionSpec[] = [
  { name: "quiet", short: "q", summary: "print no report or notes; errors and the exit status only" },
  { name: "no-color", summary: "plain text without colour (also when NO_COLOR is set)" },
  { name: "debug", summary: "show the stack trace of an internal error" },
  { name: "help", short: "h", summary: "show this help" },
];

const json: OptionSpec = { name: "json", summary: "print exactly one JSON document on stdout (errors too)" };
const set: OptionSpec = { name: "set", value: "NAME=VALUE", repeat: true, summary: "override a parameter, part value or part option (repeatable)" };
const csv: OptionSpec = { name: "csv", value: "FILE", summary: "write the data as CSV (several analyses: FILE, FILE-2, …; - for stdout)" };
const svg: OptionSpec = { name: "svg", value: "FILE", summary: "write a plot as SVG (several analyses: FILE, FILE-2, …; - for stdout)" };
const html: OptionSpec = { name: "html", value: "FILE", summary: "write the whole report as one HTML page: tables and zoomable plots, nothing fetched" };

const limit: OptionSpec = { name: "limit", value: "NAME=VALUE", repeat: true, summary: LIMIT_HELP };
const includeRoot: OptionSpec = { name: "include-root", value: "DIR", repeat: true, summary: "also let includes read files below DIR (by default only the file's own folder tree)" };

/** How every command writes its outputs (help text shared by the commands that write). */
const OUTPUTS: readonly string[] = [
  "Outputs: - is standard output (the text report then goes to stderr; --json cannot share it).",
  "A regular file is replaced atomically; through a symlink, the real file is (the link stays).",
  "A pipe, a FIFO, a terminal or /dev/fd/N is written directly, never replaced; it takes one",
  "document, so a run with several analyses needs a file name there. Every output path is",
  "checked before any work starts: a missing folder or a folder given as FILE is exit status 2.",
];

/** Every command, in the order help lists them. */
export const COMMANDS: readonly CommandSpec[] = [
  {
    name: "run",
    usage: "onset run FILE [options]",
    summary: "run every analysis in FILE and report the results",
    details: [
      "FILE may be - to read the circuit from standard input.",
      "A file with a tolerance analysis runs the Monte Carlo study, with a sweep the sweep and its",
      "start threshold, with both the design window (yield at each setting). Study samples are",
      "appended to a results file as they finish (by default NAME.results.jsonl beside FILE);",
      "--resume keeps its whole samples and reruns the rest, a cut-off last line included.",
      "",
      "--watch runs again whenever FILE or one of its includes is saved, rewriting the outputs;",
      "errors in the file are shown and watching goes on. Ctrl-C stops it.",
      "",
      "Limits: --time-limit bounds the wall time of the simulation (a study included); --limit",
      "sets the others (see the language reference, Limits). A limit that runs out is exit status 3.",
      "",
      ...OUTPUTS,
      "",
      "Exit status: 0 done and every spec met, 1 a spec not met, 2 bad input, usage or an",
      "output that cannot be written, 3 the simulation failed.",
    ],
    options: [
      json,
      csv,
      svg,
      html,
      set,
      { name: "jobs", value: "N", summary: "jobs at once for a tolerance study and the further seeds of seeds=N: N − 1 worker threads and the main one (default: the number of cores)" },
      { name: "shard", value: "k/n", summary: "run only slice k (from 0) of n of the study; env:NAME/n reads k from $NAME" },
      { name: "results", value: "FILE", summary: "the study's results file (JSON Lines; a pipe or - streams it)" },
      { name: "resume", summary: "continue the study in the results file, running only missing samples" },
      { name: "sample", value: "I", summary: "rerun sample I of the tolerance study alone, with full reports and plots (under measure=steady, the study's own figures for it first)" },
      { name: "nominal", summary: "run the file's analyses once, without its sweep or tolerance study" },
      { name: "watch", summary: "run again each time FILE or an include is saved, until Ctrl-C" },
      { name: "time-limit", value: "SECONDS", summary: "stop the simulation after this much wall time (e.g. 30, 500m)" },
      limit,
      includeRoot,
      ...common,
    ],
    positionals: { min: 1, max: 1, name: "FILE" },
    action: runCommand,
  },
  {
    name: "check",
    usage: "onset check FILE [options]",
    summary: "parse and validate FILE without simulating",
    details: ["Reports every problem found, with its line and a caret. Exit status 0 when the file is valid, 2 when not."],
    options: [json, set, limit, includeRoot, ...common],
    positionals: { min: 1, max: 1, name: "FILE" },
    action: checkCommand,
  },
  {
    name: "format",
    usage: "onset format FILE [--write]",
    summary: "print FILE in the canonical layout",
    details: [
      "Aligns part columns, one blank line between sections, comments kept.",
      "With --write FILE is replaced atomically; a symlink's real file is, and the link stays.",
    ],
    options: [{ name: "write", short: "w", summary: "replace FILE with the canonical layout (atomically)" }, limit, ...common],
    positionals: { min: 1, max: 1, name: "FILE" },
    action: formatCommand,
  },
  {
    name: "design",
    usage: "onset design (wien|twin-t|phase-shift) --freq F [options]",
    summary: "write a ready-to-run oscillator file for a frequency",
    details: [
      "Resistors snap to the chosen IEC 60063 series (default E24) at the nearest value in the log sense:",
      "between neighbours a < b the boundary is √(ab). Without --cap the capacitor comes from the E6 values.",
      "The gain network is sized on the poles of the snapped circuit so that it starts within --startup;",
      "then the file's start-up is simulated, and its header (and a note on stderr) gives the frequency it",
      "settles at beside the poles' prediction. The file is printed on stdout unless --output is given.",
      "--limit lamp|thermistor|jfet holds a Wien bridge's amplitude with a filament lamp, an NTC bead or a",
      "JFET loop instead of diodes: the gain network is sized so the cold start gain lies between 3 and 4",
      "and the settled amplitude (the closed form where the gain is exactly 3) fits the rails.",
      "",
      ...OUTPUTS,
    ],
    options: [
      { name: "freq", value: "F", summary: "the oscillation frequency, e.g. 1k or 440Hz" },
      { name: "cap", value: "C", summary: "the capacitor to design around, e.g. 33n" },
      { name: "series", value: "E12|E24|E96", summary: "the resistor series values snap to" },
      { name: "preset", value: "NAME", summary: "the op-amp preset to use" },
      { name: "startup", value: "T", summary: "the start-up time to size the gain for (default: 200 periods)" },
      { name: "limit", value: "diodes|lamp|thermistor|jfet", summary: "how the Wien bridge holds its amplitude (default diodes; the others: wien only)" },
      { name: "output", short: "o", value: "FILE", summary: "write the circuit file instead of printing it" },
      json,
      ...common,
    ],
    positionals: { min: 1, max: 1, name: "TOPOLOGY" },
    action: designCommand,
  },
  {
    name: "merge",
    usage: "onset merge RESULTS... [options]",
    summary: "combine results files of a sharded or resumed study into one report",
    details: [
      "The report is the one a single run of the whole study prints, byte for byte. A file whose",
      "last line was cut off (an interrupted run) is merged without it, with a warning (file:line);",
      "the merge still needs every sample of the study.",
      "",
      ...OUTPUTS,
    ],
    options: [json, csv, svg, html, { name: "results", value: "FILE", summary: "also write the merged results file" }, ...common],
    positionals: { min: 1, max: Infinity, name: "RESULTS" },
    action: mergeCommand,
  },
];

/** The command named `name`, if any. */
export function commandNamed(name: string): CommandSpec | undefined {
  return COMMANDS.find((c) => c.name === name);
}

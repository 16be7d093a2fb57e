import { usageError } from "../cli-error.js";
import { readTextFile } from "../input/source.js";
import type { OutputTarget } from "../output/target.js";
import { openOutput, type OutputStream, type StdoutWriter } from "../output/write.js";
import type { StoredSample, StudyHeader } from "./header.js";

/** The cut-off last line of a results file: where it is and, when its start shows it, whose sample it held. */
export interface CutLine {
  /** 1-based line number in the file. */
  readonly line: number;
  /** The sample index the line began with, or null when too little of it is left to tell. */
  readonly index: number | null;
  /** The sweep setting (design window) the line began with, if any. */
  readonly point: number | null;
}

/** A results file as read back. */
export interface ResultsContent {
  readonly header: StudyHeader;
  readonly samples: readonly StoredSample[];
  /** The 1-based line of each sample in the file, in the order of `samples`. */
  readonly lines: readonly number[];
  /** The last line when it was cut off (an interrupted run); it is left out. Null when the file ends cleanly. */
  readonly truncated: CutLine | null;
}

/** Reads what a cut-off sample line still shows of its start: `{"point":1,"index":17,…` or `{"index":17,…`. */
function cutLine(text: string, line: number): CutLine {
  const match = /^\{(?:"point":(\d+),)?"index":(\d+)[,}]/.exec(text);
  return { line, index: match ? Number(match[2]) : null, point: match?.[1] !== undefined ? Number(match[1]) : null };
}

/** The sample a cut-off line held, in words: `sample 3`, `sample 3 of setting 1`, or `the sample on it`. */
export function cutSample(cut: CutLine): string {
  if (cut.index === null) return "the sample on it";
  return `sample ${cut.index}${cut.point === null ? "" : ` of setting ${cut.point}`}`;
}

function isHeader(value: unknown): value is StudyHeader {
  return typeof value === "object" && value !== null && (value as { onset?: unknown }).onset === "tolerance-results";
}

/**
 * Reads a results file: the header line, then one sample per line. A last line that does not
 * parse or lacks its newline (cut off by an interruption) is left out and returned as
 * `truncated`, for the caller to report; a bad line anywhere else is an error.
 */
export function readResults(path: string, shown = path): ResultsContent {
  const text = readTextFile(path, "results file", shown);
  const lines = text.split("\n");
  if (lines[lines.length - 1] === "") lines.pop();
  const endsCleanly = text.endsWith("\n");
  let header: unknown;
  try {
    header = JSON.parse(lines[0] ?? "");
  } catch {
    header = undefined;
  }
  if (!isHeader(header)) {
    throw usageError("bad-results", `'${shown}' is not an onset results file`, "results files are written by onset run on a file with a tolerance analysis");
  }
  if (header.version !== 1) throw usageError("bad-results", `'${shown}' is a results file of version ${String(header.version)}; this onset reads version 1`);
  const samples: StoredSample[] = [];
  const sampleLines: number[] = [];
  let truncated: CutLine | null = null;
  for (let k = 1; k < lines.length; k++) {
    const last = k === lines.length - 1;
    let sample: StoredSample | undefined;
    try {
      sample = JSON.parse(lines[k]!) as StoredSample;
    } catch {
      sample = undefined;
    }
    const valid = sample !== undefined && typeof sample === "object" && sample !== null && Number.isInteger(sample.index);
    if (valid && (!last || endsCleanly)) {
      samples.push(sample!);
      sampleLines.push(k + 1);
    }
    else if (last) truncated = cutLine(lines[k]!, k + 1);
    else throw usageError("bad-results", `${shown}:${k + 1}: the line is not a sample`, "delete the file and run the study again");
  }
  return { header, samples, lines: sampleLines, truncated };
}

/**
 * Appends samples to a results file one line each, as they finish. The target was classified
 * before the study started (`outputTarget`): a file is started afresh atomically, a pipe or a
 * device is written as a stream.
 */
export class ResultsWriter {
  private stream: OutputStream | undefined;
  constructor(
    readonly target: OutputTarget,
    private readonly stdout: StdoutWriter,
  ) {}

  /** Starts the file afresh with the header and any samples kept from before. */
  start(header: StudyHeader, kept: readonly StoredSample[]): void {
    this.stream = openOutput(this.target, [header, ...kept].map((line) => `${JSON.stringify(line)}\n`).join(""), this.stdout);
  }

  append(sample: StoredSample): void {
    if (this.stream === undefined) throw new Error("ResultsWriter.append: start() first");
    this.stream.append(`${JSON.stringify(sample)}\n`);
  }

  close(): void {
    const stream = this.stream;
    this.stream = undefined;
    stream?.close();
  }
}

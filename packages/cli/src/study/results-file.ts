import { closeSync, existsSync, openSync, writeSync } from "node:fs";
import { writeFileAtomic } from "../atomic.js";
import { usageError } from "../cli-error.js";
import { readTextFile } from "../input/source.js";
import type { StoredSample, StudyHeader } from "./header.js";

/** A results file as read back. */
export interface ResultsContent {
  readonly header: StudyHeader;
  readonly samples: readonly StoredSample[];
  /** True when the last line was cut off (an interrupted run); it is left out. */
  readonly truncated: boolean;
}

function isHeader(value: unknown): value is StudyHeader {
  return typeof value === "object" && value !== null && (value as { onset?: unknown }).onset === "tolerance-results";
}

/**
 * Reads a results file: the header line, then one sample per line. A last line that does not
 * parse (cut off by an interruption) is ignored; a bad line anywhere else is an error.
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
    throw usageError("bad-results", `'${path}' is not an onset results file`, "results files are written by onset run on a file with a tolerance analysis");
  }
  if (header.version !== 1) throw usageError("bad-results", `'${path}' is a results file of version ${String(header.version)}; this onset reads version 1`);
  const samples: StoredSample[] = [];
  let truncated = false;
  for (let k = 1; k < lines.length; k++) {
    const last = k === lines.length - 1;
    let sample: StoredSample | undefined;
    try {
      sample = JSON.parse(lines[k]!) as StoredSample;
    } catch {
      sample = undefined;
    }
    const valid = sample !== undefined && typeof sample === "object" && sample !== null && Number.isInteger(sample.index);
    if (valid && (!last || endsCleanly)) samples.push(sample!);
    else if (last) truncated = true;
    else throw usageError("bad-results", `'${path}' line ${k + 1} is not a sample`, "delete the file and run the study again");
  }
  return { header, samples, truncated };
}

/** Appends samples to a results file one line each, as they finish. */
export class ResultsWriter {
  private fd: number | undefined;
  constructor(readonly path: string) {}

  /** Starts the file afresh (atomically) with the header and any samples kept from before. */
  start(header: StudyHeader, kept: readonly StoredSample[]): void {
    writeFileAtomic(this.path, [header, ...kept].map((line) => `${JSON.stringify(line)}\n`).join(""));
    this.fd = openSync(this.path, "a");
  }

  append(sample: StoredSample): void {
    if (this.fd === undefined) throw new Error("ResultsWriter.append: start() first");
    writeSync(this.fd, `${JSON.stringify(sample)}\n`);
  }

  close(): void {
    if (this.fd !== undefined) closeSync(this.fd);
    this.fd = undefined;
  }
}

export function resultsExist(path: string): boolean {
  return existsSync(path);
}

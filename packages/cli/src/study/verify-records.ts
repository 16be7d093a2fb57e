import { drawSample, shardIndices } from "@onset/core";
import { usageError } from "../cli-error.js";
import { sampleKey, type StoredSample, type StudyHeader } from "./header.js";

/** A sample record with where it was read. */
interface Placed {
  readonly sample: StoredSample;
  readonly line: number;
}

function refuse(file: string, line: number, message: string): never {
  throw usageError("results-tampered", `${file}:${line}: ${message}`, "the record was edited or belongs to another study: run the study (or that shard) again, or rerun the sample with onset run FILE --sample I");
}

/**
 * Checks every sample record of one results file against its header before a merge trusts it:
 * the index is a whole number within the study's runs and within the file's shard, the sweep
 * setting within the sweep, no sample appears twice, and the drawn values are the ones the
 * seed draws for that index (re-derived here; in a design window, where the nominals move
 * with the swept setting, the names of the drawn values are checked). The first record that
 * fails is refused naming the file and line.
 */
export function verifyRecords(file: string, header: StudyHeader, samples: readonly StoredSample[], lines: readonly number[]): void {
  const inShard = header.shard ? new Set(shardIndices(header.runs, header.shard)) : null;
  const settings = header.sweep?.values.length ?? null;
  const targets = header.tolerances.map((t) => t.target);
  const seen = new Map<string, number>();
  samples.forEach((sample, k) => verifyOne(file, header, { sample, line: lines[k] ?? 0 }, inShard, settings, targets, seen));
}

function verifyOne(file: string, header: StudyHeader, { sample, line }: Placed, inShard: ReadonlySet<number> | null, settings: number | null, targets: readonly string[], seen: Map<string, number>): void {
  const i = sample.index;
  if (!(Number.isSafeInteger(i) && i >= 0 && i < header.runs)) refuse(file, line, `sample index ${String(i)} is not one of the study's ${header.runs} runs (0 to ${header.runs - 1})`);
  if (inShard && !inShard.has(i)) refuse(file, line, `sample ${i} does not belong to shard ${header.shard!.index}/${header.shard!.count} named in the file's header`);
  if (settings !== null) {
    const p = sample.point;
    if (!(Number.isSafeInteger(p) && p! >= 0 && p! < settings)) refuse(file, line, `sample ${i}'s sweep setting ${String(p)} is not one of the sweep's ${settings} settings`);
  } else if (sample.point !== undefined) refuse(file, line, `sample ${i} names a sweep setting, but the study has no sweep`);
  const key = sampleKey(sample);
  const before = seen.get(key);
  if (before !== undefined) refuse(file, line, `sample ${i} appears twice in the file (first on line ${before})`);
  seen.set(key, line);
  const drawn = sample.drawn as Record<string, unknown> | undefined;
  const names = typeof drawn === "object" && drawn !== null ? Object.keys(drawn) : null;
  if (names === null || names.length !== targets.length || names.some((n, k) => n !== targets[k])) {
    refuse(file, line, `sample ${i}'s drawn values (${names?.join(", ") ?? "none"}) are not the study's toleranced values (${targets.join(", ")})`);
  }
  if (settings !== null) return;
  const expected = drawSample(header.tolerances.map(({ unit: _unit, ...t }) => t), header.seed, i, header.dist);
  for (const target of targets) {
    const got = drawn![target];
    if (got !== expected[target]) {
      refuse(file, line, `sample ${i}'s drawn ${target} = ${String(got)} is not what seed ${header.seed} draws for it (${expected[target]})`);
    }
  }
}

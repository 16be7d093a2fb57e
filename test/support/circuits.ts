import type { AnalysisSpec, Circuit, OptionValue, PartSpec } from "@onset/core";

/** A part written as in the language: kind, name, nodes, optional value and options. */
export function part(kind: string, name: string, nodes: string[], value?: number, options: Record<string, OptionValue> = {}): PartSpec {
  return value === undefined ? { kind, name, nodes, options } : { kind, name, nodes, value, options };
}

export function circuit(parts: PartSpec[], analyses: AnalysisSpec[] = []): Circuit {
  return { parts, analyses, tolerances: [] };
}

/**
 * Value of a sampled signal at time `t` by the cubic through the four nearest samples
 * (Lagrange form); used to read a waveform between accepted points.
 */
export function sampleAt(time: ArrayLike<number>, values: ArrayLike<number>, t: number): number {
  let lo = 0;
  let hi = time.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (time[mid]! <= t) lo = mid;
    else hi = mid;
  }
  const start = Math.max(0, Math.min(time.length - 4, lo - 1));
  let sum = 0;
  for (let i = start; i < start + 4; i++) {
    let w = 1;
    for (let j = start; j < start + 4; j++) if (j !== i) w *= (t - time[j]!) / (time[i]! - time[j]!);
    sum += w * values[i]!;
  }
  return sum;
}

import type { Circuit, OptionValue, PartSpec } from "../circuit/circuit.js";

/**
 * The circuit with each periodic source (a sine, a pulse train) held at its mean level over a
 * period: the DC level about which it swings. A circuit that oscillates by itself beside its
 * sources has, so held, only its own oscillation left, whose orbit gives its period (see
 * `runSteady`'s driven search). The same object comes back when no source is periodic.
 */
export function heldDrives(circuit: Circuit): Circuit {
  let changed = false;
  const parts = circuit.parts.map((part) => {
    const level = meanLevel(part);
    if (level === null) return part;
    changed = true;
    return { ...part, value: level, options: {} };
  });
  return changed ? { ...circuit, parts } : circuit;
}

const num = (options: Readonly<Record<string, OptionValue>>, key: string, fallback: number): number => {
  const v = options[key];
  return typeof v === "number" ? v : fallback;
};

/** A periodic source's mean over one period (a sine's offset; a trapezoid's area over its period); null for any other part. */
function meanLevel(part: PartSpec): number | null {
  if (part.kind !== "vsource" && part.kind !== "isource") return null;
  const o = part.options;
  if (o.wave === "sine") return num(o, "freq", 0) > 0 ? num(o, "offset", 0) : null;
  const period = num(o, "period", Infinity);
  if (o.wave !== "pulse" || !Number.isFinite(period)) return null;
  const [low, high] = [num(o, "low", 0), num(o, "high", 0)];
  const busy = num(o, "width", Infinity) + (num(o, "rise", 0) + num(o, "fall", 0)) / 2;
  return low + ((high - low) * Math.min(busy, period)) / period;
}

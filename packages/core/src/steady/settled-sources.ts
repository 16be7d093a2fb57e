import type { Circuit, OptionValue, PartSpec } from "../circuit/circuit.js";

/**
 * The circuit as its sources leave it for good, which is what a periodic steady state is of: a
 * one-shot pulse (no period=) or a steps wave holds its last level and becomes that DC level; a
 * noise source with a stop= time is gone (0); a sine or a pulse train that starts after a delay
 * is the same wave from t = 0, its delay folded into its phase (a pulse train's delay taken
 * modulo its period). Without this a supply switched on at 1 ms leaves an unpowered bias point
 * ("does not oscillate") and a sine delayed past the approach leaves an undriven one. The same
 * circuit object comes back when no source changes, so such circuits run exactly as before.
 */
export function settledSources(circuit: Circuit): Circuit {
  let changed = false;
  const parts = circuit.parts.map((part) => {
    const settled = settledSource(part);
    if (settled !== part) changed = true;
    return settled;
  });
  return changed ? { ...circuit, parts } : circuit;
}

const num = (options: Readonly<Record<string, OptionValue>>, key: string, fallback: number): number => {
  const v = options[key];
  return typeof v === "number" ? v : fallback;
};

function settledSource(part: PartSpec): PartSpec {
  if (part.kind !== "vsource" && part.kind !== "isource") return part;
  const o = part.options;
  const dc = (level: number): PartSpec => ({ ...part, value: level, options: {} });
  switch (o.wave) {
    case "sine": {
      const delay = num(o, "delay", 0);
      if (!(delay > 0)) return part;
      const turns = num(o, "freq", 0) * delay;
      // The phase the wave has at t = 0 once started at −(whole turns before `delay`) instead.
      const phase = num(o, "phase", 0) - 2 * Math.PI * (turns - Math.floor(turns));
      return { ...part, options: { ...o, delay: 0, phase } };
    }
    case "pulse": {
      const delay = num(o, "delay", 0);
      const period = num(o, "period", Infinity);
      if (Number.isFinite(period)) return delay >= period ? { ...part, options: { ...o, delay: delay % period } } : part;
      const busy = num(o, "rise", 0) + num(o, "width", Infinity) + num(o, "fall", 0);
      return dc(num(o, Number.isFinite(busy) ? "low" : "high", 0));
    }
    case "steps": {
      const points = o.points;
      return Array.isArray(points) && points.length >= 2 ? dc(points[points.length - 1] as number) : part;
    }
    case "noise":
      return Number.isFinite(num(o, "stop", Infinity)) ? dc(0) : part;
    default:
      return part;
  }
}

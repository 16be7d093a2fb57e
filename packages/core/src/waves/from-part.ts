import type { PartSpec } from "../circuit/circuit.js";
import { inputError } from "../circuit/diagnostic.js";
import type { PartKindSchema } from "../circuit/schema.js";
import type { PowerOn } from "../devices/device.js";
import { numberOption } from "../devices/options.js";
import { noiseWave } from "./noise.js";
import { rampedDc } from "./power-on.js";
import { pulseWave } from "./pulse.js";
import { sineWave } from "./sine.js";
import { stepsWave } from "./steps.js";
import { constantWave, type Wave } from "./wave.js";

/**
 * The waveform a source part describes: its `wave=` variant, else its DC value (default 0).
 * Powering on, the DC values rise over the ramp: a DC source's value and a sine's offset (the
 * other waves are explicit functions of time and are kept as written).
 */
export function waveFromPart(part: PartSpec, schema: PartKindSchema, powerOn?: PowerOn): Wave {
  const kind = part.options.wave;
  const num = (key: string) => numberOption(part, schema, key, kind as string);
  switch (kind) {
    case undefined: {
      const level = part.value ?? 0;
      return powerOn ? rampedDc(constantWave(level), level, powerOn) : constantWave(level);
    }
    case "sine": {
      const offset = num("offset");
      const sine = sineWave({ amp: num("amp"), freq: num("freq"), offset, phase: num("phase"), delay: num("delay") });
      return powerOn ? rampedDc(sine, offset, powerOn) : sine;
    }
    case "pulse": {
      const [rise, width, fall, period] = [num("rise"), num("width"), num("fall"), num("period")];
      const busy = rise + width + fall;
      if (Number.isFinite(busy) && Number.isFinite(period) && busy > period * (1 + 1e-12)) {
        throw inputError("out-of-range", `${part.kind} ${part.name}: rise + width + fall (${busy} s) is longer than the period (${period} s)`, {
          span: part.span,
          hint: "shorten width= or the edges: width = period − rise − fall leaves no time at low; width=0 with rise + fall = period is a triangle",
        });
      }
      return pulseWave({ low: num("low"), high: num("high"), delay: num("delay"), rise, fall, width, period });
    }
    case "steps": {
      const points = part.options.points;
      if (!Array.isArray(points) || points.length < 2 || points.length % 2 !== 0) {
        throw inputError("bad-points", `${part.kind} ${part.name}: points= needs time–level pairs`, { span: part.span });
      }
      const n = points.length / 2;
      const times = new Float64Array(n);
      const levels = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        times[i] = points[2 * i] as number;
        levels[i] = points[2 * i + 1] as number;
        if (i > 0 && !(times[i]! >= times[i - 1]!)) {
          throw inputError("bad-points", `${part.kind} ${part.name}: point times must not decrease (${times[i - 1]} s then ${times[i]} s)`, {
            span: part.span,
            hint: "list the points in time order",
          });
        }
      }
      return stepsWave(times, levels);
    }
    case "noise":
      return noiseWave({ rms: num("rms"), seed: num("seed"), corner: num("corner"), stop: num("stop"), stream: part.name });
    default:
      throw inputError("unknown-wave", `${part.kind} ${part.name}: unknown wave '${String(kind)}'`, {
        span: part.span,
        hint: "use wave=sine, pulse, steps or noise",
      });
  }
}

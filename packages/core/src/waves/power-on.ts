import { powerOnLevel, type PowerOn } from "../devices/device.js";
import type { Wave } from "./wave.js";

/**
 * A wave whose DC part `dc` rises with the power-on ramp: the level is wave(t) − dc + dc·r(t),
 * with r(t) = min(t/ramp, 1), and the end of the ramp is a corner to land on.
 */
export function rampedDc(wave: Wave, dc: number, powerOn: PowerOn): Wave {
  if (dc === 0) return wave;
  const end = powerOn.ramp;
  return {
    value: (t, left) => wave.value(t, left) + dc * (powerOnLevel(powerOn, t) - 1),
    nextBreakpoint: (t) => (t < end ? Math.min(end, wave.nextBreakpoint(t)) : wave.nextBreakpoint(t)),
    ...(wave.quietAfter === undefined ? {} : { quietAfter: Math.max(wave.quietAfter, end) }),
  };
}

import type { Device } from "../devices/device.js";
import { formatQuantity } from "../metrics/format.js";
import type { MnaSystem } from "../solver/system.js";

/** A state within this fraction of its output span from a limit sits at that limit. */
const AT_LIMIT = 0.01;

/** The output range (low, high) of a limiting amplifier at operating point x, else undefined. */
export function outputRange(_system: MnaSystem, device: Device, x: Float64Array): readonly [number, number] | undefined {
  const limits = device.outputLimits?.(x);
  return limits && limits.high > limits.low ? [limits.low, limits.high] : undefined;
}

/** Which limit, if any, a limiting amplifier's state sits at. */
function limitAt(device: Device, x: Float64Array): "upper" | "lower" | null {
  const limits = device.outputLimits?.(x);
  if (!limits || !(limits.high > limits.low)) return null;
  const margin = AT_LIMIT * (limits.high - limits.low);
  const value = x[limits.state]!;
  if (value >= limits.high - margin) return "upper";
  if (value <= limits.low + margin) return "lower";
  return null;
}

/**
 * The explanation of a latch-up, or null: an amplifier whose output ended the run at one of its
 * limits although its bias point lies inside them (`plain` and `run` share one unknown layout).
 */
export function latchedAt(run: MnaSystem, xEnd: Float64Array, plain: MnaSystem, xBias: Float64Array): string | null {
  for (let d = 0; d < run.devices.length; d++) {
    const device = run.devices[d]!;
    const side = limitAt(device, xEnd);
    if (side === null || limitAt(plain.devices[d]!, xBias) === side) continue;
    const limits = device.outputLimits!(xEnd);
    const level = side === "upper" ? limits.high : limits.low;
    return (
      `latched: ${device.part.name}'s output is stuck at its ${side} limit (${formatQuantity(level, "V")}) at the end of the run, ` +
      `though the bias point sits inside its range; the loop ran away and holds there instead of oscillating`
    );
  }
  return null;
}

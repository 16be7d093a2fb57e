import type { Diagnostic } from "../circuit/diagnostic.js";
import type { Device } from "../devices/device.js";
import { formatQuantity } from "../metrics/format.js";
import type { MnaSystem } from "../solver/system.js";
import type { TransientStepper } from "./stepper.js";

/**
 * Beyond these a part is far outside any physical operating point: a kiloampere through a
 * circuit part, or a junction forward-biased by tens of volts (a silicon junction conducts
 * hard at under 1 V), from memory of device data, rounded generously.
 */
export const IMPLAUSIBLE_CURRENT = 1e3;
/** Forward bias of a junction (V) beyond which it is reported; see {@link IMPLAUSIBLE_CURRENT}. */
export const IMPLAUSIBLE_JUNCTION_VOLTAGE = 50;

/**
 * A time-domain run checks its parts at every this many accepted steps (and at its first and last
 * points): a check evaluates every part's current, several times a step's own device work, so
 * checking every step would slow a small circuit's run by several per cent (at every 8th step
 * the twin-T start-up run took 0.7 % longer). An excursion to kiloamperes lasts many steps, as
 * the step control resolves it; one shorter than this many steps can pass unreported.
 */
export const CHECK_EVERY = 16;

/** A part far outside any physical operating point, and the warning that says so. */
export interface ImplausiblePart {
  readonly part: string;
  readonly diagnostic: Diagnostic;
}

function amps(value: number): string {
  return Math.abs(value) >= 1e6 ? `${value.toExponential(3)} A` : `${Number(value.toPrecision(4))} A`;
}

function warning(device: Device, why: string, where: string): ImplausiblePart {
  const part = device.part;
  const diagnostic: Diagnostic = {
    severity: "warning",
    stage: "simulation",
    code: "implausible-operation",
    message: `${part.kind} ${part.name} ${why} ${where}, far outside any physical operating point`,
    hint: "the figures follow from an idealised part: check its values (a diode's series=, a source's level) and what it is connected across",
    part: part.name,
    ...(part.span ? { span: part.span } : {}),
  };
  return { part: part.name, diagnostic };
}

/**
 * Watches the parts of a circuit over the states it is given (`check`) and keeps, per part, the
 * worst current and junction forward bias seen with their times; `warnings` names each part
 * that went beyond {@link IMPLAUSIBLE_CURRENT} or {@link IMPLAUSIBLE_JUNCTION_VOLTAGE}, once,
 * with its worst value. `observe` is a stepper observer that checks every CHECK_EVERY-th point.
 */
export class OperatingWatch {
  private readonly devices: readonly Device[];
  /** Per device: the unknowns of a diode's anode and cathode (−1: ground or not a diode). */
  private readonly anode: Int32Array;
  private readonly cathode: Int32Array;
  private readonly worstCurrent: Float64Array;
  private readonly currentAt: Float64Array;
  private readonly worstForward: Float64Array;
  private readonly forwardAt: Float64Array;
  private seen = 0;

  constructor(system: MnaSystem) {
    this.devices = system.devices.filter((d) => d.current !== undefined || d.part.kind === "diode");
    const node = (d: Device, pin: number): number => (d.part.kind === "diode" ? (system.nodeIndex.get(d.part.nodes[pin]!) ?? -1) : -1);
    this.anode = Int32Array.from(this.devices, (d) => node(d, 0));
    this.cathode = Int32Array.from(this.devices, (d) => node(d, 1));
    const m = this.devices.length;
    this.worstCurrent = new Float64Array(m);
    this.currentAt = new Float64Array(m);
    this.worstForward = new Float64Array(m).fill(-Infinity);
    this.forwardAt = new Float64Array(m);
  }

  /** A stepper observer: checks every CHECK_EVERY-th point it is shown. */
  readonly observe = (t: number, x: Float64Array, dxdt: Float64Array): void => {
    if (++this.seen % CHECK_EVERY === 0) this.check(t, x, dxdt);
  };

  /** Checks every part at the state (t, x) with rates dxdt. */
  check(t: number, x: Float64Array, dxdt: Float64Array): void {
    const { devices, anode, cathode, worstCurrent, worstForward } = this;
    for (let k = 0; k < devices.length; k++) {
      const d = devices[k]!;
      if (d.current !== undefined) {
        const i = d.current(x, dxdt, t);
        // NaN counts as worst, so a part whose current is not a number is reported.
        if (!(Math.abs(i) <= Math.abs(worstCurrent[k]!))) {
          worstCurrent[k] = i;
          this.currentAt[k] = t;
        }
      }
      if (anode[k]! >= 0 || cathode[k]! >= 0) {
        const forward = (anode[k]! >= 0 ? x[anode[k]!]! : 0) - (cathode[k]! >= 0 ? x[cathode[k]!]! : 0);
        if (forward > worstForward[k]!) {
          worstForward[k] = forward;
          this.forwardAt[k] = t;
        }
      }
    }
  }

  /**
   * One warning per part beyond the limits, `where` describing the run ("in the transient");
   * with `timed` the worst value's time is given.
   */
  warnings(where: string, timed = true): ImplausiblePart[] {
    const out: ImplausiblePart[] = [];
    const at = (t: number): string => (timed ? ` at t = ${formatQuantity(t, "s")}` : "");
    for (let k = 0; k < this.devices.length; k++) {
      const current = this.worstCurrent[k]!;
      const forward = this.worstForward[k]!;
      let why: string | undefined;
      if (!(Math.abs(current) <= IMPLAUSIBLE_CURRENT)) why = `carries ${amps(current)}${at(this.currentAt[k]!)}`;
      else if (forward > IMPLAUSIBLE_JUNCTION_VOLTAGE) why = `is forward-biased by ${Number(forward.toPrecision(4))} V${at(this.forwardAt[k]!)}`;
      if (why !== undefined) out.push(warning(this.devices[k]!, why, where));
    }
    return out;
  }
}

/**
 * Warnings (`implausible-operation`, naming the part, at its line) for every part whose state
 * at the solution `x` is far outside any physical operating point: such a result is what the
 * equations give for an idealised part (a diode with series=0 straight across a stiff source),
 * not what the circuit would do, and is reported rather than printed silently.
 */
export function implausibleOperation(system: MnaSystem, x: Float64Array, where: string): ImplausiblePart[] {
  const watch = new OperatingWatch(system);
  watch.check(0, x, new Float64Array(system.n));
  return watch.warnings(where, false);
}

/**
 * The same warnings over the states of a periodic orbit (a steady analysis's period): `times[k]`
 * and `states[k]` (the unknowns, in the system's order), and `rateAt(k, out)` filling `out` with
 * their time derivatives there (without it they read 0, and so do capacitor currents). Checks
 * every state given: an orbit's grid is one period, a few hundred points.
 */
export function implausibleOnOrbit(system: MnaSystem, times: ArrayLike<number>, states: readonly Float64Array[], rateAt?: (k: number, out: Float64Array) => void): ImplausiblePart[] {
  const watch = new OperatingWatch(system);
  const rates = new Float64Array(system.n);
  for (let k = 0; k < states.length; k++) {
    rateAt?.(k, rates);
    watch.check(times[k]!, states[k]!, rates);
  }
  return watch.warnings("on the steady orbit");
}

/**
 * Watches a time-domain run's parts (see `OperatingWatch`): at its start, at every few accepted
 * steps and, through `finish`, at its last point, which returns the warnings.
 */
export function watchOperation(stepper: TransientStepper): { finish(where: string): ImplausiblePart[] } {
  const watch = new OperatingWatch(stepper.system);
  watch.check(stepper.t, stepper.x, stepper.dxdt);
  stepper.observe(watch.observe);
  return {
    finish(where) {
      watch.check(stepper.t, stepper.x, stepper.dxdt);
      return watch.warnings(where);
    },
  };
}

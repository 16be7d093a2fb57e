import type { Diagnostic } from "../circuit/diagnostic.js";
import type { MnaSystem } from "../solver/system.js";

/**
 * Beyond these a part is far outside any physical operating point: a kiloampere through a
 * circuit part, or a junction forward-biased by tens of volts (a silicon junction conducts
 * hard at under 1 V), from memory of device data, rounded generously.
 */
export const IMPLAUSIBLE_CURRENT = 1e3;
/** Forward bias of a junction (V) beyond which it is reported; see {@link IMPLAUSIBLE_CURRENT}. */
export const IMPLAUSIBLE_JUNCTION_VOLTAGE = 50;

/** A part far outside any physical operating point, and the warning that says so. */
export interface ImplausiblePart {
  readonly part: string;
  readonly diagnostic: Diagnostic;
}

function amps(value: number): string {
  return Math.abs(value) >= 1e6 ? `${value.toExponential(3)} A` : `${Number(value.toPrecision(4))} A`;
}

/**
 * Warnings (`implausible-operation`, naming the part, at its line) for every part whose state
 * at the solution `x` is far outside any physical operating point: such a result is what the
 * equations give for an idealised part (a diode with series=0 straight across a stiff source),
 * not what the circuit would do, and is reported rather than printed silently.
 */
export function implausibleOperation(system: MnaSystem, x: Float64Array, where: string): ImplausiblePart[] {
  const rates = new Float64Array(system.n);
  const voltage = (node: string): number => {
    const i = system.nodeIndex.get(node);
    return i === undefined ? 0 : x[i]!;
  };
  const out: ImplausiblePart[] = [];
  for (const d of system.devices) {
    const part = d.part;
    const current = d.current ? d.current(x, rates, 0) : 0;
    const forward = part.kind === "diode" ? voltage(part.nodes[0]!) - voltage(part.nodes[1]!) : 0;
    let why: string | undefined;
    if (!(Math.abs(current) <= IMPLAUSIBLE_CURRENT)) why = `carries ${amps(current)}`;
    else if (forward > IMPLAUSIBLE_JUNCTION_VOLTAGE) why = `is forward-biased by ${Number(forward.toPrecision(4))} V`;
    if (why === undefined) continue;
    const diagnostic: Diagnostic = {
      severity: "warning",
      stage: "simulation",
      code: "implausible-operation",
      message: `${part.kind} ${part.name} ${why} ${where}, far outside any physical operating point`,
      hint: "the figures follow from an idealised part: check its values (a diode's series=, a source's level) and what it is connected across",
      ...(part.span ? { span: part.span } : {}),
    };
    out.push({ part: part.name, diagnostic });
  }
  return out;
}

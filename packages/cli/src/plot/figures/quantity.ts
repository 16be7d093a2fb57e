/** A probe's values with the unit of its quantity (`V` for a node, `A` for a branch current). */
export interface ProbeTrace {
  readonly name: string;
  readonly unit: string;
  readonly values: ArrayLike<number>;
}

const QUANTITY: Readonly<Record<string, string>> = { V: "voltage", A: "current", Hz: "frequency", s: "time", "\u03a9": "resistance", F: "capacitance", H: "inductance" };

/** The axis title for values in `unit`: `voltage` for V, `current` for A, else `value`. */
export function quantityOf(unit: string): string {
  return QUANTITY[unit] ?? "value";
}

/** Probes grouped by unit, in order of first appearance, each with its index among all probes. */
export function groupByUnit(probes: readonly ProbeTrace[]): { unit: string; members: { probe: ProbeTrace; index: number }[] }[] {
  const groups: { unit: string; members: { probe: ProbeTrace; index: number }[] }[] = [];
  probes.forEach((probe, index) => {
    let group = groups.find((g) => g.unit === probe.unit);
    if (group === undefined) {
      group = { unit: probe.unit, members: [] };
      groups.push(group);
    }
    group.members.push({ probe, index });
  });
  return groups;
}

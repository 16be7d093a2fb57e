import { partKinds, type Circuit, type UnitSymbol } from "@onset/core";
import { parseQuantity, type Program, type Statement } from "@onset/netlist-parser";

/** A swept or overridden name with the unit of its values and its setting in the circuit. */
export interface TargetInfo {
  /** As reports print it: `Ω`, `Hz`; empty for a plain number. */
  readonly unit: string;
  /** The value the circuit has for it (after `--set`), when it can be told. */
  readonly nominal: number | null;
}

function* statementsOf(program: Program): Generator<Statement> {
  for (const s of program.statements) {
    if (s.kind === "include" && s.program) yield* statementsOf(s.program);
    else yield s;
  }
}

/** A unit as reports print it: empty for a plain ratio or an unknown unit. */
export const shownUnit = (unit: UnitSymbol | undefined): string => (unit === undefined || unit === "1" ? "" : unit);

/**
 * What a target names: a part's value (`Ra`), a part option (`P1.at`, `U1.gbw`) or a file
 * parameter (`R`). An instance parameter (`N1.R`) has no unit or setting we can read here.
 */
export function targetInfo(circuit: Circuit, program: Program, target: string, overrides: Readonly<Record<string, string>>): TargetInfo {
  const part = circuit.parts.find((p) => p.name === target);
  if (part) return { unit: shownUnit(partKinds[part.kind]?.value?.unit), nominal: part.value ?? null };
  const dot = target.lastIndexOf(".");
  if (dot > 0) {
    const owner = circuit.parts.find((p) => p.name === target.slice(0, dot));
    if (owner) {
      const key = target.slice(dot + 1);
      const schema = partKinds[owner.kind];
      const option = schema?.options[key] ?? Object.values(schema?.variants?.sets ?? {}).find((set) => set[key])?.[key];
      const value = owner.options[key];
      return { unit: option && "unit" in option ? shownUnit(option.unit) : "", nominal: typeof value === "number" ? value : null };
    }
  }
  for (const s of statementsOf(program)) {
    if (s.kind !== "param" || s.name !== target) continue;
    const symbol = s.value.kind === "number" ? s.value.literal.symbol : undefined;
    const set = overrides[target];
    if (set !== undefined) {
      const parsed = parseQuantity(set, symbol ?? "1");
      return { unit: shownUnit(symbol), nominal: typeof parsed === "number" ? parsed : null };
    }
    const nominal = s.value.kind === "number" ? (s.value.negative ? -1 : 1) * s.value.literal.value : null;
    return { unit: shownUnit(symbol), nominal };
  }
  return { unit: "", nominal: null };
}

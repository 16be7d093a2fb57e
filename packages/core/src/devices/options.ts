import type { PartSpec } from "../circuit/circuit.js";
import { inputError } from "../circuit/diagnostic.js";
import type { PartKindSchema } from "../circuit/schema.js";

/** Reads a numeric option, falling back to the schema default; throws when required and absent. */
export function numberOption(part: PartSpec, schema: PartKindSchema, key: string, variant?: string): number {
  const given = part.options[key];
  if (typeof given === "number") return given;
  const option = variant ? schema.variants?.sets[variant]?.[key] ?? schema.options[key] : schema.options[key];
  if (option && option.type === "number" && option.default !== undefined) return option.default;
  throw inputError("missing-option", `${part.kind} ${part.name} needs ${key}=`, {
    span: part.span,
    hint: option ? `add ${key}= (${option.summary})` : undefined,
  });
}

export function wordOption(part: PartSpec, schema: PartKindSchema, key: string): string {
  const given = part.options[key];
  if (typeof given === "string") return given;
  const option = schema.options[key];
  if (option && option.type === "word" && option.default !== undefined) return option.default;
  throw inputError("missing-option", `${part.kind} ${part.name} needs ${key}=`, { span: part.span });
}

/** The part's positional value; throws when absent. */
export function partValue(part: PartSpec): number {
  if (part.value === undefined) {
    throw inputError("missing-value", `${part.kind} ${part.name} needs a value`, { span: part.span });
  }
  return part.value;
}

/** Throws an input error unless `value` is finite and above `min` (NaN fails too). */
export function requirePositive(part: PartSpec, what: string, value: number, unit: string): void {
  if (!(value > 0) || !Number.isFinite(value)) {
    throw inputError("out-of-range", `${part.kind} ${part.name}: ${what} must be positive and finite, got ${value} ${unit}`, {
      span: part.span,
      hint: `write a ${what} greater than 0 ${unit}`,
    });
  }
}
